export { ChecklistsListScreen as default } from '@/features/shell/lazy-screens';
