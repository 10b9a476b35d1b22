export { ChecklistScreen as default } from '@/features/registry/checklist-screen';
