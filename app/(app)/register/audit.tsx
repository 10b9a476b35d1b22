import { titled } from '@/components/route-title';
import { AuditScreen } from '@/features/shell/lazy-screens';

export default titled(AuditScreen, { page: 'Audit log' });
