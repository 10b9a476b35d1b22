/** What other features may render or hook into from auth (needs the app's runtime). */
export { RoleGate } from '@/features/auth/role-gate';
export { PasswordChangeCard } from '@/features/auth/password-change-card';
export { PasswordField } from '@/features/auth/password-field';
