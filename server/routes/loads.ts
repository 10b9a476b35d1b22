import { Router } from 'express';

import { analyseCycleRequest, solveLoadsRequest } from '@/features/loads/schema';
import type { ApiDeps } from '@/server/deps';
import { HttpError } from '@/server/http/errors';
import { requireAuth } from '@/server/auth/require-auth';

const invalid = (issues: { path: string; message: string }[]) =>
  new HttpError(400, 'validation_failed', 'The request has invalid fields.', issues);

/**
 * `POST /loads` (one instant) and `POST /loads/cycle` (a whole ride cycle): the same engine the app
 * runs for its offline preview. Any signed-in role may use them; they read and write no stored data.
 */
export function loadsRouter(deps: ApiDeps): Router {
  const router = Router();
  router.post('/loads', requireAuth(deps), (req, res) => {
    const outcome = solveLoadsRequest(req.body);
    if (!outcome.ok) throw invalid(outcome.issues);
    res.json(outcome.value);
  });
  router.post('/loads/cycle', requireAuth(deps), (req, res) => {
    const outcome = analyseCycleRequest(req.body);
    if (!outcome.ok) throw invalid(outcome.issues);
    res.json(outcome.value);
  });
  return router;
}
