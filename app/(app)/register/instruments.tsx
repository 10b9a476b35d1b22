import { titled } from '@/components/route-title';
import { InstrumentRegisterScreen } from '@/features/shell/lazy-screens';

export default titled(InstrumentRegisterScreen, { page: 'Instruments' });
