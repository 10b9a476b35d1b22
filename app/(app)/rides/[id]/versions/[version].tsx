export { DesignVersionScreen as default } from '@/features/registry/design-version-screen';
