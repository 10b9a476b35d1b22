import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { LogbookScreen } from '@/features/shell/lazy-screens';

export default titled(LogbookScreen, { page: 'Logbook', object: objectLeadsSubtitle });
