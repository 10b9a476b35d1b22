export { CompanyScreen as default } from '@/features/shell/lazy-screens';
