import { objectIsHeading, titled } from '@/components/route-title';
import { ChecklistScreen } from '@/features/shell/lazy-screens';

export default titled(ChecklistScreen, { page: 'Checklist version', object: objectIsHeading });
