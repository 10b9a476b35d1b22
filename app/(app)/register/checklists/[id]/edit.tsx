import { objectAfter, titled } from '@/components/route-title';
import { ChecklistEditScreen } from '@/features/shell/lazy-screens';

export default titled(ChecklistEditScreen, { page: 'Edit checklist', object: objectAfter('Edit ') });
