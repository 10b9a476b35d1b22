import { SitesListScreen } from '@/features/registry/register-screens';

export default SitesListScreen;
