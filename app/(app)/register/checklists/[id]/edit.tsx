export { ChecklistEditScreen as default } from '@/features/registry/checklist-edit-screen';
