import { titled } from '@/components/route-title';
import { CompanyEditScreen } from '@/features/shell/lazy-screens';

export default titled(CompanyEditScreen, { page: 'New company' });
