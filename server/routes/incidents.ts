import { Router } from 'express';

import { incidentInputSchema, incidentReviewInputSchema } from '@/features/incidents/schema';
import { idParamsSchema } from '@/features/registry/schema';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import { validate } from '@/server/http/validate';
import { createIncident, mustSeeIncident, rideIncidents, reviewIncident } from '@/server/incidents/incidents';

const byId = validate({ params: idParamsSchema });
const reportInput = validate({ params: idParamsSchema, body: incidentInputSchema });
const reviewInput = validate({ params: idParamsSchema, body: incidentReviewInputSchema });

/**
 * Incident reports (server/incidents). Operators see and report on their company's rides only (anything
 * else answers 404, as every ride route does); staff see all; supervisors and administrators review.
 *
 * - `GET /rides/:id/incidents` → `RideIncidentsResponse` (newest first)
 * - `POST /rides/:id/incidents` `IncidentInput` → 201 `IncidentCreated`; operators only (403 for staff);
 *   `stopRide` takes the ride out of service and books its follow-up (409 when it is already stopped)
 * - `GET /incidents/:id` → `Incident`
 * - `POST /incidents/:id/review` `{ note }` → `Incident`; supervisors and administrators (409 when reviewed)
 */
export function incidentsRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);
  const reviewers = requireRole('supervisor', 'admin');

  router.get('/rides/:id/incidents', auth, byId, (_req, res) => {
    res.json(rideIncidents(deps.db, currentUser(res), byId.params(res).id));
  });

  router.post('/rides/:id/incidents', auth, reportInput, (_req, res) => {
    const body = createIncident(
      deps.db,
      currentUser(res),
      reportInput.params(res).id,
      reportInput.body(res),
      nowOf(deps),
    );
    res.status(201).json(body);
  });

  router.get('/incidents/:id', auth, byId, (_req, res) => {
    res.json(mustSeeIncident(deps.db, currentUser(res), byId.params(res).id));
  });

  router.post('/incidents/:id/review', auth, reviewers, reviewInput, (_req, res) => {
    res.json(
      reviewIncident(
        deps.db,
        currentUser(res),
        reviewInput.params(res).id,
        reviewInput.body(res).note,
        nowOf(deps),
      ),
    );
  });

  return router;
}
