import { SchedulesListScreen } from '@/features/registry/schedule-screens';

export default SchedulesListScreen;
