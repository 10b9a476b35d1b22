import { titled } from '@/components/route-title';
import { TodayScreen } from '@/features/shell/lazy-screens';

export default titled(TodayScreen, { page: 'Today' });
