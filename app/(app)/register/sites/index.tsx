export { SitesListScreen as default } from '@/features/registry/sites-list-screen';
