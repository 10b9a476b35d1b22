import { ChecklistCreateScreen } from '@/features/registry/checklist-screens';

export default ChecklistCreateScreen;
