export { CompaniesListScreen as default } from '@/features/registry/companies-list-screen';
