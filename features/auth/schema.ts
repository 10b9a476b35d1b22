import { z } from 'zod';

/** The four roles. Order matters nowhere; names are used in the API, the UI and the database. */
export const roles = ['inspector', 'supervisor', 'operator', 'admin'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

export const signInBodySchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter a valid e-mail address'),
  password: z.string().min(1, 'Enter your password').max(200),
});
export type SignInBody = z.infer<typeof signInBodySchema>;

export const sessionUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  /** The operator company an operator user belongs to; null for the inspection body's staff. */
  companyId: z.string().nullable(),
  companyName: z.string().nullable(),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

export const signInResponseSchema = z.object({
  token: z.string(),
  expiresAt: z.string(),
  user: sessionUserSchema,
});
export type SignInResponse = z.infer<typeof signInResponseSchema>;

export const meResponseSchema = z.object({ user: sessionUserSchema });
