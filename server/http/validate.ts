import type { RequestHandler, Response } from 'express';
import { z } from 'zod';

import { zodIssues } from '@/lib/api-errors';
import { HttpError } from '@/server/http/errors';

type Schemas = { body?: z.ZodType; query?: z.ZodType; params?: z.ZodType };
type Out<S> = S extends z.ZodType ? z.output<S> : never;

/** The middleware, plus typed getters for what it parsed, so handlers never read `req.body` again. */
type Validator<S extends Schemas> = RequestHandler & {
  body: (res: Response) => Out<S['body']>;
  query: (res: Response) => Out<S['query']>;
  params: (res: Response) => Out<S['params']>;
};

const parts = ['body', 'query', 'params'] as const;
type Part = (typeof parts)[number];

/**
 * Parses the body, query and route params with their zod schemas and keeps the parsed values in
 * `res.locals` (Express 5's `req.query` is read-only, and coerced values must not be mixed with raw ones).
 * All problems are reported at once as a 400 `validation_failed` with `issues`; body fields are named by
 * their path ("email"), query and params fields by "query.x" / "params.x".
 *
 *   const signIn = validate({ body: signInBodySchema });
 *   router.post('/sign-in', signIn, (req, res) => { const { email } = signIn.body(res); … });
 */
export function validate<S extends Schemas>(schemas: S): Validator<S> {
  const middleware: RequestHandler = (req, res, next) => {
    const issues: { path: string; message: string }[] = [];
    const parsed: Partial<Record<Part, unknown>> = {};
    for (const part of parts) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(req[part]);
      if (result.success) {
        parsed[part] = result.data;
      } else {
        const found = zodIssues(result.error);
        issues.push(...(part === 'body' ? found : found.map((i) => ({ ...i, path: `${part}.${i.path}` }))));
      }
    }
    if (issues.length > 0) {
      next(new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', issues));
      return;
    }
    for (const part of parts) {
      if (part in parsed) res.locals[part] = parsed[part];
    }
    next();
  };
  const getter =
    <P extends Part>(part: P) =>
    (res: Response): Out<S[P]> => {
      if (!schemas[part] || !(part in res.locals)) {
        // A route asked for a part this validator never parsed: a wiring mistake, not a client error.
        throw new Error(`validate(): no parsed ${part} on this request`);
      }
      return res.locals[part] as Out<S[P]>;
    };
  return Object.assign(middleware, {
    body: getter('body'),
    query: getter('query'),
    params: getter('params'),
  });
}

/**
 * A PATCH body: a JSON object naming at least one of `schema`'s fields and nothing else, then `schema`
 * itself. An empty body would otherwise reach the database as an update of nothing, and a misspelt
 * field would be dropped in silence while the client thinks it changed something.
 */
export function patchBody<S extends z.ZodObject>(schema: S) {
  const fields = Object.keys(schema.shape);
  const listed = fields.join(', ');
  return z
    .unknown()
    .superRefine((body, ctx) => {
      if (typeof body !== 'object' || body === null || Array.isArray(body)) {
        ctx.addIssue({ code: 'custom', message: `Send a JSON object with the fields to change (${listed})` });
        return;
      }
      const keys = Object.keys(body);
      if (keys.length === 0)
        ctx.addIssue({ code: 'custom', message: `Nothing to change: send at least one of ${listed}` });
      for (const key of keys)
        if (!fields.includes(key))
          ctx.addIssue({
            code: 'custom',
            path: [key],
            message: `Not a field that can be changed here (${listed})`,
          });
    })
    .pipe(schema);
}
