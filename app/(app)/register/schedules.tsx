import { titled } from '@/components/route-title';
import { SchedulesListScreen } from '@/features/shell/lazy-screens';

export default titled(SchedulesListScreen, { page: 'Schedules' });
