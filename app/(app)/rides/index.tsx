export { RidesListScreen as default } from '@/features/shell/lazy-screens';
