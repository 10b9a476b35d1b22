export { AccountScreen as default } from '@/features/shell/account-screen';
