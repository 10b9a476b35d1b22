export { SetPasswordScreen as default } from '@/features/auth/set-password-screen';
