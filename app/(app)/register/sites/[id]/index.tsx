import { objectIsHeading, titled } from '@/components/route-title';
import { SiteScreen } from '@/features/shell/lazy-screens';

export default titled(SiteScreen, { page: 'Site', object: objectIsHeading });
