import { Router } from 'express';
import { z } from 'zod';

import {
  idParamsSchema,
  roundItemInputSchema,
  roundOrderInputSchema,
  roundWeekQuerySchema,
  setupInputSchema,
  setupListQuerySchema,
  setupStateInputSchema,
  siteEventInputSchema,
  weekStartOf,
} from '@/features/registry/schema';
import { isoDay } from '@/lib/dates';
import { companyScope } from '@/server/auth/scope';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import { validate } from '@/server/http/validate';
import { mustFindRide } from '@/server/registry/rides';
import { createEvent, listEvents } from '@/server/setups/events';
import { orderRoundDay, planRoundItem, roundWeek } from '@/server/setups/rounds';
import { changeSetupState, createSetup, listSetups, setupsOfRide } from '@/server/setups/setups';

const byId = validate({ params: idParamsSchema });
const listInput = validate({ query: setupListQuerySchema });
const createInput = validate({ body: setupInputSchema });
const stateInput = validate({ params: idParamsSchema, body: setupStateInputSchema });
const eventInput = validate({ body: siteEventInputSchema });
const weekInput = validate({ query: roundWeekQuerySchema });
const itemInput = validate({
  params: z.object({ scheduleId: idParamsSchema.shape.id }),
  body: roundItemInputSchema,
});
const orderInput = validate({ body: roundOrderInputSchema });

/**
 * Travelling rides' set-ups, events at shared sites and the planner's rounds (issue #19).
 *
 * - `GET /setups?rideId=&siteId=&eventId=` → `{ setups }` (operators: their own rides' only)
 * - `GET /rides/:id/setups` → `{ setups }` (operators: 404 for another company's ride)
 * - `POST /setups` → 201 `{ setup }` (planners; 409 `setup_overlaps`)
 * - `POST /setups/:id/state` `{ state: set_up | pulled_down, note? }` → `{ setup }` (planners)
 * - `GET /site-events` → `{ events }` (staff; events not yet over) · `POST /site-events` → 201 `{ event }`
 * - `GET /rounds?week=YYYY-MM-DD` → the week (Monday to Sunday) holding that day (planners)
 * - `PUT /rounds/items/:scheduleId` `{ day, assignedTo }` → 204 · `PUT /rounds/order` `{ day, siteIds }` → 204
 */
export function setupsRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);
  const planners = [auth, requireRole('admin', 'supervisor')];

  router.get('/setups', auth, listInput, (_req, res) => {
    res.json({ setups: listSetups(deps.db, listInput.query(res), companyScope(currentUser(res))) });
  });
  router.get('/rides/:id/setups', auth, byId, (_req, res) => {
    const ride = mustFindRide(deps.db, byId.params(res).id, companyScope(currentUser(res)));
    res.json({ setups: setupsOfRide(deps.db, ride.id) });
  });
  router.post('/setups', ...planners, createInput, (_req, res) => {
    const setup = createSetup(
      deps.db,
      currentUser(res),
      createInput.body(res),
      nowOf(deps),
      deps.config.appUrl,
    );
    res.status(201).json({ setup });
  });
  router.post('/setups/:id/state', ...planners, stateInput, (_req, res) => {
    const setup = changeSetupState(
      deps.db,
      currentUser(res),
      stateInput.params(res).id,
      stateInput.body(res),
      nowOf(deps),
      deps.config.appUrl,
    );
    res.json({ setup });
  });
  router.get('/site-events', auth, requireRole('admin', 'supervisor', 'inspector'), (_req, res) => {
    res.json({ events: listEvents(deps.db, isoDay(nowOf(deps))) });
  });
  router.post('/site-events', ...planners, eventInput, (_req, res) => {
    res
      .status(201)
      .json({ event: createEvent(deps.db, currentUser(res).id, eventInput.body(res), nowOf(deps)) });
  });
  router.get('/rounds', ...planners, weekInput, (_req, res) => {
    const day = weekInput.query(res).week ?? isoDay(nowOf(deps));
    res.json(roundWeek(deps.db, weekStartOf(day), nowOf(deps)));
  });
  router.put('/rounds/items/:scheduleId', ...planners, itemInput, (_req, res) => {
    planRoundItem(
      deps.db,
      currentUser(res).id,
      itemInput.params(res).scheduleId,
      itemInput.body(res),
      nowOf(deps),
    );
    res.status(204).end();
  });
  router.put('/rounds/order', ...planners, orderInput, (_req, res) => {
    orderRoundDay(deps.db, currentUser(res).id, orderInput.body(res));
    res.status(204).end();
  });
  return router;
}
