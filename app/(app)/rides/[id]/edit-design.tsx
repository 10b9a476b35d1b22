import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { DesignEditScreen } from '@/features/shell/lazy-screens';

export default titled(DesignEditScreen, { page: 'Edit design data', object: objectLeadsSubtitle });
