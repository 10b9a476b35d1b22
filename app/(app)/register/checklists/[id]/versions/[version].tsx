export { ChecklistScreen as default } from '@/features/shell/lazy-screens';
