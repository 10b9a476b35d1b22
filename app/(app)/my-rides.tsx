import { titled } from '@/components/route-title';
import { OperatorHome } from '@/features/shell/lazy-screens';

export default titled(OperatorHome, { page: 'My rides' });
