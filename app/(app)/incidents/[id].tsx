import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { IncidentScreen } from '@/features/shell/lazy-screens';

export default titled(IncidentScreen, { page: 'Incident report', object: objectLeadsSubtitle });
