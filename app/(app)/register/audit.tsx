export { AuditScreen as default } from '@/features/registry/audit-screen';
