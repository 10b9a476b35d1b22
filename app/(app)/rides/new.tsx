export { RideCreateScreen as default } from '@/features/registry/ride-create-screen';
