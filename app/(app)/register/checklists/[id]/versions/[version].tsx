import { ChecklistScreen } from '@/features/registry/checklist-screens';

export default ChecklistScreen;
