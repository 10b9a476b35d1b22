export { QueueScreen as default } from '@/features/shell/lazy-screens';
