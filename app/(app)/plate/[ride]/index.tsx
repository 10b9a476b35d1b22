import { titled } from '@/components/route-title';
import { PlateScreen } from '@/features/shell/lazy-screens';

export default titled(PlateScreen, { page: 'Plate' });
