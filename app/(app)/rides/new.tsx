import { RideCreateScreen } from '@/features/registry/ride-edit-screens';

export default RideCreateScreen;
