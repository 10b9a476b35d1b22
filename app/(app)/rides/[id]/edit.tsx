import { RideEditScreen } from '@/features/registry/ride-edit-screens';

export default RideEditScreen;
