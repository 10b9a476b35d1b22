import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { NdtScreen } from '@/features/shell/lazy-screens';

export default titled(NdtScreen, { page: 'NDT', object: objectLeadsSubtitle });
