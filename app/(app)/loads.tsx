import { titled } from '@/components/route-title';
import { CalculatorScreen } from '@/features/shell/lazy-screens';

export default titled(CalculatorScreen, { page: 'Load check' });
