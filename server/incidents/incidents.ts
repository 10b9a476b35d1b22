/**
 * Operators' incident reports (issue #19): someone hurt or something damaged, a near miss, an unplanned
 * stop. The ride's operator reports; the report may take the ride out of service (the status rules' own
 * `incident_stop`, the report as the reason), which asks the inspection body for the follow-up inspection
 * (`ensureFollowUp`, the booking every stop makes). The ride then runs again only by the status rules'
 * ways back: an approved follow-up or a supervisor's override. Reports not yet reviewed are review-queue
 * items; a supervisor or administrator closes one with a note.
 *
 * Scope: an operator sees and reports only on their company's rides (anything else answers the same 404
 * as a missing record); the inspection body's staff see all. Every write is one transaction with its
 * audit entries and the ride's queue rows.
 *
 * No notice is issued for an operator's own stop: a notice is the inspection body's signed word to the
 * operator, and here the operator is the one speaking; the inspection body hears it through the queue.
 */
import { and, desc, eq, isNull } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { incidents } from '@/db/server/incidents';
import { inspectionSchedules, users } from '@/db/server/schema';
import {
  incidentKindVocabulary,
  incidentSummary,
  type Incident,
  type IncidentCreated,
  type IncidentInputParsed,
  type IncidentKind,
  type RideIncidentsResponse,
} from '@/features/incidents/schema';
import type { SessionUser } from '@/features/session/schema';
import { instantOfLocalStamp, localStampInZone } from '@/lib/dates';
import { companyScope } from '@/server/auth/scope';
import type { Db } from '@/server/db';
import { conflict, forbidden, HttpError, notFound } from '@/server/http/errors';
import { assertPhotosUploaded } from '@/server/notices/corrective-action';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { recordAudit } from '@/server/registry/audit';
import { mustFindRide } from '@/server/registry/rides';
import { applyStatus, ensureFollowUp, mustTransition } from '@/server/review/ride-status';
import { rideTimeZone } from '@/server/schedule-due';

type Reader = Pick<Db, 'select'>;

/** A phone's clock may run a little ahead of the server's; a time further ahead than this is refused. */
const FUTURE_SLACK_MS = 5 * 60 * 1000;

/** Reports a ride's list answers at most (newest first). */
export const RIDE_INCIDENTS_LIMIT = 200;

const reporter = alias(users, 'reporter');
const reviewer = alias(users, 'reviewer');

function selectIncidents(db: Reader) {
  return db
    .select({
      row: incidents,
      reportedByName: reporter.name,
      reviewedByName: reviewer.name,
    })
    .from(incidents)
    .innerJoin(reporter, eq(reporter.id, incidents.reportedBy))
    .leftJoin(reviewer, eq(reviewer.id, incidents.reviewedBy));
}

type Selected = {
  row: typeof incidents.$inferSelect;
  reportedByName: string;
  reviewedByName: string | null;
};

const toIncident = (rideName: string, s: Selected): Incident => ({
  id: s.row.id,
  rideId: s.row.rideId,
  rideName,
  kind: s.row.kind,
  occurredAt: s.row.occurredAt,
  timeZone: s.row.timeZone,
  what: s.row.what,
  ridersAffected: s.row.ridersAffected,
  anyoneHurt: s.row.anyoneHurt,
  stoppedAt: s.row.stoppedAt,
  runningAgainAt: s.row.runningAgainAt,
  photoShas: s.row.photoShas,
  stoppedRide: s.row.stoppedRide,
  reportedBy: s.row.reportedBy,
  reportedByName: s.reportedByName,
  reportedAt: s.row.reportedAt,
  reviewedAt: s.row.reviewedAt,
  reviewedByName: s.reviewedByName,
  reviewNote: s.row.reviewNote,
});

/** A ride's reports, newest first, as the ride's list shows them; `user` must be allowed the ride. */
export function rideIncidents(db: Reader, user: SessionUser, rideId: string): RideIncidentsResponse {
  const ride = mustFindRide(db, rideId, companyScope(user));
  const rows = selectIncidents(db)
    .where(eq(incidents.rideId, ride.id))
    .orderBy(desc(incidents.occurredAt), desc(incidents.reportedAt))
    .limit(RIDE_INCIDENTS_LIMIT)
    .all();
  return {
    rideId: ride.id,
    rideName: ride.name,
    rideStatus: ride.status,
    timeZone: rideTimeZone(db, ride.id),
    incidents: rows.map((r) => toIncident(ride.name, r)),
  };
}

/** A ride's report in a logbook's terms: when, what kind, one line of what happened. */
export type IncidentLogRow = {
  id: string;
  occurredAt: string;
  timeZone: string;
  kind: IncidentKind;
  kindLabel: string;
  summary: string;
  anyoneHurt: boolean;
  stoppedRide: boolean;
  reviewed: boolean;
};

/**
 * A ride's reports for a logbook or any other history of the ride, newest first. No scope: the caller
 * has checked the reader may see the ride.
 */
export function listIncidentsForRide(
  db: Reader,
  rideId: string,
  limit = RIDE_INCIDENTS_LIMIT,
): IncidentLogRow[] {
  return db
    .select({
      id: incidents.id,
      occurredAt: incidents.occurredAt,
      timeZone: incidents.timeZone,
      kind: incidents.kind,
      what: incidents.what,
      anyoneHurt: incidents.anyoneHurt,
      stoppedRide: incidents.stoppedRide,
      reviewedAt: incidents.reviewedAt,
    })
    .from(incidents)
    .where(eq(incidents.rideId, rideId))
    .orderBy(desc(incidents.occurredAt), desc(incidents.reportedAt))
    .limit(limit)
    .all()
    .map((r) => ({
      id: r.id,
      occurredAt: r.occurredAt,
      timeZone: r.timeZone,
      kind: r.kind,
      kindLabel: incidentKindVocabulary[r.kind].label,
      summary: incidentSummary(r.what),
      anyoneHurt: r.anyoneHurt,
      stoppedRide: r.stoppedRide,
      reviewed: r.reviewedAt !== null,
    }));
}

/** One report, if `user` may see it (an operator: their company's rides only; else 404). */
export function mustSeeIncident(db: Reader, user: SessionUser, id: string): Incident {
  const found = selectIncidents(db).where(eq(incidents.id, id)).get();
  if (!found) throw notFound('No such incident report.');
  const scope = companyScope(user);
  let rideName: string;
  try {
    rideName = mustFindRide(db, found.row.rideId, scope).name;
  } catch {
    throw notFound('No such incident report.');
  }
  return toIncident(rideName, found);
}

const fieldError = (path: string, message: string) =>
  new HttpError(400, 'validation_failed', message, [{ path, message }]);

/** The typed site-clock stamps as instants; none may lie in the future. */
function instantsOf(input: IncidentInputParsed, zone: string, now: Date) {
  const latest = now.getTime() + FUTURE_SLACK_MS;
  const at = (path: 'occurredAt' | 'stoppedAt' | 'runningAgainAt', stamp: string | undefined) => {
    if (stamp === undefined) return null;
    const instant = instantOfLocalStamp(stamp, zone);
    if (instant.getTime() > latest)
      throw fieldError(
        path,
        `Cannot be in the future: it is ${localStampInZone(now, zone).replace('T', ' ')} now on the site’s clock (${zone}).`,
      );
    return instant.toISOString();
  };
  return {
    occurredAt: at('occurredAt', input.occurredAt)!,
    stoppedAt: at('stoppedAt', input.stoppedAt),
    runningAgainAt: at('runningAgainAt', input.runningAgainAt),
  };
}

/** Whether the ride's follow-up inspection is booked (a due date on its follow-up schedule). */
function followUpBooked(db: Reader, rideId: string): boolean {
  const row = db
    .select({ dueOn: inspectionSchedules.dueOn })
    .from(inspectionSchedules)
    .where(and(eq(inspectionSchedules.rideId, rideId), eq(inspectionSchedules.inspectionType, 'follow_up')))
    .get();
  return !!row?.dueOn;
}

/**
 * `POST /api/rides/:id/incidents`: the operator's report, and with `stopRide` the ride out of service and
 * its follow-up booked, all in one transaction. Bad input or a refused stop stores nothing.
 */
export function createIncident(
  db: Db,
  user: SessionUser,
  rideId: string,
  input: IncidentInputParsed,
  now: Date,
): IncidentCreated {
  if (user.role !== 'operator')
    throw forbidden('Incident reports are made by the ride’s operator; staff see them on the review desk.');
  return db.transaction((tx) => {
    const ride = mustFindRide(tx, rideId, companyScope(user));
    const zone = rideTimeZone(tx, ride.id);
    const times = instantsOf(input, zone, now);
    assertPhotosUploaded(tx, input.photoShas, user);
    const kindLabel = incidentKindVocabulary[input.kind].label;
    const reason = `Incident reported by ${user.name} (${kindLabel}): ${incidentSummary(input.what)}`;
    if (input.stopRide) {
      if (ride.status === 'out_of_service')
        throw conflict(
          'The ride is already out of service. Send the report without stopping the ride; the inspection ' +
            'body has it in its queue.',
          'no_change',
        );
      mustTransition(ride.status, 'incident_stop', user.role, { reason });
    }
    const at = now.toISOString();
    const row = tx
      .insert(incidents)
      .values({
        rideId: ride.id,
        kind: input.kind,
        ...times,
        timeZone: zone,
        what: input.what,
        ridersAffected: input.ridersAffected,
        anyoneHurt: input.anyoneHurt,
        photoShas: input.photoShas,
        stoppedRide: input.stopRide,
        reportedBy: user.id,
        reportedAt: at,
      })
      .returning()
      .get();
    recordAudit(tx, {
      userId: user.id,
      entity: 'incident',
      entityId: row.id,
      action: 'create',
      rideId: ride.id,
      summary: `${ride.name}: incident reported (${kindLabel})${input.stopRide ? ', ride stopped' : ''}`,
      after: row,
    });
    if (input.stopRide) {
      applyStatus(tx, {
        userId: user.id,
        rideId: ride.id,
        event: 'incident_stop',
        to: 'out_of_service',
        override: false,
        reason,
        now,
      });
      ensureFollowUp(db, tx, user.id, ride.id, now);
    }
    refreshQueue(tx, queueDay(db, now), [ride.id]);
    return {
      incident: mustSeeIncident(tx, user, row.id),
      rideStatus: mustFindRide(tx, ride.id).status,
      followUpBooked: input.stopRide && followUpBooked(tx, ride.id),
    };
  });
}

/** `POST /api/incidents/:id/review`: a supervisor or administrator closes the report with a note. */
export function reviewIncident(db: Db, user: SessionUser, id: string, note: string, now: Date): Incident {
  return db.transaction((tx) => {
    const before = mustSeeIncident(tx, user, id);
    if (before.reviewedAt)
      throw conflict(
        `This report was already reviewed by ${before.reviewedByName ?? 'someone'}.`,
        'already_reviewed',
      );
    tx.update(incidents)
      .set({ reviewedAt: now.toISOString(), reviewedBy: user.id, reviewNote: note })
      .where(and(eq(incidents.id, id), isNull(incidents.reviewedAt)))
      .run();
    const after = mustSeeIncident(tx, user, id);
    recordAudit(tx, {
      userId: user.id,
      entity: 'incident',
      entityId: id,
      action: 'update',
      rideId: before.rideId,
      summary: `${before.rideName}: incident report reviewed`,
      before: { reviewedAt: null, reviewNote: null },
      after: { reviewedAt: after.reviewedAt, reviewedBy: user.id, reviewNote: note },
    });
    refreshQueue(tx, queueDay(db, now), [before.rideId]);
    return after;
  });
}
