import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { DesignVersionScreen } from '@/features/shell/lazy-screens';

export default titled(DesignVersionScreen, { page: 'Design version', object: objectLeadsSubtitle });
