import { titled } from '@/components/route-title';
import { RidesListScreen } from '@/features/shell/lazy-screens';

export default titled(RidesListScreen, { page: 'Rides' });
