export { TodayScreen as default } from '@/features/inspections/today-screen';
