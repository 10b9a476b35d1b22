import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { IncidentReportScreen } from '@/features/shell/lazy-screens';

export default titled(IncidentReportScreen, { page: 'Report an incident', object: objectLeadsSubtitle });
