import { Router } from 'express';

import { idParamsSchema } from '@/features/registry/schema';
import {
  queueQuerySchema,
  rideStatusChangeInputSchema,
  selfApprovalInputSchema,
} from '@/features/review/schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { HttpError } from '@/server/http/errors';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { readQueueJson } from '@/server/queue/queue';
import { queueToday } from '@/server/queue/queue-refresh';
import { changeRideStatus } from '@/server/review/ride-status';
import { getSelfApprovalSetting, setSelfApproval } from '@/server/review/self-approval';

const queueInput = validate({ query: queueQuerySchema });
const statusInput = validate({ params: idParamsSchema, body: rideStatusChangeInputSchema });
const selfApprovalInput = validate({ body: selfApprovalInputSchema });

/**
 * The supervisors' review desk (supervisors and admins; inspectors and operators get 403).
 *
 * - `GET /review/queue?q=&siteId=&operatorId=&inspectorId=&rideClass=&rideStatus=&urgency=&from=&to=&sort=
 *   &page=&pageSize=` → `{ items, total, page, pageSize, counts }`: submitted inspections awaiting a
 *   decision and rides needing attention, most urgent first by default (`sort` = urgency | newest |
 *   oldest | ride). `rideClass`, `rideStatus` and `urgency` take several values (repeated or
 *   comma-separated); `from`/`to` are inclusive calendar dates (UTC) of the item's date; `counts` per
 *   urgency cover every filter except `urgency`, `total` every filter.
 * - `POST /rides/:id/status` `{ status, reason }` → `{ ride, notice }`: a change of the ride's status outside
 *   a decision, under the status rules (`features/review/status-rules.ts`): a stop or restriction
 *   (supervisor, admin) or an override back towards service (supervisor only); the reason is required;
 *   recorded, audited, and one notice to the operator. 403 when the rules refuse the role, 409 on no change.
 * - `GET /settings/self-approval` → `{ selfApproval: { allowed, updatedAt, updatedByName } }`; `PUT` (admins)
 *   `{ allowed }` → the same, audited: whether a supervisor may approve an inspection they recorded.
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

  router.post('/rides/:id/status', ...deciders, statusInput, (_req, res) => {
    const { ride, notice } = changeRideStatus(
      deps.db,
      currentUser(res),
      statusInput.params(res).id,
      statusInput.body(res),
      nowOf(deps),
      deps.config.appUrl,
    );
    res.json({ ride: { id: ride.id, status: ride.status, statusReason: ride.statusReason }, notice });
  });

  router.get('/settings/self-approval', ...deciders, (_req, res) => {
    res.json({ selfApproval: getSelfApprovalSetting(deps.db) });
  });

  router.put(
    '/settings/self-approval',
    requireAuth(deps),
    requireRole('admin'),
    selfApprovalInput,
    (_req, res) => {
      const { allowed } = selfApprovalInput.body(res);
      res.json({ selfApproval: setSelfApproval(deps.db, currentUser(res).id, allowed, nowOf(deps)) });
    },
  );

  return router;
}
