/**
 * A travelling ride's set-ups (issue #19): each build-up at a site, from its build-up day to its pull-down
 * day. Making one books the ride's set-up inspection; once built (at once when its build-up day has come)
 * the ride is out of service at the new site under the status rules' `setup_started`, its site follows
 * the set-up, and the operator gets the status notice. The approval of the set-up inspection clears it
 * (`server/review/setup-clearance.ts`, called by the decision). Operators read their own rides' set-ups.
 */
import { and, asc, eq, gte, inArray, lte, ne, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { companies, rides, sites, users } from '@/db/server/schema';
import { setupChanges, setups, siteEvents } from '@/db/server/setups';
import {
  setupPendingWords,
  type Setup,
  type SetupInput,
  type SetupState,
  type SetupStateInput,
} from '@/features/registry/schema';
import type { SessionUser } from '@/features/session/schema';
import { checkTransition } from '@/features/rides/status-rules';
import { dayInZone } from '@/lib/dates';
import type { Db } from '@/server/db';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { issueStatusNotice } from '@/server/notices/issue';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { recordAudit } from '@/server/registry/audit';
import { mustFindRide } from '@/server/registry/rides';
import { findSite } from '@/server/registry/sites';
import { applyStatus } from '@/server/review/ride-status';
import { bookSetupInspection, recordSetupChange } from '@/server/review/setup-clearance';
import { defaultTimeZone, resolveZone } from '@/server/schedule-due';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

const changedBy = alias(users, 'changed_by');

const invalid = (path: string, message: string) =>
  new HttpError(400, 'validation_failed', message, [{ path, message }]);

function setupRows(db: Pick<Db, 'select'>, where: SQL | undefined): Setup[] {
  const rows = db
    .select({
      id: setups.id,
      rideId: setups.rideId,
      rideName: rides.name,
      operatorName: companies.name,
      siteId: setups.siteId,
      siteName: sites.name,
      eventId: setups.eventId,
      eventName: siteEvents.name,
      fromDate: setups.fromDate,
      toDate: setups.toDate,
      pitch: setups.pitch,
      state: setups.state,
      createdAt: setups.createdAt,
    })
    .from(setups)
    .innerJoin(rides, eq(rides.id, setups.rideId))
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .innerJoin(sites, eq(sites.id, setups.siteId))
    .leftJoin(siteEvents, eq(siteEvents.id, setups.eventId))
    .where(where)
    .orderBy(asc(setups.fromDate), asc(rides.name))
    .all();
  if (rows.length === 0) return [];
  const changes = db
    .select({
      setupId: setupChanges.setupId,
      at: setupChanges.at,
      byName: changedBy.name,
      fromState: setupChanges.fromState,
      toState: setupChanges.toState,
      note: setupChanges.note,
    })
    .from(setupChanges)
    .innerJoin(changedBy, eq(changedBy.id, setupChanges.byUser))
    .where(
      inArray(
        setupChanges.setupId,
        rows.map((r) => r.id),
      ),
    )
    .orderBy(asc(setupChanges.at))
    .all();
  return rows.map((r) => ({
    ...r,
    changes: changes.filter((c) => c.setupId === r.id).map(({ setupId: _, ...c }) => c),
  }));
}

/**
 * Set-ups by ride, site or event, oldest build-up first. `scope` (an operator's company) keeps to that
 * company's rides: at a shared site an operator never sees another operator's rides.
 */
export function listSetups(
  db: Pick<Db, 'select'>,
  query: { rideId?: string; siteId?: string; eventId?: string },
  scope: string | null,
): Setup[] {
  return setupRows(
    db,
    and(
      query.rideId ? eq(setups.rideId, query.rideId) : undefined,
      query.siteId ? eq(setups.siteId, query.siteId) : undefined,
      query.eventId ? eq(setups.eventId, query.eventId) : undefined,
      scope === null ? undefined : eq(rides.operatorCompanyId, scope),
    ),
  );
}

/** A ride's set-ups with their state changes and who made them (for the ride's logbook). */
export function setupsOfRide(db: Pick<Db, 'select'>, rideId: string): Setup[] {
  return setupRows(db, eq(setups.rideId, rideId));
}

function mustFindSetup(db: Pick<Db, 'select'>, id: string): Setup {
  const [found] = setupRows(db, eq(setups.id, id));
  if (!found) throw notFound('No such set-up.');
  return found;
}

function siteToday(db: Pick<Db, 'select'>, zone: string | null, now: Date) {
  return dayInZone(now, resolveZone(zone, defaultTimeZone(db)));
}

function assertInsideEvent(tx: Pick<Db, 'select'>, input: SetupInput) {
  if (!input.eventId) return;
  const event = tx.select().from(siteEvents).where(eq(siteEvents.id, input.eventId)).get();
  if (!event) throw invalid('eventId', 'No such event');
  if (event.siteId !== input.siteId) throw invalid('eventId', 'The event is at another site');
  if (input.fromDate < event.fromDate || input.toDate > event.toDate)
    throw invalid('fromDate', `The event runs from ${event.fromDate} to ${event.toDate}`);
}

/** A ride stands at one place at a time: its set-ups' days never overlap (a pulled-down one has left). */
function assertNoOverlap(tx: Pick<Db, 'select'>, rideId: string, from: string, to: string) {
  const clash = tx
    .select({ fromDate: setups.fromDate, toDate: setups.toDate, siteName: sites.name })
    .from(setups)
    .innerJoin(sites, eq(sites.id, setups.siteId))
    .where(
      and(
        eq(setups.rideId, rideId),
        ne(setups.state, 'pulled_down'),
        lte(setups.fromDate, to),
        gte(setups.toDate, from),
      ),
    )
    .get();
  if (clash)
    throw conflict(
      `The ride is set up at ${clash.siteName} from ${clash.fromDate} to ${clash.toDate}; set-ups of a ride ` +
        'may not overlap.',
      'setup_overlaps',
    );
}

export function createSetup(db: Db, user: SessionUser, input: SetupInput, now: Date, appUrl: string): Setup {
  return db.transaction((tx) => {
    const ride = mustFindRide(tx, input.rideId);
    const site = findSite(tx, input.siteId);
    if (!site) throw invalid('siteId', 'No such site');
    assertInsideEvent(tx, input);
    assertNoOverlap(tx, input.rideId, input.fromDate, input.toDate);
    const at = now.toISOString();
    const { id } = tx
      .insert(setups)
      .values({
        rideId: input.rideId,
        siteId: input.siteId,
        eventId: input.eventId ?? null,
        fromDate: input.fromDate,
        toDate: input.toDate,
        pitch: input.pitch ?? null,
        state: 'planned',
        createdBy: user.id,
        createdAt: at,
      })
      .returning({ id: setups.id })
      .get();
    recordSetupChange(tx, { setupId: id, userId: user.id, from: null, to: 'planned', now });
    recordAudit(tx, {
      userId: user.id,
      entity: 'setup',
      entityId: id,
      action: 'create',
      rideId: ride.id,
      summary: `${ride.name}: set-up at ${site.name} from ${input.fromDate} to ${input.toDate} planned`,
      after: mustFindSetup(tx, id),
    });
    bookSetupInspection(db, tx, user.id, ride.id, now, input.assignedTo);
    // A build-up whose day has come on the site's clock is under way: the ride stops there now.
    if (input.fromDate <= siteToday(tx, site.timeZone, now)) startSetup(db, tx, user, id, null, now, appUrl);
    refreshQueue(tx, queueDay(db, now), [ride.id]);
    return mustFindSetup(tx, id);
  });
}

function moveState(tx: Tx, user: SessionUser, setup: Setup, to: SetupState, note: string | null, now: Date) {
  tx.update(setups).set({ state: to }).where(eq(setups.id, setup.id)).run();
  recordSetupChange(tx, { setupId: setup.id, userId: user.id, from: setup.state, to, note, now });
  recordAudit(tx, {
    userId: user.id,
    entity: 'setup',
    entityId: setup.id,
    action: 'update',
    rideId: setup.rideId,
    summary: `${setup.rideName}: set-up at ${setup.siteName} ${to.replace('_', ' ')}`,
    before: { state: setup.state },
    after: { state: to, note },
  });
}

/** The ride's place follows its set-up (null: in store between set-ups). */
function moveRide(tx: Tx, userId: string, rideId: string, siteId: string | null) {
  const before = mustFindRide(tx, rideId);
  if (before.siteId === siteId) return;
  tx.update(rides).set({ siteId }).where(eq(rides.id, rideId)).run();
  const after = mustFindRide(tx, rideId);
  recordAudit(tx, {
    userId,
    entity: 'ride',
    entityId: rideId,
    action: 'update',
    rideId,
    summary: `Ride ${after.name} moved to ${after.siteName ?? 'store'} (set-up)`,
    before,
    after,
  });
}

/**
 * Built at the site: earlier set-ups still standing are pulled down, the ride's site becomes this one and
 * the ride is out of service until its set-up inspection is approved (the status rules' `setup_started`,
 * with its notice). A ride already out of service stays so, for its own cause.
 */
function startSetup(
  db: Db,
  tx: Tx,
  user: SessionUser,
  setupId: string,
  note: string | null,
  now: Date,
  appUrl: string,
) {
  const setup = mustFindSetup(tx, setupId);
  for (const standing of setupRows(
    tx,
    and(
      eq(setups.rideId, setup.rideId),
      inArray(setups.state, ['set_up', 'cleared']),
      ne(setups.id, setupId),
    ),
  ))
    moveState(tx, user, standing, 'pulled_down', `Moved on to ${setup.siteName}`, now);
  moveState(tx, user, setup, 'set_up', note, now);
  moveRide(tx, user.id, setup.rideId, setup.siteId);
  const ride = mustFindRide(tx, setup.rideId);
  const reason = setupPendingWords(setup.siteName);
  const check = checkTransition(ride.status, 'setup_started', user.role, { reason });
  if (!check.ok) return;
  applyStatus(tx, {
    userId: user.id,
    rideId: ride.id,
    event: 'setup_started',
    to: check.to,
    override: false,
    reason,
    now,
  });
  issueStatusNotice(tx, { rideId: ride.id, userId: user.id, now, appUrl, reason });
}

/** `POST /setups/:id/state`: built (planned → set up) or pulled down. */
export function changeSetupState(
  db: Db,
  user: SessionUser,
  id: string,
  input: SetupStateInput,
  now: Date,
  appUrl: string,
): Setup {
  return db.transaction((tx) => {
    const setup = mustFindSetup(tx, id);
    if (input.state === 'set_up') {
      if (setup.state !== 'planned')
        throw conflict(`This set-up is already ${setup.state.replace('_', ' ')}.`, 'setup_state');
      startSetup(db, tx, user, id, input.note ?? null, now, appUrl);
    } else {
      if (setup.state === 'pulled_down') throw conflict('This set-up is already pulled down.', 'setup_state');
      moveState(tx, user, setup, 'pulled_down', input.note ?? null, now);
      const ride = mustFindRide(tx, setup.rideId);
      if (ride.siteId === setup.siteId && setup.state !== 'planned') moveRide(tx, user.id, ride.id, null);
      bookSetupInspection(db, tx, user.id, setup.rideId, now);
    }
    refreshQueue(tx, queueDay(db, now), [setup.rideId]);
    return mustFindSetup(tx, id);
  });
}
