export { AccountScreen as default } from '@/features/shell/lazy-screens';
