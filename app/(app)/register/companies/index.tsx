import { titled } from '@/components/route-title';
import { CompaniesListScreen } from '@/features/shell/lazy-screens';

export default titled(CompaniesListScreen, { page: 'Companies' });
