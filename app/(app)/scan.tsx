import { titled } from '@/components/route-title';
import { ScanScreen } from '@/features/shell/lazy-screens';

export default titled(ScanScreen, { page: 'Scan a plate' });
