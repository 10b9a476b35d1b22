export { ChecklistEditScreen as default } from '@/features/shell/lazy-screens';
