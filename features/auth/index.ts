/** What other features and the server may use from auth: runs anywhere (no React Native). */
export { roleLabel, useSession, useSignOutMutation } from '@/features/auth/api';
export { accountHref, roleHome, signInHref } from '@/features/auth/hrefs';
export { rememberNextPath } from '@/features/auth/next-path';
