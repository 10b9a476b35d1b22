import { CompanyEditScreen } from '@/features/registry/register-screens';

export default CompanyEditScreen;
