import { objectAfter, titled } from '@/components/route-title';
import { SiteEditScreen } from '@/features/shell/lazy-screens';

export default titled(SiteEditScreen, { page: 'Edit site', object: objectAfter('Edit ') });
