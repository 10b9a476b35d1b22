export { RideDetailScreen as default } from '@/features/shell/lazy-screens';
