import { RideStatusScreen } from '@/features/registry/ride-edit-screens';

export default RideStatusScreen;
