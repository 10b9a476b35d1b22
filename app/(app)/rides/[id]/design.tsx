import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { DesignScreen } from '@/features/shell/lazy-screens';

export default titled(DesignScreen, { page: 'Design data', object: objectLeadsSubtitle });
