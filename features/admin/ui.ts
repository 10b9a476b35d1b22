/** What other features may render or hook into from admin (needs the app's runtime). */
export { useAdminUsersQuery } from '@/features/admin/api';
