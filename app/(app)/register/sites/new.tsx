import { titled } from '@/components/route-title';
import { SiteEditScreen } from '@/features/shell/lazy-screens';

export default titled(SiteEditScreen, { page: 'New site' });
