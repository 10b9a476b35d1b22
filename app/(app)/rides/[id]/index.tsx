export { RideDetailScreen as default } from '@/features/ride-page/ride-detail-screen';
