import { Router } from 'express';
import { z } from 'zod';

import { pushBatchSchema } from '@/features/records/schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { syncPushJsonBody } from '@/server/http/json-body';
import { validate } from '@/server/http/validate';
import { scheduleAnalysis } from '@/server/sync/analysis';
import { ingestBatch } from '@/server/sync/ingest';
import { buildPull } from '@/server/sync/pull';

const pushInput = validate({ body: pushBatchSchema });
const pullInput = validate({
  query: z.object({
    cursor: z.string().trim().min(1, 'Leave the cursor out for a first pull').max(100).optional(),
  }),
});

/**
 * The phone's sync (inspectors, supervisors and admins; operators' staff for their daily pre-opening checks:
 * their company's rides only, and no other type, server/sync/ingest.ts).
 *
 * - `POST /sync/push` `{ batchId, records[], signatures: { [recordId]: { keyId, signature } } }` → 200
 *   `{ batchId, results: [{ id, status, issues? }] }`, one result per record in order: `accepted`,
 *   `duplicate` (already stored, identical) or `rejected` with issues whose paths are relative to the
 *   record. The same batch id again (same user) answers the
 *   stored result and writes nothing. A body that is not a batch at all is a 400 `validation_failed`.
 *   A new record without a valid signature by one of the sender's phone keys (not withdrawn) is rejected
 *   with an issue at `signature` (server/sync/ingest.ts).
 * - `GET /sync/pull?cursor=` → the shape of features/sync/pull-schema.ts: everything on the first pull,
 *   then what changed since `cursor`; a cursor this server did not give out is a 400 naming `query.cursor`.
 *
 * The server's own analysis of accepted records runs after the answer has gone (server/sync/analysis.ts).
 */
export function syncRouter(deps: ApiDeps): Router {
  const router = Router();
  const phones = [requireAuth(deps), requireRole('inspector', 'supervisor', 'admin', 'operator')];

  // Inspections a stop or crash left unanalysed are picked up as soon as the app is running again.
  scheduleAnalysis(deps.db, deps.logger);

  // The large parser only after the token and role are checked (server/http/json-body.ts).
  router.post('/sync/push', ...phones, syncPushJsonBody, pushInput, (_req, res) => {
    const user = currentUser(res);
    const { result, replayed, accepted } = ingestBatch(deps.db, user, pushInput.body(res));
    res.json(result);
    if (accepted > 0) scheduleAnalysis(deps.db, deps.logger);
    deps.logger.info(
      { batchId: result.batchId, records: result.results.length, accepted, replayed },
      'sync push',
    );
  });

  router.get('/sync/pull', ...phones, pullInput, (_req, res) => {
    const { cursor } = pullInput.query(res);
    res.json(buildPull(deps.db, currentUser(res), cursor ?? null, { now: nowOf(deps) }));
  });

  return router;
}
