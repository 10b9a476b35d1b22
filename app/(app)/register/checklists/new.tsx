import { titled } from '@/components/route-title';
import { ChecklistCreateScreen } from '@/features/shell/lazy-screens';

export default titled(ChecklistCreateScreen, { page: 'New checklist' });
