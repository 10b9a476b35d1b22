import { titled } from '@/components/route-title';
import { SitesListScreen } from '@/features/shell/lazy-screens';

export default titled(SitesListScreen, { page: 'Sites' });
