export { RideEditScreen as default } from '@/features/registry/ride-edit-screen';
