import { objectIsHeading, titled } from '@/components/route-title';
import { RideDetailScreen } from '@/features/shell/lazy-screens';

export default titled(RideDetailScreen, { page: 'Ride', object: objectIsHeading });
