export { SignInScreen as default } from '@/features/auth/sign-in-screen';
