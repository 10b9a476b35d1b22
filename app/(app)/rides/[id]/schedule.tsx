import { RideScheduleScreen } from '@/features/registry/schedule-screens';

export default RideScheduleScreen;
