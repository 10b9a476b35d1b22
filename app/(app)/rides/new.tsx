export { RideCreateScreen as default } from '@/features/shell/lazy-screens';
