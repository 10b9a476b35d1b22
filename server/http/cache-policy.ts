import type { RequestHandler, Response } from 'express';

/**
 * How browsers and proxies may keep an API answer. Every answer depends on who asks (the bearer token),
 * so every one carries `Vary: Authorization`, and none may sit in a shared cache:
 *
 * - JSON (and anything a route did not give a policy, errors included) is `no-store`: on a shared phone
 *   or browser the next person must not be shown the last person's data from the cache;
 * - a file a route chose to let the browser keep (a photo, an NDT report: content-addressed, so
 *   `immutable` is true) keeps its policy but is always `private`.
 *
 * Decided when the headers go out rather than when the request comes in, so a route that changes its
 * mind after an error (removing its caching header) and the error handler's JSON are covered too.
 */
export const apiCachePolicy: RequestHandler = (_req, res, next) => {
  const writeHead = res.writeHead;
  let applied = false;
  res.writeHead = function (this: Response, ...args: unknown[]) {
    if (!applied) {
      applied = true;
      applyCachePolicy(this);
    }
    return (writeHead as (...a: unknown[]) => Response).apply(this, args);
  } as Response['writeHead'];
  next();
};

function applyCachePolicy(res: Response): void {
  res.vary('Authorization');
  const type = String(res.getHeader('Content-Type') ?? '');
  const given = res.getHeader('Cache-Control');
  if (given === undefined || type.includes('json')) {
    res.setHeader('Cache-Control', 'no-store');
    return;
  }
  const policy = String(given);
  if (!/\b(private|no-store)\b/.test(policy)) res.setHeader('Cache-Control', `private, ${policy}`);
}
