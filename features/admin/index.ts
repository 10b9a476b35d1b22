/** What other features may use from admin: everything else in the folder is its own. */
export { useAdminUsersQuery } from '@/features/admin/api';
