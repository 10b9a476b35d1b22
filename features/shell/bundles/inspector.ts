/** The inspector's field screens: the day's list and recording an inspection. */
export { InspectRoute } from '@/features/inspections/inspect-route';
export { TodayScreen } from '@/features/inspections/today-screen';
