/** What other features and the server may use from session: runs anywhere (no React Native). */
export { tokenStore } from '@/features/session/token-store';
export {
  clearTodaySnapshot,
  hasTodaySnapshot,
  readTodaySnapshot,
  writeTodaySnapshot,
} from '@/features/session/today-snapshot';
export type { TodaySnapshot } from '@/features/session/today-snapshot';
