export { SiteScreen as default } from '@/features/registry/site-screen';
