export { RunningLogScreen as default } from '@/features/shell/lazy-screens';
