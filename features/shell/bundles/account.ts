/** The person's own account page. */
export { AccountScreen } from '@/features/shell/account-screen';
