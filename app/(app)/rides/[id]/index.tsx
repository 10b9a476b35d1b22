import { RideDetailScreen } from '@/features/registry/ride-detail-screen';

export default RideDetailScreen;
