import { titled } from '@/components/route-title';
import { DailyCheckScreen } from '@/features/shell/lazy-screens';

export default titled(DailyCheckScreen, { page: 'Daily checks' });
