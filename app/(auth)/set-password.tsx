import { titled } from '@/components/route-title';
import { SetPasswordScreen } from '@/features/auth/set-password-screen';

export default titled(SetPasswordScreen, { page: 'Set your password' });
