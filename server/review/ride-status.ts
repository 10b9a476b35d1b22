/**
 * Every change of a ride's operating status goes through here, under the rules of
 * `features/review/status-rules.ts`: a decision's stop, a standalone change or override, an approved
 * follow-up, a reopened finding, the register's PATCH. Each change updates the ride, writes its audit entry
 * and a `ride_status_changes` row in the caller's transaction; the caller issues the one notice.
 *
 * A stopped or restricted ride with no finding left open that forbids operation is owed a follow-up
 * inspection: `ensureFollowUp` books it on the ride's follow-up schedule, due today and assigned to an
 * inspector, so it shows on that inspector's Today after their next sync.
 */
import { and, count, desc, eq, inArray, isNull, ne } from 'drizzle-orm';
import type { z } from 'zod';

import { inspections } from '@/db/server/inspections';
import { findings, rideStatusChanges } from '@/db/server/review';
import { inspectionSchedules, rides, users } from '@/db/server/schema';
import type { Role, SessionUser } from '@/features/session/schema';
import { type FindingSeverity, type rideStatusChangeInputSchema } from '@/features/review/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import {
  checkTransition,
  eases,
  eventForStatus,
  type RideStatus,
  type RideStatusEvent,
  type TransitionFacts,
  type TransitionProblem,
} from '@/features/rides/status-rules';
import type { Db } from '@/server/db';
import { conflict, HttpError } from '@/server/http/errors';
import { issueStatusNotice, type NoticeTx } from '@/server/notices/issue';
import { recordAudit } from '@/server/registry/audit';
import { mustFindRide } from '@/server/registry/rides';
import { createSchedule, updateSchedule } from '@/server/registry/schedules';
import { isoDay } from '@/lib/dates';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { stoppedForSetup } from '@/server/review/setup-clearance';

type Tx = NoticeTx & Pick<Db, 'delete'>;

export const blockingSeverities = (Object.keys(severityInfo) as FindingSeverity[]).filter(
  (s) => !severityInfo[s].mayOperate,
);

/**
 * Findings of the ride, not closed, that forbid operation, on inspections already approved (a finding on
 * an inspection still under review is not issued yet); `exceptId` leaves one out.
 */
export function openBlockingFindings(tx: Pick<Db, 'select'>, rideId: string, exceptId?: string): number {
  return (
    tx
      .select({ n: count() })
      .from(findings)
      .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
      .where(
        and(
          eq(findings.rideId, rideId),
          exceptId ? ne(findings.id, exceptId) : undefined,
          ne(findings.state, 'closed'),
          inArray(findings.severity, blockingSeverities),
          eq(inspections.reviewState, 'approved'),
        ),
      )
      .get()?.n ?? 0
  );
}

/** A refused transition as the API answers it: 403 for the wrong role, 400 naming missing fields. */
function transitionError(problems: TransitionProblem[], pathPrefix = ''): HttpError {
  const notAllowed = problems.find((p) => p.code === 'not_allowed');
  if (notAllowed) return new HttpError(403, 'forbidden', notAllowed.message);
  const fieldless = problems.find((p) => !p.path);
  if (fieldless) return conflict(problems.map((p) => p.message).join(' '), fieldless.code);
  return new HttpError(
    400,
    'validation_failed',
    problems.map((p) => p.message).join(' '),
    problems.map((p) => ({ path: `${pathPrefix}${p.path}`, message: p.message })),
  );
}

/** Checks the rules; throws the API's error when they refuse. */
export function mustTransition(
  from: RideStatus,
  event: RideStatusEvent,
  role: Role,
  facts: TransitionFacts,
  pathPrefix = '',
) {
  const check = checkTransition(from, event, role, facts);
  if (!check.ok) throw transitionError(check.problems, pathPrefix);
  return check;
}

export type AppliedChange = { from: RideStatus; to: RideStatus; event: RideStatusEvent; override: boolean };

/** One change of a ride's status, as the rules record it; the inspection or finding that made it, if any. */
type StatusChange = {
  userId: string;
  rideId: string;
  event: RideStatusEvent;
  from: RideStatus;
  to: RideStatus;
  override: boolean;
  reason: string | null;
  now: Date;
  inspectionId?: string | null;
  findingId?: string | null;
};

/**
 * Sets the ride's status (checked by the caller), with its audit entry and its `ride_status_changes` row.
 * In service carries no reason.
 */
export function applyStatus(tx: Tx, input: Omit<StatusChange, 'from'>): AppliedChange {
  const before = mustFindRide(tx, input.rideId);
  const at = input.now.toISOString();
  tx.update(rides)
    .set({
      status: input.to,
      statusReason: input.to === 'in_service' ? null : input.reason,
      statusSince: at,
    })
    .where(eq(rides.id, input.rideId))
    .run();
  const after = mustFindRide(tx, input.rideId);
  recordStatusChange(tx, { ...input, from: before.status });
  recordAudit(tx, {
    userId: input.userId,
    entity: 'ride',
    entityId: input.rideId,
    action: 'update',
    rideId: input.rideId,
    summary:
      `Ride ${after.name} changed (status ${before.status} → ${after.status})` +
      (input.override ? ` by override: ${input.reason ?? ''}` : ''),
    before,
    after: { ...after, event: input.event, override: input.override, reason: input.reason },
  });
  return { from: before.status, to: input.to, event: input.event, override: input.override };
}

/** The rules' record of a change (the register's PATCH writes one too). */
function recordStatusChange(tx: Pick<Db, 'insert'>, input: StatusChange) {
  tx.insert(rideStatusChanges)
    .values({
      rideId: input.rideId,
      at: input.now.toISOString(),
      byUser: input.userId,
      event: input.event,
      fromStatus: input.from,
      toStatus: input.to,
      override: input.override,
      reason: input.reason,
      inspectionId: input.inspectionId ?? null,
      findingId: input.findingId ?? null,
    })
    .run();
}

/**
 * The register's PATCH may make a ride stricter (stop, restrict) under the same rules; easing a stop
 * must go through the status change with its reason, where it is recorded as an override.
 */
export function assertPatchTransition(
  tx: Pick<Db, 'select' | 'insert'>,
  userId: string,
  rideId: string,
  from: RideStatus,
  to: RideStatus,
  reason: string | null,
  now: Date,
) {
  const event = eventForStatus(from, to);
  if (!event) return;
  if (eases(from, to))
    throw conflict(
      'A stopped or restricted ride returns to service only through an approved follow-up inspection or a ' +
        'supervisor’s override with a reason (the ride status change on the review desk).',
      'override_required',
    );
  // A missing reason is the register's own 400 (`statusReason`), raised when the ride is written.
  if (!reason) return;
  const role = tx.select({ role: users.role }).from(users).where(eq(users.id, userId)).get()?.role;
  if (!role) throw new HttpError(403, 'forbidden', 'Unknown user.');
  const check = mustTransition(from, event, role, { reason }, '');
  recordStatusChange(tx, { userId, rideId, event, from, to: check.to, override: false, reason, now });
}

/**
 * Books the follow-up inspection a stopped or restricted ride is owed once no finding that forbids
 * operation is open: the ride's follow-up schedule gets a due date (today) and an inspector (the one it
 * had, else the last inspector who inspected the ride). Does nothing while the ride runs, while blocking
 * findings are open, or when a follow-up is already booked. `db` because the schedule's own writes run
 * as a savepoint inside the caller's transaction.
 */
export function ensureFollowUp(db: Db, tx: Pick<Db, 'select'>, userId: string, rideId: string, now: Date) {
  const ride = tx.select({ status: rides.status }).from(rides).where(eq(rides.id, rideId)).get();
  if (!ride || ride.status === 'in_service') return;
  if (openBlockingFindings(tx, rideId) > 0) return;
  // Stopped only for its set-up: the set-up inspection, already booked, is the way back.
  if (stoppedForSetup(tx, rideId)) return;
  const schedule = tx
    .select({
      id: inspectionSchedules.id,
      dueOn: inspectionSchedules.dueOn,
      assignedTo: inspectionSchedules.assignedTo,
    })
    .from(inspectionSchedules)
    .where(and(eq(inspectionSchedules.rideId, rideId), eq(inspectionSchedules.inspectionType, 'follow_up')))
    .get();
  if (schedule?.dueOn && schedule.assignedTo) return;
  const inspector =
    schedule?.assignedTo ??
    tx
      .select({ id: users.id })
      .from(inspections)
      .innerJoin(users, eq(users.id, inspections.inspectorId))
      .where(and(eq(inspections.rideId, rideId), eq(users.role, 'inspector'), isNull(users.disabledAt)))
      .orderBy(desc(inspections.submittedAt))
      .get()?.id ??
    tx
      .select({ id: users.id })
      .from(inspectionSchedules)
      .innerJoin(users, eq(users.id, inspectionSchedules.assignedTo))
      .where(and(eq(inspectionSchedules.rideId, rideId), isNull(users.disabledAt)))
      .get()?.id ??
    null;
  const dueOn = schedule?.dueOn ?? isoDay(now);
  const notes = 'Booked by the status rules: the ride returns to service after this follow-up is approved.';
  if (schedule) updateSchedule(db, userId, schedule.id, { dueOn, assignedTo: inspector }, now);
  else
    createSchedule(
      db,
      userId,
      { rideId, inspectionType: 'follow_up', dueOn, assignedTo: inspector, notes },
      now,
    );
}

/** After an approved follow-up: the schedule's booking is met, so it leaves the inspector's Today. */
export function followUpDone(db: Db, tx: Pick<Db, 'select'>, userId: string, rideId: string, now: Date) {
  const schedule = tx
    .select({ id: inspectionSchedules.id })
    .from(inspectionSchedules)
    .where(and(eq(inspectionSchedules.rideId, rideId), eq(inspectionSchedules.inspectionType, 'follow_up')))
    .get();
  if (schedule) updateSchedule(db, userId, schedule.id, { dueOn: null, assignedTo: null }, now);
}

type StatusChangeInput = z.output<typeof rideStatusChangeInputSchema>;

/**
 * `POST /api/rides/:id/status`: a change of status outside any decision on an inspection — a stop, a
 * restriction, or a supervisor's override back towards service. One transaction, one notice.
 */
export function changeRideStatus(
  db: Db,
  user: SessionUser,
  rideId: string,
  input: StatusChangeInput,
  now: Date,
  appUrl: string,
) {
  return db.transaction((tx) => {
    const ride = mustFindRide(tx, rideId);
    const event = eventForStatus(ride.status, input.status);
    if (!event) throw conflict(`The ride is already ${input.status.replace(/_/g, ' ')}.`, 'no_change');
    const check = mustTransition(ride.status, event, user.role, { reason: input.reason });
    const change = applyStatus(tx, {
      userId: user.id,
      rideId,
      event,
      to: check.to,
      override: check.override,
      reason: input.reason,
      now,
    });
    const why = check.override ? `Override by ${user.name}: ${input.reason}` : input.reason;
    const notice = issueStatusNotice(tx, { rideId, userId: user.id, now, appUrl, reason: why });
    // An override stands in for the follow-up, so its booking is met; a stop books one.
    if (change.to === 'in_service') followUpDone(db, tx, user.id, rideId, now);
    else ensureFollowUp(db, tx, user.id, rideId, now);
    refreshQueue(tx, queueDay(db, now), [rideId]);
    return {
      ride: mustFindRide(tx, rideId),
      change,
      notice: { id: notice.id, reference: notice.reference },
    };
  });
}
