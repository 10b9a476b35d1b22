export { AdminHome as default } from '@/features/shell/lazy-screens';
