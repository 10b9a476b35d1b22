/** What other features may use from auth: everything else in the folder is its own. */
export { roleLabel, useSession } from '@/features/auth/api';
export { accountHref, roleHome, signInHref } from '@/features/auth/hrefs';
export { rememberNextPath } from '@/features/auth/next-path';
export { RoleGate } from '@/features/auth/role-gate';
