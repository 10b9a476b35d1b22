export { AccountScreen as default } from '@/features/auth/account-screen';
