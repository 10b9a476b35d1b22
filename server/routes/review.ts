import { Router } from 'express';

import { queueQuerySchema } from '@/features/review/schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { HttpError } from '@/server/http/errors';
import { requireAuth, requireRole } from '@/server/http/require-auth';
import { validate } from '@/server/http/validate';
import { readQueueJson } from '@/server/review/queue';
import { queueToday } from '@/server/review/queue-refresh';

const queueInput = validate({ query: queueQuerySchema });

/**
 * The supervisors' review desk (supervisors and admins; inspectors and operators get 403).
 *
 * - `GET /review/queue?q=&siteId=&operatorId=&inspectorId=&rideClass=&rideStatus=&urgency=&from=&to=&sort=
 *   &page=&pageSize=` → `{ items, total, page, pageSize, counts }`: submitted inspections awaiting a
 *   decision and rides needing attention, most urgent first by default (`sort` = urgency | newest |
 *   oldest | ride). `rideClass`, `rideStatus` and `urgency` take several values (repeated or
 *   comma-separated); `from`/`to` are inclusive calendar dates (UTC) of the item's date; `counts` per
 *   urgency cover every filter except `urgency`, `total` every filter.
 */
export function reviewRouter(deps: ApiDeps): Router {
  const router = Router();
  const deciders = [requireAuth(deps), requireRole('supervisor', 'admin')];

  router.get('/review/queue', ...deciders, queueInput, (_req, res) => {
    const query = queueInput.query(res);
    if (query.from && query.to && query.from > query.to)
      throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
        { path: 'query.to', message: 'Must be on or after the from date' },
      ]);
    res.type('application/json').send(readQueueJson(deps.db, query, queueToday(nowOf(deps))));
  });

  return router;
}
