import { ChecklistEditScreen } from '@/features/registry/checklist-screens';

export default ChecklistEditScreen;
