import { objectAfter, titled } from '@/components/route-title';
import { RideStatusScreen } from '@/features/shell/lazy-screens';

export default titled(RideStatusScreen, { page: 'Status', object: objectAfter('Status of ') });
