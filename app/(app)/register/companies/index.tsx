export { CompaniesListScreen as default } from '@/features/shell/lazy-screens';
