import { titled } from '@/components/route-title';
import { SignInScreen } from '@/features/auth/sign-in-screen';

export default titled(SignInScreen, { page: 'Sign in' });
