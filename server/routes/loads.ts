import { Router } from 'express';

import { cycleQuerySchema } from '@/features/loads/cycle-resolution-schema';
import { solveLoadsRequest } from '@/features/loads/schema';
import type { ApiDeps } from '@/server/deps';
import { cyclePoolOf, cycleSizeIssue, runCycleJob } from '@/server/compute/cycle';
import { fullResolutionIssue } from '@/server/compute/cycle-series';
import { HttpError } from '@/server/http/errors';
import { validate } from '@/server/http/validate';
import { requireAuth } from '@/server/auth/require-auth';

const cycleQuery = validate({ query: cycleQuerySchema });

const invalid = (issues: { path: string; message: string }[]) =>
  new HttpError(400, 'validation_failed', 'The request has invalid fields.', issues);

/**
 * `POST /loads` (one instant) and `POST /loads/cycle` (a whole ride cycle): the same engine the app
 * runs for its offline preview. Any signed-in role may use them; they read and write no stored data.
 *
 * The cycle is bounded (server/compute/cycle.ts): too many samples for its bodies and seats is a 400 naming
 * `samples` before any work; its series come bounded with every peak kept, or whole with `?resolution=full`
 * up to a cap (server/compute/cycle-series.ts, a 400 naming `query.resolution` beyond it); the analysis runs in a worker thread, and one that overruns the server's
 * limit (COMPUTE_TIME_LIMIT_MS) is stopped with a 422 `too_much_work`; with every worker busy and the line
 * full, a 503 `busy` with Retry-After. One instant is a few microseconds and stays on the main thread.
 */
export function loadsRouter(deps: ApiDeps): Router {
  const router = Router();
  const cycles = cyclePoolOf(deps);

  router.post('/loads', requireAuth(deps), (req, res) => {
    const outcome = solveLoadsRequest(req.body);
    if (!outcome.ok) throw invalid(outcome.issues);
    res.json(outcome.value);
  });

  router.post('/loads/cycle', requireAuth(deps), cycleQuery, async (req, res) => {
    const { resolution } = cycleQuery.query(res);
    const tooLarge = cycleSizeIssue(req.body) ?? (resolution === 'full' ? fullSizeIssue(req.body) : null);
    if (tooLarge) throw invalid([tooLarge]);
    const gzip = req.acceptsEncodings('gzip') === 'gzip';
    const outcome = await runCycleJob(cycles, { kind: 'request', body: req.body, resolution, gzip }, res);
    if (!outcome.ok) throw invalid('issues' in outcome ? outcome.issues : []);
    if (!('body' in outcome)) throw new Error('The cycle worker answered a request with a stored answer.');
    // Already JSON, compressed when the client takes gzip (the compression middleware leaves an encoded
    // body alone): the worker did the work, so the main thread only sends bytes. No ETag: it would hash
    // the whole body on the main thread for an answer to a POST, which no cache revalidates.
    res.setHeader('Content-Type', 'application/json; charset=utf-8');
    res.vary('Accept-Encoding');
    if (outcome.gzip) res.setHeader('Content-Encoding', 'gzip');
    res.setHeader('Content-Length', outcome.body.byteLength);
    res.end(outcome.body);
  });
  return router;
}

/** A full answer known to be over the cap from the request alone (samples given); else the worker checks. */
function fullSizeIssue(body: unknown) {
  if (typeof body !== 'object' || body === null) return null;
  const { samples, bodies, seats } = body as Record<string, unknown>;
  if (typeof samples !== 'number' || !Number.isFinite(samples) || !Array.isArray(bodies)) return null;
  return fullResolutionIssue(samples, bodies.length, Array.isArray(seats) ? seats.length : 0);
}
