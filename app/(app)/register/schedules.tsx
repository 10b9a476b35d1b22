export { SchedulesListScreen as default } from '@/features/registry/schedules-list-screen';
