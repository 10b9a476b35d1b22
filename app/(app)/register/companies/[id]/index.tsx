export { CompanyScreen as default } from '@/features/registry/company-screen';
