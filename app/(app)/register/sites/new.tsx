import { SiteEditScreen } from '@/features/registry/register-screens';

export default SiteEditScreen;
