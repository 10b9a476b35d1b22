import { z } from 'zod';

import { newPasswordSchema, passwordLinkPurposes, passwordProblem } from '@/features/auth/password-schema';
import { roleSchema, sessionUserSchema } from '@/features/session/schema';
import { accountStates } from '@/lib/vocabulary';

export { accountStates };

/**
 * A user as the administrator lists them: who they are (as a session knows them), since when, whether they
 * can sign in (`state`), and when their account last changed (the newest audit entry about them).
 */
export const adminUserSchema = sessionUserSchema.extend({
  createdAt: z.string(),
  disabledAt: z.string().nullable(),
  state: z.enum(accountStates),
  lastChangeAt: z.string(),
});
export type AdminUser = z.infer<typeof adminUserSchema>;

/** An operator company a person may belong to, for the people forms. */
const companyChoiceSchema = z.object({ id: z.string(), name: z.string() });
export type CompanyChoice = z.infer<typeof companyChoiceSchema>;

/** `GET /api/admin/users`: everyone, and the operator companies an operator user may belong to. */
export const adminUserListSchema = z.object({
  users: z.array(adminUserSchema),
  companies: z.array(companyChoiceSchema).default([]),
});

/** `GET /api/admin/users/:id`: one person, the set-password link waiting for them, and what changed. */
export const personSchema = adminUserSchema.extend({
  pendingLink: z
    .object({ purpose: z.enum(passwordLinkPurposes), createdAt: z.string(), expiresAt: z.string() })
    .nullable(),
  history: z.array(
    z.object({ at: z.string(), action: z.string(), summary: z.string(), by: z.string().nullable() }),
  ),
});
export type Person = z.infer<typeof personSchema>;
export const personResponseSchema = z.object({ person: personSchema });

const name = z.string().trim().min(1, 'Enter the name').max(120);
const companyId = z.string().trim().min(1).nullable();

/**
 * `POST /api/admin/users`. Without a password the person is invited: an e-mail with a link to choose one
 * (valid 7 days). With a password the account can sign in at once (the administrator passes it on).
 */
export const createPersonBodySchema = z
  .object({
    email: z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(254),
    name,
    role: roleSchema,
    companyId: companyId.default(null),
    password: newPasswordSchema.optional(),
  })
  .strict()
  .superRefine((v, ctx) => {
    const problem = v.password === undefined ? null : passwordProblem(v.password, v.email);
    if (problem) ctx.addIssue({ code: 'custom', path: ['password'], message: problem });
  });
export type CreatePersonBody = z.input<typeof createPersonBodySchema>;

/** `PATCH /api/admin/users/:id`: any of name, role and company; an empty body changes nothing and is refused. */
export const updatePersonBodySchema = z
  .object({ name: name.optional(), role: roleSchema.optional(), companyId: companyId.optional() })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Send at least one of name, role or companyId' });
export type UpdatePersonBody = z.infer<typeof updatePersonBodySchema>;

/** What a create answers: the person, and whether an invitation was sent rather than a password set. */
export const createPersonResponseSchema = z.object({ user: adminUserSchema, invited: z.boolean() });
