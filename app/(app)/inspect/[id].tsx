import { objectIsHeading, titled } from '@/components/route-title';
import { InspectRoute } from '@/features/shell/lazy-screens';

export default titled(InspectRoute, { page: 'Inspection', object: objectIsHeading });
