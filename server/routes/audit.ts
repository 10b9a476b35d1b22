import { Router } from 'express';

import { auditListQuerySchema } from '@/features/registry/schema';
import type { ApiDeps } from '@/server/deps';
import { requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { listAudit } from '@/server/registry/audit-query';

const listInput = validate({ query: auditListQuerySchema });

/**
 * `GET /audit?entity=&action=&entityId=&rideId=&userId=&from=&to=&q=&sort=at|-at&page=&pageSize=` →
 * `{ entries, total, page, pageSize }`: who changed what and when, with the record before and after.
 * Admins and supervisors only.
 */
export function auditRouter(deps: ApiDeps): Router {
  const router = Router();
  router.get('/audit', requireAuth(deps), requireRole('admin', 'supervisor'), listInput, (_req, res) => {
    res.json(listAudit(deps.db, listInput.query(res)));
  });
  return router;
}
