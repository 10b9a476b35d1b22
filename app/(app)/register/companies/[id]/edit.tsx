export { CompanyEditScreen as default } from '@/features/shell/lazy-screens';
