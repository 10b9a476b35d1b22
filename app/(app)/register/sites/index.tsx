export { SitesListScreen as default } from '@/features/shell/lazy-screens';
