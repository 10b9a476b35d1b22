import { Router } from 'express';

import {
  idParamsSchema,
  scheduleInputSchema,
  scheduleListQuerySchema,
  schedulePatchSchema,
} from '@/features/registry/schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { notFound } from '@/server/http/errors';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { patchBody, validate } from '@/server/http/validate';
import { refreshRideLifeFlagsAfter } from '@/server/pivot-life/flags';
import { mustFindRide } from '@/server/registry/rides';
import {
  assignmentsOf,
  createSchedule,
  deleteSchedule,
  findSchedule,
  listInspectors,
  listSchedules,
  updateSchedule,
} from '@/server/registry/schedules';

const byId = validate({ params: idParamsSchema });
const listInput = validate({ query: scheduleListQuerySchema });
const createInput = validate({ body: scheduleInputSchema });
const patchInput = validate({ params: idParamsSchema, body: patchBody(schedulePatchSchema) });

/**
 * Inspection schedules (admin and supervisor) and an inspector's own assignments.
 *
 * - `GET /schedules?rideId=&inspectionType=&dueStatus=overdue,due&assignedTo=<id>|me|none&q=&sort=nextDue|
 *   -nextDue|ride|type|assignee&page=&pageSize=` → `{ schedules, total, page, pageSize }`
 * - `GET /schedules/:id` → `{ schedule }`; `GET /rides/:id/schedules` → `{ schedules }`
 * - `POST /schedules` → 201 `{ schedule }` (409 `schedule_exists` for a second one of the same type)
 * - `PATCH /schedules/:id` → `{ schedule }`; `DELETE /schedules/:id` → 204
 * - `GET /inspectors` → `{ inspectors }` (whom an inspection can be assigned to)
 * - `GET /assignments/mine` → `{ assignments }`: the caller's assigned inspections, soonest first (staff)
 */
export function schedulesRouter(deps: ApiDeps): Router {
  const router = Router();
  const planners = [requireAuth(deps), requireRole('admin', 'supervisor')];

  router.get('/schedules', ...planners, listInput, (_req, res) => {
    res.json(listSchedules(deps.db, listInput.query(res), nowOf(deps), currentUser(res).id));
  });
  router.get('/schedules/:id', ...planners, byId, (_req, res) => {
    const schedule = findSchedule(deps.db, byId.params(res).id, nowOf(deps));
    if (!schedule) throw notFound('No such schedule.');
    res.json({ schedule });
  });
  router.get('/rides/:id/schedules', ...planners, byId, (_req, res) => {
    const ride = mustFindRide(deps.db, byId.params(res).id);
    const page = listSchedules(
      deps.db,
      { rideId: ride.id, q: undefined, page: 1, pageSize: 200, sort: 'nextDue' },
      nowOf(deps),
      currentUser(res).id,
    );
    res.json({ schedules: page.schedules });
  });
  router.post('/schedules', ...planners, createInput, (_req, res) => {
    const schedule = createSchedule(deps.db, currentUser(res).id, createInput.body(res), nowOf(deps));
    refreshRideLifeFlagsAfter(deps.db, schedule.rideId, nowOf(deps)); // the next inspection a wear flag is against
    res.status(201).json({ schedule });
  });
  router.patch('/schedules/:id', ...planners, patchInput, (_req, res) => {
    const schedule = updateSchedule(
      deps.db,
      currentUser(res).id,
      patchInput.params(res).id,
      patchInput.body(res),
      nowOf(deps),
    );
    refreshRideLifeFlagsAfter(deps.db, schedule.rideId, nowOf(deps));
    res.json({ schedule });
  });
  router.delete('/schedules/:id', ...planners, byId, (_req, res) => {
    const rideId = findSchedule(deps.db, byId.params(res).id, nowOf(deps))?.rideId;
    deleteSchedule(deps.db, currentUser(res).id, byId.params(res).id, nowOf(deps));
    if (rideId) refreshRideLifeFlagsAfter(deps.db, rideId, nowOf(deps));
    res.status(204).end();
  });
  router.get('/inspectors', ...planners, (_req, res) => {
    res.json({ inspectors: listInspectors(deps.db) });
  });
  router.get(
    '/assignments/mine',
    requireAuth(deps),
    requireRole('inspector', 'supervisor', 'admin'),
    (_req, res) => {
      res.json({ assignments: assignmentsOf(deps.db, currentUser(res).id, nowOf(deps)) });
    },
  );
  return router;
}
