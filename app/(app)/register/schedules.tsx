export { SchedulesListScreen as default } from '@/features/shell/lazy-screens';
