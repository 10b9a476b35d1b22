/**
 * Who is signed in: the roles and the session's user, shared by the API client's token store, the sign-in
 * screens and the server's tokens. The lowest feature, so the API client can keep the session without
 * importing the sign-in screens.
 */
import { z } from 'zod';

import { roles } from '@/lib/vocabulary';

/** The four roles (lib/vocabulary). Order matters nowhere; names are used in the API, the UI and the database. */
export { roles };
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

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
