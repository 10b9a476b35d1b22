import { z } from 'zod';

/**
 * The one error shape every API route answers with, 4xx and 5xx alike.
 * `issues` lists field-level problems (path like "bodies.1.massKg") for validation errors.
 */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    issues: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;

/** Turns a zod error into the `issues` list of the API error shape. */
export function zodIssues(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join('.') || '(body)',
    message: issue.message,
  }));
}
