export { RidesListScreen as default } from '@/features/registry/rides-list-screen';
