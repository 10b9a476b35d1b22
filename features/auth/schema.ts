import { z } from 'zod';

import { sessionUserSchema } from '@/features/session/schema';

export const signInBodySchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter a valid e-mail address'),
  password: z.string().min(1, 'Enter your password').max(200),
});
export type SignInBody = z.infer<typeof signInBodySchema>;

export const signInResponseSchema = z.object({
  token: z.string(),
  expiresAt: z.string(),
  user: sessionUserSchema,
});
export type SignInResponse = z.infer<typeof signInResponseSchema>;

export const meResponseSchema = z.object({ user: sessionUserSchema });
