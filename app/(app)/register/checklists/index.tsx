import { ChecklistsListScreen } from '@/features/registry/checklist-screens';

export default ChecklistsListScreen;
