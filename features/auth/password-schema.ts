import { z } from 'zod';

import { signInResponseSchema } from '@/features/auth/schema';

/**
 * The password rule, one copy for the app's forms, the API and the create-admin command: 12 to 200
 * characters (long enough to resist guessing when the sign-in limits hold; bcrypt reads at most 72 bytes,
 * the ceiling only keeps hashing bounded) and never the account's own e-mail address.
 */
export const passwordMinLength = 12;
export const passwordMaxLength = 200;

export const newPasswordSchema = z
  .string()
  .min(passwordMinLength, `Use at least ${passwordMinLength} characters`)
  .max(passwordMaxLength, `Use at most ${passwordMaxLength} characters`);

/** Why a password may not be used by the account with this e-mail, or null when it may. */
export function passwordProblem(password: string, email: string): string | null {
  const parsed = newPasswordSchema.safeParse(password);
  if (!parsed.success) return parsed.error.issues[0]?.message ?? 'Choose another password';
  if (password.trim().toLowerCase() === email.trim().toLowerCase()) {
    return 'The password may not be the e-mail address';
  }
  return null;
}

/** `POST /api/auth/password`: the person's own change; the answer is a fresh session for this device. */
export const passwordChangeBodySchema = z.object({
  currentPassword: z.string().min(1, 'Enter your current password').max(passwordMaxLength),
  newPassword: newPasswordSchema,
});
export type PasswordChangeBody = z.infer<typeof passwordChangeBodySchema>;
export const passwordChangeResponseSchema = signInResponseSchema;

export const passwordLinkPurposes = ['invite', 'reset'] as const;
export type PasswordLinkPurpose = (typeof passwordLinkPurposes)[number];
export const passwordLinkStates = ['valid', 'used', 'expired'] as const;

/** `GET /api/auth/password-links/:token`: who the link is for and whether it can still be used. */
export const passwordLinkInfoSchema = z.object({
  purpose: z.enum(passwordLinkPurposes),
  name: z.string(),
  email: z.string(),
  expiresAt: z.string(),
  state: z.enum(passwordLinkStates),
});
export type PasswordLinkInfo = z.infer<typeof passwordLinkInfoSchema>;

/** `POST /api/auth/password-links/:token`; the answer signs the person in on this device. */
export const passwordLinkBodySchema = z.object({ password: newPasswordSchema });
export const passwordLinkResponseSchema = signInResponseSchema;
