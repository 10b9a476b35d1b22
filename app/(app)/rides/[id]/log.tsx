import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { RunningLogScreen } from '@/features/shell/lazy-screens';

export default titled(RunningLogScreen, { page: 'Running log', object: objectLeadsSubtitle });
