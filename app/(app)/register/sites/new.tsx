export { SiteEditScreen as default } from '@/features/registry/site-edit-screen';
