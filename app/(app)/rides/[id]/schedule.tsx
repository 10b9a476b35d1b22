export { RideScheduleScreen as default } from '@/features/registry/ride-schedule-screen';
