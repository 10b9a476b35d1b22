export { SiteEditScreen as default } from '@/features/shell/lazy-screens';
