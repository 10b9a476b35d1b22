import express, { Router, type Request } from 'express';

import { parseRunningLogCsv } from '@/features/pivot-life';
import { rideCyclesOfDay, summariseLog } from '@/features/pivot-life/life-math';
import {
  runningLogImportBodySchema,
  type RunningLogImportResponse,
  type RunningLogResponse,
  type RunningLogSaveResponse,
} from '@/features/pivot-life/running-log-schema';
import { runningLogEntrySchema, type RideLife } from '@/features/pivot-life/schema';
import { idParamsSchema } from '@/features/registry/schema';
import { zodIssues } from '@/lib/api-errors';
import { isoDay } from '@/lib/dates';
import { companyScope } from '@/server/auth/scope';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import { HttpError } from '@/server/http/errors';
import { validate } from '@/server/http/validate';
import { refreshRideLifeFlagsAfter } from '@/server/pivot-life/flags';
import { rideLife } from '@/server/pivot-life/life';
import {
  importRunningLog,
  listRunningLog,
  runningLogDays,
  saveRunningLogDay,
} from '@/server/pivot-life/running-log';
import { findDesignVersion } from '@/server/registry/design';
import { mustFindRide } from '@/server/registry/rides';

const byRide = validate({ params: idParamsSchema });
const dayInput = validate({ params: idParamsSchema, body: runningLogEntrySchema });

/** CSV uploads as text; a JSON `{ csv }` body is parsed by the app's JSON parser already. */
const csvBody = express.text({ type: ['text/csv', 'text/plain', 'application/csv'], limit: '1mb' });

function csvText(req: Request): string {
  if (typeof req.body === 'string') return req.body;
  if (req.body === undefined)
    throw new HttpError(
      415,
      'unsupported_media_type',
      'Send the file as text (Content-Type text/csv) or as JSON { csv }.',
    );
  const parsed = runningLogImportBodySchema.safeParse(req.body);
  if (!parsed.success)
    throw new HttpError(
      400,
      'validation_failed',
      'Some fields are missing or invalid.',
      zodIssues(parsed.error),
    );
  return parsed.data.csv;
}

/**
 * A ride's pivot life and its running log. Staff see every ride; operators only their own company's
 * (others' rides answer 404, as every ride route does).
 *
 * - `GET /rides/:id/life` → `RideLife` (features/pivot-life/schema.ts)
 * - `GET /rides/:id/running-log` → `{ rideId, rideName, entries (newest first), totals }`
 * - `POST /rides/:id/running-log` `{ day, cycles?, hours?, note? }` → `{ entry, replaced }`: one day; a day
 *   already logged is replaced (the audit log keeps what it said)
 * - `POST /rides/:id/running-log/import` a CSV (`day,cycles,hours,note`, header required) as text/csv or
 *   JSON `{ csv }` → `{ saved, replaced }`; any bad row → 400 naming each row and field, nothing saved
 */
export function lifeRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);
  const today = () => isoDay(nowOf(deps));

  router.get('/rides/:id/life', auth, byRide, (_req, res) => {
    const ride = mustFindRide(deps.db, byRide.params(res).id, companyScope(currentUser(res)));
    const body: RideLife = rideLife(deps.db, ride.id, today());
    res.json(body);
  });

  router.get('/rides/:id/running-log', auth, byRide, (_req, res) => {
    const ride = mustFindRide(deps.db, byRide.params(res).id, companyScope(currentUser(res)));
    const rideCycleS = findDesignVersion(deps.db, ride.id)?.data.fatigue?.rideCycleS ?? null;
    const days = runningLogDays(deps.db, ride.id);
    const summary = summariseLog(days, rideCycleS);
    const body: RunningLogResponse = {
      rideId: ride.id,
      rideName: ride.name,
      entries: listRunningLog(deps.db, ride.id),
      totals: {
        days: days.length,
        cycles: days.reduce((s, d) => s + (d.cycles ?? 0), 0),
        hours: days.reduce((s, d) => s + (d.hours ?? 0), 0),
        rideCycles: days.every((d) => rideCyclesOfDay(d, rideCycleS) !== null) ? summary.cyclesLogged : null,
        rideCycleS,
        cyclesPerDay: summary.cyclesPerDay,
      },
    };
    res.json(body);
  });

  router.post('/rides/:id/running-log', auth, dayInput, (_req, res) => {
    const user = currentUser(res);
    const { id } = dayInput.params(res);
    const entry = dayInput.body(res);
    const body: RunningLogSaveResponse = saveRunningLogDay(
      deps.db,
      id,
      companyScope(user),
      user.id,
      entry,
      nowOf(deps),
      today(),
    );
    refreshRideLifeFlagsAfter(deps.db, id, nowOf(deps)); // logged cycles move the wear projections
    res.status(body.replaced ? 200 : 201).json(body);
  });

  router.post('/rides/:id/running-log/import', auth, csvBody, byRide, (req, res) => {
    const user = currentUser(res);
    const scope = companyScope(user);
    const ride = mustFindRide(deps.db, byRide.params(res).id, scope);
    const parsed = parseRunningLogCsv(csvText(req), today());
    if (!parsed.ok)
      throw new HttpError(
        400,
        'validation_failed',
        `The file has ${parsed.issues.length === 1 ? 'a problem' : `${parsed.issues.length} problems`}; nothing was saved.`,
        parsed.issues,
      );
    const body: RunningLogImportResponse = importRunningLog(
      deps.db,
      ride.id,
      scope,
      user.id,
      parsed.entries,
      nowOf(deps),
    );
    refreshRideLifeFlagsAfter(deps.db, ride.id, nowOf(deps));
    res.json(body);
  });

  return router;
}
