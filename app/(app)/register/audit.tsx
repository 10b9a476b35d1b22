import { AuditScreen } from '@/features/registry/audit-screen';

export default AuditScreen;
