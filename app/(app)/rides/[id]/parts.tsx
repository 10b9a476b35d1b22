import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { PartsScreen } from '@/features/shell/lazy-screens';

export default titled(PartsScreen, { page: 'Parts', object: objectLeadsSubtitle });
