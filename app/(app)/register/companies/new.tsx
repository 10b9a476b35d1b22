export { CompanyEditScreen as default } from '@/features/registry/company-edit-screen';
