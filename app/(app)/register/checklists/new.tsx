export { ChecklistCreateScreen as default } from '@/features/shell/lazy-screens';
