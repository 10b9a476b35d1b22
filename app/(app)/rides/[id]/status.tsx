export { RideStatusScreen as default } from '@/features/registry/ride-status-screen';
