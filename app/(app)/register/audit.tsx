export { AuditScreen as default } from '@/features/shell/lazy-screens';
