export { DesignScreen as default } from '@/features/registry/design-screen';
