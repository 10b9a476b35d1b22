/** What other features may use from auth: everything else in the folder is its own. */
export { roleLabel, useSession } from '@/features/auth/api';
export { accountHref, roleHome } from '@/features/auth/hrefs';
export { RoleGate } from '@/features/auth/role-gate';
