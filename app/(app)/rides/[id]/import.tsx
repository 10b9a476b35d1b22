export { DesignImportScreen as default } from '@/features/shell/lazy-screens';
