import { Router } from 'express';

import {
  idParamsSchema,
  rideInputSchema,
  rideListQuerySchema,
  ridePatchSchema,
  type RideDetailResponse,
  type RideListPage,
} from '@/features/registry/schema';
import { companyScope } from '@/server/auth/scope';
import { hasBulletinRecords } from '@/server/bulletins/bulletins';
import { nowOf, type ApiDeps } from '@/server/deps';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { patchBody, validate } from '@/server/http/validate';
import { findDesignVersion } from '@/server/registry/design';
import { createRide, deleteRide, listRides, mustFindRide } from '@/server/registry/rides';
import { updateRide } from '@/server/review/ride-update';

const listInput = validate({ query: rideListQuerySchema });
const oneRide = validate({ params: idParamsSchema });
const createInput = validate({ body: rideInputSchema });
const patchInput = validate({ params: idParamsSchema, body: patchBody(ridePatchSchema) });

/**
 * The rides of the register.
 *
 * - `GET /rides?q=&status=&rideClass=&siteId=&operatorId=&sort=&page=&pageSize=` → `{ rides, total, page,
 *   pageSize }` (any role; operators only their own company's rides).
 * - `GET /rides/:id` → `{ ride, design }`: the current design data, null for operators (who may not see
 *   design data) and for rides without any; 404 for unknown rides and other companies'.
 * - `POST /rides` (admin) → 201 `{ ride }`; `PATCH /rides/:id` (admin, supervisor) → `{ ride }`;
 *   `DELETE /rides/:id` (admin) → 204, or 409 while design data or schedules refer to it.
 */
export function ridesRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);

  router.get('/rides', auth, listInput, (_req, res) => {
    const page: RideListPage = listRides(deps.db, companyScope(currentUser(res)), listInput.query(res));
    res.json(page);
  });

  router.get('/rides/:id', auth, oneRide, (_req, res) => {
    const user = currentUser(res);
    const ride = mustFindRide(deps.db, oneRide.params(res).id, companyScope(user));
    const body: RideDetailResponse = {
      ride,
      design: user.role === 'operator' ? null : findDesignVersion(deps.db, ride.id),
    };
    res.json(body);
  });

  router.post('/rides', auth, requireRole('admin'), createInput, (_req, res) => {
    const ride = createRide(deps.db, currentUser(res).id, createInput.body(res), nowOf(deps));
    res.status(201).json({ ride });
  });

  router.patch('/rides/:id', auth, requireRole('admin', 'supervisor'), patchInput, (_req, res) => {
    const ride = updateRide(
      deps.db,
      currentUser(res).id,
      patchInput.params(res).id,
      patchInput.body(res),
      nowOf(deps),
      deps.config.appUrl,
    );
    res.json({ ride });
  });

  router.delete('/rides/:id', auth, requireRole('admin'), oneRide, (_req, res) => {
    deleteRide(deps.db, currentUser(res).id, oneRide.params(res).id, [hasBulletinRecords]);
    res.status(204).end();
  });

  return router;
}
