/** What other features may use from session: everything else in the folder is its own. */
export { tokenStore } from '@/features/session/token-store';
