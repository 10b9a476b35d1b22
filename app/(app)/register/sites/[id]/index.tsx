import { SiteScreen } from '@/features/registry/register-screens';

export default SiteScreen;
