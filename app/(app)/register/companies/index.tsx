import { CompaniesListScreen } from '@/features/registry/register-screens';

export default CompaniesListScreen;
