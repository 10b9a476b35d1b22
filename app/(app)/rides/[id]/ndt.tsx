export { NdtScreen as default } from '@/features/shell/lazy-screens';
