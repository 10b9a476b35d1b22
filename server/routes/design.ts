import { Router } from 'express';

import {
  designPutBodySchema,
  designVersionParamsSchema,
  idParamsSchema,
  type DesignVersion,
} from '@/features/registry/schema';
import type { ApiDeps } from '@/server/deps';
import { currentUser, requireAuth, requireRole } from '@/server/http/require-auth';
import { validate } from '@/server/http/validate';
import {
  createDesignVersion,
  findDesignVersion,
  listDesignVersions,
  mustFindDesignVersion,
} from '@/server/registry/design';
import { mustFindRide } from '@/server/registry/rides';

const byRide = validate({ params: idParamsSchema });
const byVersion = validate({ params: designVersionParamsSchema });
const putInput = validate({ params: idParamsSchema, body: designPutBodySchema });

/**
 * A ride's design data and its versions. Staff read (admin, supervisor, inspector); admins and supervisors
 * make new versions; operators may not see design data at all (403, before the ride is even looked up).
 *
 * - `GET /rides/:id/design` → `{ design: DesignVersion | null }` (the current version)
 * - `PUT /rides/:id/design` `{ reason, data, basedOnVersion? }` → 201 `{ design }`: a new version; 409
 *   `version_conflict` when `basedOnVersion` is not the current one, 409 `design_unchanged` for no change
 * - `GET /rides/:id/design/versions` → `{ versions: DesignVersionInfo[] }`, newest first
 * - `GET /rides/:id/design/versions/:version` → `{ design }`; versions never change
 */
export function designRouter(deps: ApiDeps): Router {
  const router = Router();
  const readers = [requireAuth(deps), requireRole('admin', 'supervisor', 'inspector')];
  const editors = [requireAuth(deps), requireRole('admin', 'supervisor')];

  router.get('/rides/:id/design', ...readers, byRide, (_req, res) => {
    const ride = mustFindRide(deps.db, byRide.params(res).id);
    const design: DesignVersion | null = findDesignVersion(deps.db, ride.id);
    res.json({ design });
  });

  router.put('/rides/:id/design', ...editors, putInput, (_req, res) => {
    const { reason, data, basedOnVersion } = putInput.body(res);
    const design = createDesignVersion(deps.db, currentUser(res).id, putInput.params(res).id, {
      reason,
      data,
      basedOnVersion,
      origin: 'editor',
    });
    res.status(201).json({ design });
  });

  router.get('/rides/:id/design/versions', ...readers, byRide, (_req, res) => {
    const ride = mustFindRide(deps.db, byRide.params(res).id);
    res.json({ versions: listDesignVersions(deps.db, ride.id) });
  });

  router.get('/rides/:id/design/versions/:version', ...readers, byVersion, (_req, res) => {
    const { id, version } = byVersion.params(res);
    const ride = mustFindRide(deps.db, id);
    res.json({ design: mustFindDesignVersion(deps.db, ride.id, version) });
  });

  return router;
}
