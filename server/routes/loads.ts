import { Router } from 'express';

import { solveLoadsRequest } from '@/features/loads/schema';
import type { ApiDeps } from '@/server/deps';
import { createCyclePool, cycleSizeIssue } from '@/server/compute/cycle';
import { ComputeBusyError, ComputeTimeoutError } from '@/server/compute/pool';
import { HttpError } from '@/server/http/errors';
import { requireAuth } from '@/server/auth/require-auth';

const invalid = (issues: { path: string; message: string }[]) =>
  new HttpError(400, 'validation_failed', 'The request has invalid fields.', issues);

/**
 * `POST /loads` (one instant) and `POST /loads/cycle` (a whole ride cycle): the same engine the app
 * runs for its offline preview. Any signed-in role may use them; they read and write no stored data.
 *
 * The cycle is bounded (server/compute/cycle.ts): too many samples for its bodies and seats is a 400 naming
 * `samples` before any work; the analysis runs in a worker thread, and one that overruns the server's
 * limit (COMPUTE_TIME_LIMIT_MS) is stopped with a 422 `too_much_work`; with every worker busy and the line
 * full, a 503 `busy` with Retry-After. One instant is a few microseconds and stays on the main thread.
 */
export function loadsRouter(deps: ApiDeps): Router {
  const router = Router();
  const cycles = createCyclePool(deps.config.computeTimeLimitMs);

  router.post('/loads', requireAuth(deps), (req, res) => {
    const outcome = solveLoadsRequest(req.body);
    if (!outcome.ok) throw invalid(outcome.issues);
    res.json(outcome.value);
  });

  router.post('/loads/cycle', requireAuth(deps), async (req, res) => {
    const tooLarge = cycleSizeIssue(req.body);
    if (tooLarge) throw invalid([tooLarge]);
    const outcome = await cycles.run(req.body).catch((error: unknown) => {
      if (error instanceof ComputeTimeoutError)
        throw new HttpError(
          422,
          'too_much_work',
          `The analysis took longer than the server allows (${error.limitMs / 1000} s) and was stopped: ` +
            'ask for fewer samples or a shorter cycle.',
        );
      if (error instanceof ComputeBusyError) {
        res.setHeader('Retry-After', '5');
        throw new HttpError(
          503,
          'busy',
          'The server is busy with other analyses; try again in a few seconds.',
        );
      }
      throw error;
    });
    if (!outcome.ok) throw invalid(outcome.issues);
    // Already JSON: the worker serialised it, so the main thread only sends the text.
    res.type('application/json').send(outcome.json);
  });
  return router;
}
