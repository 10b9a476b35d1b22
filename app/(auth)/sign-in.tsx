import { SignInScreen } from '@/features/auth/sign-in-screen';

export default SignInScreen;
