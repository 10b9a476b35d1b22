export { RideStatusScreen as default } from '@/features/shell/lazy-screens';
