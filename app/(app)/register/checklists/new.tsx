export { ChecklistCreateScreen as default } from '@/features/registry/checklist-create-screen';
