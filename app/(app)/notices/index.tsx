import { titled } from '@/components/route-title';
import { NoticeListScreen } from '@/features/shell/lazy-screens';

export default titled(NoticeListScreen, { page: 'Notices' });
