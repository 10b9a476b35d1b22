export { TodayScreen as default } from '@/features/shell/lazy-screens';
