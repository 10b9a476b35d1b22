export { DesignVersionScreen as default } from '@/features/shell/lazy-screens';
