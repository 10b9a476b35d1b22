/**
 * A supervisor's decision on a submitted inspection: approve it, or return it to the inspector with a
 * comment (the phone shows it after its next sync). Approving also records the inspection as done on the
 * ride's schedule of that type, so the next due date moves. The decision may set the ride's status (a
 * stop, a restriction) under the status rules; approving a follow-up inspection returns a stopped ride
 * to service when the rules allow it. The decision, the status change, the schedule change, their audit
 * entries, the ride's queue rows and the decision's ONE notice to the operator are one transaction.
 */
import { and, asc, eq } from 'drizzle-orm';
import type { z } from 'zod';

import { inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import { inspectionSchedules } from '@/db/server/schema';
import type { SessionUser } from '@/features/session/schema';
import { formatEnvelopeItem, measuredSources } from '@/features/loads/format';
import { type decisionInputSchema, type DecisionResponse } from '@/features/review/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import { checkTransition, eventForStatus, type RideStatus } from '@/features/rides/status-rules';
import type { Db } from '@/server/db';
import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import { findingNumber, mustSeeInspection, type InspectionHead } from '@/server/findings/findings';
import { conflict, HttpError } from '@/server/http/errors';
import { appendToLedger } from '@/server/ledger/append';
import { issueInspectionNotice, issueStatusNotice } from '@/server/notices/issue';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { recordAudit } from '@/server/registry/audit';
import { mustFindRide } from '@/server/registry/rides';
import { approvalRefusal } from '@/server/review/self-approval';
import { updateSchedule } from '@/server/registry/schedules';
import {
  applyStatus,
  blockingSeverities,
  ensureFollowUp,
  followUpDone,
  mustTransition,
  openBlockingFindings,
  type AppliedChange,
} from '@/server/review/ride-status';
import { setupInspectionApproved, stoppedForSetup } from '@/server/review/setup-clearance';
import { isoDay } from '@/lib/dates';

type DecisionInput = z.output<typeof decisionInputSchema>;

const stateOf = (i: InspectionHead) => ({
  reviewState: i.reviewState,
  reviewedAt: i.reviewedAt,
  reviewedByName: i.reviewedByName,
  reviewNote: i.reviewNote,
});

const pastTense = { approved: 'approved', returned: 'returned' } as const;

/**
 * What an inspection gives as the cause of a change of status: its findings that forbid operation and
 * its values over their limits, in words for the notice ("finding 7 (Stop now); Pin diameter, pivot 2:
 * 139.05 mm against ≥ 139.0 mm, over limit").
 */
function causesOf(tx: Pick<Db, 'select'>, inspectionId: string) {
  const blocking = tx
    .select({ number: findingNumber, severity: findings.severity, description: findings.description })
    .from(findings)
    .where(eq(findings.inspectionId, inspectionId))
    .orderBy(asc(findings.number))
    .all()
    .filter((f) => blockingSeverities.includes(f.severity));
  const row = tx
    .select({ analysis: inspections.analysis, record: inspections.record })
    .from(inspections)
    .where(eq(inspections.id, inspectionId))
    .get();
  const analysis = row?.analysis;
  const over = (analysis?.envelope ?? []).filter((e) => e.status === 'over');
  // The same strings as the notice's results: typed values as typed, never rounded across the limit.
  const sources = row ? measuredSources(row.record) : new Map();
  const parts = [
    ...blocking.map(
      (f) => `finding ${f.number} (${severityInfo[f.severity].label}): ${f.description.slice(0, 120)}`,
    ),
    ...over.map((e) => {
      const shown = formatEnvelopeItem(e, 'si', sources.get(e.id));
      return `${e.label}: ${shown.value} against ${shown.limit}, over limit`;
    }),
  ];
  return {
    blocking: blocking.length,
    over: over.length,
    text: parts.length ? `Because of ${parts.join('; ')}.` : null,
  };
}

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** A decision is made once, and on the latest version: an amended original waits for its amendment. */
function mustBeUndecided(tx: Tx, before: InspectionHead) {
  // An operator's pre-opening check says whether the ride may open that day; nobody approves it.
  if (before.type === DAILY_CHECK_TYPE)
    throw conflict(
      'This is a daily pre-opening check, not an inspection to decide: a failed check keeps the ride shut ' +
        'until a later daily check passes.',
      'daily_check',
    );
  if (before.reviewState !== 'submitted')
    throw conflict(
      `This inspection was already ${pastTense[before.reviewState]}` +
        `${before.reviewedByName ? ` by ${before.reviewedByName}` : ''}` +
        `${before.reviewedAt ? ` on ${before.reviewedAt.slice(0, 10)}` : ''}; a decision is made once.`,
      'already_decided',
    );
  const amendment = tx
    .select({ id: inspections.id })
    .from(inspections)
    .where(eq(inspections.amendsId, before.id))
    .get();
  if (amendment)
    throw conflict(
      'The inspector has sent an amendment of this inspection; decide on the amendment instead.',
      'amended',
    );
}

/**
 * The day an inspection counts as done: the phone's submission day, unless the server received it earlier
 * than that (a phone clock running ahead, or a record stored before ingest refused future times) — the
 * schedule never moves on a time only the phone vouches for.
 */
function doneOnOf(tx: Tx, before: InspectionHead): string {
  const row = tx
    .select({ receivedAt: inspections.receivedAt })
    .from(inspections)
    .where(eq(inspections.id, before.id))
    .get();
  const submitted = Date.parse(before.submittedAt);
  const received = row ? Date.parse(row.receivedAt) : Number.NaN;
  return isoDay(Number.isNaN(received) || submitted <= received ? submitted : received);
}

/** An approval records the inspection as done on the ride's schedule of its type. */
function recordDoneOnSchedule(db: Db, tx: Tx, user: SessionUser, before: InspectionHead, now: Date) {
  const doneOn = doneOnOf(tx, before);
  const schedule = tx
    .select({ id: inspectionSchedules.id, lastDoneOn: inspectionSchedules.lastDoneOn })
    .from(inspectionSchedules)
    .where(
      and(eq(inspectionSchedules.rideId, before.rideId), eq(inspectionSchedules.inspectionType, before.type)),
    )
    .get();
  // The registry's own update: the due date moves the same way, and the audit log records it. `db`,
  // not `tx`: on this one connection it runs as a savepoint inside this transaction.
  if (schedule && (schedule.lastDoneOn === null || doneOn > schedule.lastDoneOn))
    updateSchedule(db, user.id, schedule.id, { lastDoneOn: doneOn }, now);
}

/**
 * The ride's status, under the rules: the status the decision asks for, else (an approved follow-up on a
 * ride not in service) the way back to service when nothing still forbids operation.
 */
function decidedStatus(
  tx: Tx,
  user: SessionUser,
  before: InspectionHead,
  ride: { status: RideStatus },
  d: { input: DecisionInput; reviewState: 'approved' | 'returned'; analysisOver: number; now: Date },
): AppliedChange | null {
  const { input, reviewState, analysisOver, now } = d;
  let change: AppliedChange | null = null;
  const asked = input.rideStatus;
  const askedEvent = asked ? eventForStatus(ride.status, asked.status) : null;
  if (asked && askedEvent) {
    const check = mustTransition(ride.status, askedEvent, user.role, { reason: asked.reason }, 'rideStatus.');
    change = applyStatus(tx, {
      userId: user.id,
      rideId: before.rideId,
      event: askedEvent,
      to: check.to,
      override: check.override,
      reason: check.override ? `Override by ${user.name}: ${asked.reason}` : asked.reason,
      now,
      inspectionId: before.id,
    });
  } else if (
    !asked &&
    reviewState === 'approved' &&
    before.type === 'follow_up' &&
    ride.status !== 'in_service'
  ) {
    // The follow-up path back to service: only when nothing still forbids operation.
    const check = checkTransition(ride.status, 'follow_up_approved', user.role, {
      inspectionType: before.type,
      openBlockingFindings: openBlockingFindings(tx, before.rideId),
      overLimitValues: analysisOver,
    });
    if (check.ok)
      change = applyStatus(tx, {
        userId: user.id,
        rideId: before.rideId,
        event: 'follow_up_approved',
        to: check.to,
        override: false,
        reason: null,
        now,
        inspectionId: before.id,
      });
  } else if (
    !asked &&
    reviewState === 'approved' &&
    before.type === 'setup_after_assembly' &&
    ride.status !== 'in_service'
  ) {
    // The set-up's path back to service: only when the set-up alone stopped it and nothing forbids operation.
    const check = checkTransition(ride.status, 'setup_approved', user.role, {
      inspectionType: before.type,
      stoppedForSetup: stoppedForSetup(tx, before.rideId),
      openBlockingFindings: openBlockingFindings(tx, before.rideId),
      overLimitValues: analysisOver,
    });
    if (check.ok)
      change = applyStatus(tx, {
        userId: user.id,
        rideId: before.rideId,
        event: 'setup_approved',
        to: check.to,
        override: false,
        reason: null,
        now,
        inspectionId: before.id,
      });
  }
  return change;
}

/**
 * An approval never leaves a ride running on what this inspection found: a finding that forbids
 * operation needs it out of service, a value over its limit at least restricted.
 */
function assertApprovalStops(
  reviewState: 'approved' | 'returned',
  causes: { blocking: number; over: number },
  statusAfter: RideStatus,
) {
  const analysisOver = causes.over;
  if (reviewState === 'approved' && causes.blocking > 0 && statusAfter !== 'out_of_service')
    throw conflict(
      `${causes.blocking} finding(s) of this inspection forbid operation, so approving it sets the ride ` +
        'out of service: send the decision with the ride status out of service and a reason.',
      'stop_required',
    );
  if (reviewState === 'approved' && analysisOver > 0 && statusAfter === 'in_service')
    throw conflict(
      `${analysisOver} value(s) of this inspection are over their limits, so approving it needs the ride ` +
        'out of service or restricted (with a reason); return it if the values are wrong.',
      'stop_required',
    );
}

/** The decision's one notice: an approval's inspection notice, or a return's status notice if it stopped. */
function decisionNotice(
  tx: Tx,
  user: SessionUser,
  before: InspectionHead,
  d: {
    reviewState: 'approved' | 'returned';
    change: AppliedChange | null;
    statusCause: string | null;
    reason: string | null;
    now: Date;
    appUrl: string;
  },
) {
  const { reviewState, change, statusCause, now, appUrl } = d;
  return reviewState === 'approved'
    ? issueInspectionNotice(tx, {
        inspectionId: before.id,
        userId: user.id,
        now,
        appUrl,
        statusChanged: change !== null,
        statusCause,
      })
    : change
      ? issueStatusNotice(tx, {
          rideId: before.rideId,
          userId: user.id,
          now,
          appUrl,
          reason: d.reason,
          inspectionId: before.id,
          statusCause,
        })
      : null;
}

export function decideInspection(
  db: Db,
  user: SessionUser,
  inspectionId: string,
  input: DecisionInput,
  now: Date,
  /** The app's public address, for the link in the operator's notice. */
  appUrl: string,
): DecisionResponse {
  return db.transaction((tx) => {
    const before = mustSeeInspection(tx, user, inspectionId);
    mustBeUndecided(tx, before);
    const refusal = input.decision === 'approve' ? approvalRefusal(tx, user, before.inspectorId) : null;
    if (refusal) throw new HttpError(403, 'own_inspection', refusal);

    const reviewState = input.decision === 'approve' ? 'approved' : 'returned';
    const ride = mustFindRide(tx, before.rideId);
    const causes = causesOf(tx, before.id);
    const analysisOver = causes.over;
    tx.update(inspections)
      .set({ reviewState, reviewedAt: now.toISOString(), reviewedBy: user.id, reviewNote: input.note })
      .where(eq(inspections.id, before.id))
      .run();
    appendToLedger(tx, { kind: 'decision', refId: before.id }, now);
    const after = mustSeeInspection(tx, user, before.id);
    recordAudit(tx, {
      userId: user.id,
      entity: 'inspection',
      entityId: before.id,
      action: 'update',
      rideId: before.rideId,
      summary:
        reviewState === 'approved'
          ? `${before.rideName}: inspection approved`
          : `${before.rideName}: inspection returned to ${before.inspectorName}`,
      before: stateOf(before),
      after: stateOf(after),
    });

    if (reviewState === 'approved') recordDoneOnSchedule(db, tx, user, before, now);

    const change = decidedStatus(tx, user, before, ride, { input, reviewState, analysisOver, now });
    const statusAfter = change?.to ?? ride.status;
    assertApprovalStops(reviewState, causes, statusAfter);
    // After the status: whether the set-up alone stopped the ride is read from the set-up still built.
    if (reviewState === 'approved' && before.type === 'setup_after_assembly')
      setupInspectionApproved(
        db,
        tx,
        user.id,
        before.rideId,
        causes.blocking === 0 && analysisOver === 0,
        now,
      );
    if (change?.to === 'in_service') followUpDone(db, tx, user.id, before.rideId, now);
    else if (statusAfter !== 'in_service') ensureFollowUp(db, tx, user.id, before.rideId, now);

    const statusCause = change && change.to !== 'in_service' ? causes.text : null;
    const reason = input.rideStatus?.reason ?? null;
    const notice = decisionNotice(tx, user, before, {
      reviewState,
      change,
      statusCause,
      reason,
      now,
      appUrl,
    });

    refreshQueue(tx, queueDay(db, now), [before.rideId]);
    const rideAfter = mustFindRide(tx, before.rideId);
    return {
      notice: notice ? { id: notice.id, reference: notice.reference } : null,
      inspectionId: after.id,
      reviewState: after.reviewState,
      reviewedAt: after.reviewedAt ?? now.toISOString(),
      reviewedByName: after.reviewedByName,
      reviewNote: after.reviewNote,
      ride: { status: rideAfter.status, statusReason: rideAfter.statusReason, changed: change !== null },
    };
  });
}
