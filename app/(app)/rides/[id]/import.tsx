import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { DesignImportScreen } from '@/features/shell/lazy-screens';

export default titled(DesignImportScreen, { page: 'Import design data', object: objectLeadsSubtitle });
