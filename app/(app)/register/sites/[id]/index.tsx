export { SiteScreen as default } from '@/features/shell/lazy-screens';
