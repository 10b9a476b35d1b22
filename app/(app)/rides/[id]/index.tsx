import { RideDetailScreen } from '@/features/ride-page/ride-detail-screen';

export default RideDetailScreen;
