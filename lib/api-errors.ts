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

/** An answer from the API that is an error (4xx/5xx), with the error shape's code, message and issues. */
export class ApiRequestError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues: { path: string; message: string }[] = [],
  ) {
    super(message);
    this.name = 'ApiRequestError';
  }
}

/**
 * The error a failed answer stands for, for callers that fetch outside the JSON client (bytes in or out):
 * the API's own error shape when the body is one, else `fallback` under the code `http_error`.
 */
export async function errorOfResponse(res: Response, fallback: string): Promise<ApiRequestError> {
  let body: unknown;
  try {
    body = JSON.parse(await res.text());
  } catch {
    body = undefined;
  }
  const parsed = apiErrorSchema.safeParse(body);
  if (!parsed.success) return new ApiRequestError(res.status, 'http_error', fallback);
  const e = parsed.data.error;
  return new ApiRequestError(res.status, e.code, e.message, e.issues);
}

/** Thrown when the server cannot be reached at all (offline, DNS, connection reset). */
export class OfflineError extends Error {
  constructor(cause: unknown) {
    super('No connection to the Pivotwatch server.');
    this.name = 'OfflineError';
    this.cause = cause;
  }
}
