import { titled } from '@/components/route-title';
import { ChecklistsListScreen } from '@/features/shell/lazy-screens';

export default titled(ChecklistsListScreen, { page: 'Checklists' });
