import { AccountScreen } from '@/features/auth/account-screen';

export default AccountScreen;
