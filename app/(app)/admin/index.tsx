import { titled } from '@/components/route-title';
import { AdminHome } from '@/features/shell/lazy-screens';

export default titled(AdminHome, { page: 'Administration' });
