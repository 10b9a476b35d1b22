export { AuthLayout as default } from '@/features/auth/auth-layout';
