import { titled } from '@/components/route-title';
import { RideCreateScreen } from '@/features/shell/lazy-screens';

export default titled(RideCreateScreen, { page: 'New ride' });
