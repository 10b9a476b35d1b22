import { CompanyScreen } from '@/features/registry/register-screens';

export default CompanyScreen;
