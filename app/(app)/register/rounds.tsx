import { titled } from '@/components/route-title';
import { RoundsScreen } from '@/features/shell/lazy-screens';

export default titled(RoundsScreen, { page: 'Rounds' });
