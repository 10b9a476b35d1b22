import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { RideIncidentsScreen } from '@/features/shell/lazy-screens';

export default titled(RideIncidentsScreen, { page: 'Incident reports', object: objectLeadsSubtitle });
