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
import { JsonAnswers, rawQueryOf, sendJsonAnswer } from '@/server/http/json-answers';
import { queueStamp, readQueueJson } from '@/server/queue/queue';
import { queueToday } from '@/server/queue/queue-refresh';
import { changeRideStatus } from '@/server/review/ride-status';
import { getSelfApprovalSetting, setSelfApproval } from '@/server/review/self-approval';

const queueInput = validate({ query: queueQuerySchema });
const statusInput = validate({ params: idParamsSchema, body: rideStatusChangeInputSchema });
const selfApprovalInput = validate({ body: selfApprovalInputSchema });

/**
 * Pages of the queue remembered as sent (JSON, compressed forms, ETag) while the queue stands still
 * (`queueStamp`); a few thousand pages at most.
 */
const QUEUE_ANSWER_BYTES = 24 * 1024 * 1024;

/**
 * The desk's busiest read, mounted ahead of every other API router so a request does not walk their
 * routes first (Express tries each in turn).
 *
 * - `GET /review/queue?q=&siteId=&operatorId=&inspectorId=&rideClass=&rideStatus=&urgency=&from=&to=&sort=
 *   &page=&pageSize=` → `{ items, total, page, pageSize, counts }`: submitted inspections awaiting a
 *   decision and rides needing attention, most urgent first by default (`sort` = urgency | newest |
 *   oldest | ride). `rideClass`, `rideStatus` and `urgency` take several values (repeated or
 *   comma-separated); `from`/`to` are inclusive calendar dates of the item's date on its site's clock (`day`); `counts` per
 *   urgency cover every filter except `urgency`, `total` every filter. An answer is read once per query
 *   string while the queue stays the same (any write that changes it moves the stamp), then sent from
 *   memory with its ETag (304 on `If-None-Match`) and compressed once.
 */
export function reviewQueueRouter(deps: ApiDeps): Router {
  const router = Router();
  const answers = new JsonAnswers(QUEUE_ANSWER_BYTES);
  type Read = { stamp: string | null; today: string };

  router.get(
    '/review/queue',
    requireAuth(deps),
    requireRole('supervisor', 'admin'),
    (req, res, next) => {
      const today = queueToday(nowOf(deps));
      // Read before the page, so a page is never kept under a stamp newer than what it was read from.
      const stamp = queueStamp(deps.db, today);
      const known = stamp === null ? undefined : answers.get(rawQueryOf(req), stamp);
      if (known) return sendJsonAnswer(req, res, answers, known);
      res.locals.queueRead = { stamp, today } satisfies Read;
      next();
    },
    queueInput,
    (req, res) => {
      const query = queueInput.query(res);
      if (query.from && query.to && query.from > query.to)
        throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
          { path: 'query.to', message: 'Must be on or after the from date' },
        ]);
      const { stamp, today } = res.locals.queueRead as Read;
      const json = readQueueJson(deps.db, query, today);
      if (stamp === null) res.type('application/json').send(json);
      else sendJsonAnswer(req, res, answers, answers.set(rawQueryOf(req), stamp, json));
    },
  );
  return router;
}

/**
 * The rest of the supervisors' review desk (supervisors and admins; inspectors and operators get 403).
 *
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
