/** What other features and the server may use from admin: runs anywhere (no React Native). */
export { useAdminUsersQuery } from '@/features/admin/api';
export { peopleHref, personHref } from '@/features/admin/hrefs';
