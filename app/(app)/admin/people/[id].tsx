export { PersonScreen as default } from '@/features/shell/lazy-screens';
