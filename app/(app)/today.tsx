import { TodayScreen } from '@/features/inspections/today-screen';

export default TodayScreen;
