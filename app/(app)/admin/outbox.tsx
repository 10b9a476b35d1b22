export { OutboxScreen as default } from '@/features/shell/lazy-screens';
