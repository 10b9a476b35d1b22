import { objectAfter, titled } from '@/components/route-title';
import { RideScheduleScreen } from '@/features/shell/lazy-screens';

export default titled(RideScheduleScreen, { page: 'Schedule', object: objectAfter('Schedule of ') });
