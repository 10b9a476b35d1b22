export { DesignScreen as default } from '@/features/shell/lazy-screens';
