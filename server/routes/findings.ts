import { Router } from 'express';

import { cycleQuerySchema } from '@/features/loads/cycle-resolution-schema';
import { idParamsSchema } from '@/features/registry/schema';
import { decisionInputSchema, type DecisionResponse, type TrendsResponse } from '@/features/review/schema';
import { findingInputSchema, findingPatchSchema } from '@/features/notices/finding-schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { inspectionCycles } from '@/server/review/cycle';
import { decideInspection } from '@/server/review/decisions';
import {
  createFinding,
  deleteFinding,
  listFindings,
  mustSeeInspection,
  updateFinding,
} from '@/server/findings/findings';
import { inspectionTrail } from '@/server/review/trail';
import { rideTrends } from '@/server/review/trends';

const byId = validate({ params: idParamsSchema });
const cycleInput = validate({ params: idParamsSchema, query: cycleQuerySchema });
const createInput = validate({ params: idParamsSchema, body: findingInputSchema });
const patchInput = validate({ params: idParamsSchema, body: findingPatchSchema });
const decisionInput = validate({ params: idParamsSchema, body: decisionInputSchema });

/**
 * The review desk's decisions and what they rest on. Staff read (an inspector only their own
 * inspections; another's answers 404); supervisors and admins decide; operators get 403 everywhere here.
 *
 * - `GET /inspections/:id/findings` → `{ findings }` in number order
 * - `POST /inspections/:id/findings` → 201 `{ finding }`; `PATCH /findings/:id` (send `expectedUpdatedAt`
 *   to get a 409 instead of overwriting someone else's edit) → `{ finding }`; `DELETE /findings/:id` → 204.
 *   Once the inspection is approved its findings' content is fixed (409).
 * - `POST /inspections/:id/decision` `{ decision: approve|return, note }` → the decision; 409 unless the
 *   inspection is still `submitted`. Approving moves the ride's schedule of that inspection type.
 * - `GET /inspections/:id/trail` → `{ entries }`: its and its findings' audit entries, and the ride's since
 *   it was submitted, newest first
 * - `GET /inspections/:id/cycle` → the ride cycle the load check rests on, as `POST /loads/cycle` answers
 *   (bounded series with every peak kept; `?resolution=full` for every sample, within a cap), computed in
 *   the cycle worker and kept per inspection and inputs (server/review/cycle.ts), with an ETag
 * - `GET /rides/:id/trends` → the ride's inspections oldest first with peak forces, pin diameters and
 *   clearances (an inspector's own only, as with the inspections themselves)
 */
export function findingsRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);
  const staff = [auth, requireRole('inspector', 'supervisor', 'admin')];
  const deciders = [auth, requireRole('supervisor', 'admin')];
  const cycles = inspectionCycles(deps);

  router.get('/inspections/:id/findings', ...staff, byId, (_req, res) => {
    const inspection = mustSeeInspection(deps.db, currentUser(res), byId.params(res).id);
    res.json({ findings: listFindings(deps.db, inspection.id) });
  });

  router.post('/inspections/:id/findings', ...deciders, createInput, (_req, res) => {
    const finding = createFinding(
      deps.db,
      currentUser(res),
      createInput.params(res).id,
      createInput.body(res),
      nowOf(deps),
    );
    res.status(201).json({ finding });
  });

  router.patch('/findings/:id', ...deciders, patchInput, (_req, res) => {
    const finding = updateFinding(
      deps.db,
      currentUser(res),
      patchInput.params(res).id,
      patchInput.body(res),
      nowOf(deps),
    );
    res.json({ finding });
  });

  router.delete('/findings/:id', ...deciders, byId, (_req, res) => {
    deleteFinding(deps.db, currentUser(res), byId.params(res).id, nowOf(deps));
    res.status(204).end();
  });

  router.post('/inspections/:id/decision', ...deciders, decisionInput, (_req, res) => {
    const body: DecisionResponse = decideInspection(
      deps.db,
      currentUser(res),
      decisionInput.params(res).id,
      decisionInput.body(res),
      nowOf(deps),
      deps.config.appUrl,
    );
    res.json(body);
  });

  router.get('/inspections/:id/trail', ...staff, byId, (_req, res) => {
    const inspection = mustSeeInspection(deps.db, currentUser(res), byId.params(res).id);
    res.json({ entries: inspectionTrail(deps.db, inspection) });
  });

  router.get('/inspections/:id/cycle', ...staff, cycleInput, async (req, res) => {
    const inspection = mustSeeInspection(deps.db, currentUser(res), cycleInput.params(res).id);
    await cycles.send(req, res, inspection, cycleInput.query(res).resolution);
  });

  router.get('/rides/:id/trends', ...staff, byId, (_req, res) => {
    const body: TrendsResponse = rideTrends(deps.db, currentUser(res), byId.params(res).id);
    res.json(body);
  });

  return router;
}
