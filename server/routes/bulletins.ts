import { Router } from 'express';
import { z } from 'zod';

import {
  bulletinDoneInputSchema,
  bulletinInputSchema,
  bulletinListQuerySchema,
  bulletinPatchSchema,
} from '@/features/bulletins/schema';
import { idParamsSchema } from '@/features/registry/schema';
import { companyScope } from '@/server/auth/scope';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import {
  createBulletin,
  deleteBulletin,
  findBulletin,
  listBulletins,
  updateBulletin,
} from '@/server/bulletins/bulletins';
import { bulletinRides, recordBulletinDone, rideBulletins } from '@/server/bulletins/on-rides';
import { nowOf, type ApiDeps } from '@/server/deps';
import { notFound } from '@/server/http/errors';
import { patchBody, validate } from '@/server/http/validate';

const byId = validate({ params: idParamsSchema });
const listInput = validate({ query: bulletinListQuerySchema });
const createInput = validate({ body: bulletinInputSchema });
const patchInput = validate({ params: idParamsSchema, body: patchBody(bulletinPatchSchema) });
const doneParams = z.object({ id: idParamsSchema.shape.id, bulletinId: idParamsSchema.shape.id });
const doneInput = validate({ params: doneParams, body: bulletinDoneInputSchema });

/**
 * Makers' safety bulletins (server/bulletins). Supervisors and admins keep the register; all staff read
 * it; an operator reads the bulletins that apply to their company's rides (by maker and model), and sees
 * only those rides on them.
 *
 * - `GET /bulletins?q=&severity=&page=&pageSize=` → `{ bulletins, total, page, pageSize }`, each with
 *   `rideCount` and `doneCount` of the rides the reader may see.
 * - `GET /bulletins/:id` → `{ bulletin, rides }`: where it stands on each ride it applies to; 404 for an
 *   operator when it applies to none of theirs.
 * - `POST /bulletins` → 201 `{ bulletin }`; `PATCH /bulletins/:id` → `{ bulletin }`; `DELETE` → 204, 409
 *   once anything is recorded against it. The PDF (`documentSha256`) must be stored first
 *   (`PUT /documents/:sha256`); a maker's reference is used once.
 * - `GET /rides/:id/bulletins` → `{ bulletins }` (anyone who may see the ride): every bulletin applying
 *   to it with its state, who recorded it done and when, the last inspection that found it not done.
 * - `POST /rides/:id/bulletins/:bulletinId/done` (supervisor, admin) `{ on, note }` → 201 `{ bulletin }`:
 *   records it done on the ride, audited. Inspectors record it through the inspection's checklist.
 */
export function bulletinsRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);
  const keepers = [auth, requireRole('admin', 'supervisor')];

  router.get('/bulletins', auth, listInput, (_req, res) => {
    res.json(listBulletins(deps.db, listInput.query(res), companyScope(currentUser(res))));
  });

  router.get('/bulletins/:id', auth, byId, (_req, res) => {
    const scope = companyScope(currentUser(res));
    const bulletin = findBulletin(deps.db, byId.params(res).id, scope);
    if (!bulletin) throw notFound('No such bulletin.');
    res.json({ bulletin, rides: bulletinRides(deps.db, bulletin, scope, nowOf(deps)) });
  });

  router.post('/bulletins', ...keepers, createInput, (_req, res) => {
    const bulletin = createBulletin(deps.db, currentUser(res).id, createInput.body(res), nowOf(deps));
    res.status(201).json({ bulletin });
  });

  router.patch('/bulletins/:id', ...keepers, patchInput, (_req, res) => {
    const bulletin = updateBulletin(
      deps.db,
      currentUser(res).id,
      patchInput.params(res).id,
      patchInput.body(res),
      nowOf(deps),
    );
    res.json({ bulletin });
  });

  router.delete('/bulletins/:id', ...keepers, byId, (_req, res) => {
    deleteBulletin(deps.db, currentUser(res).id, byId.params(res).id);
    res.status(204).end();
  });

  router.get('/rides/:id/bulletins', auth, byId, (_req, res) => {
    const scope = companyScope(currentUser(res));
    res.json({ bulletins: rideBulletins(deps.db, byId.params(res).id, scope, nowOf(deps)) });
  });

  router.post('/rides/:id/bulletins/:bulletinId/done', ...keepers, doneInput, (_req, res) => {
    const { id, bulletinId } = doneInput.params(res);
    const bulletin = recordBulletinDone(
      deps.db,
      currentUser(res).id,
      id,
      bulletinId,
      doneInput.body(res),
      nowOf(deps),
    );
    res.status(201).json({ bulletin });
  });

  return router;
}
