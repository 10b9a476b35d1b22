export { RideEditScreen as default } from '@/features/shell/lazy-screens';
