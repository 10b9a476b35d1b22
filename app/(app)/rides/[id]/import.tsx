export { DesignImportScreen as default } from '@/features/registry/design-import-screen';
