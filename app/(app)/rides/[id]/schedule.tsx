export { RideScheduleScreen as default } from '@/features/shell/lazy-screens';
