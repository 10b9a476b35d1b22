import { objectAfter, titled } from '@/components/route-title';
import { CompanyEditScreen } from '@/features/shell/lazy-screens';

export default titled(CompanyEditScreen, { page: 'Edit company', object: objectAfter('Edit ') });
