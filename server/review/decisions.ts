/**
 * A supervisor's decision on a submitted inspection: approve it, or return it to the inspector with a
 * comment (the phone shows it after its next sync). Approving also records the inspection as done on the
 * ride's schedule of that type, so the next due date moves. The decision, the schedule change, their
 * audit entries and the ride's queue rows are one transaction.
 */
import { and, eq } from 'drizzle-orm';
import type { z } from 'zod';

import { inspections } from '@/db/server/inspections';
import { inspectionSchedules } from '@/db/server/schema';
import type { SessionUser } from '@/features/auth/schema';
import type { decisionInputSchema, DecisionResponse } from '@/features/review/schema';
import type { Db } from '@/server/db';
import { conflict } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { dateOf, updateSchedule } from '@/server/registry/schedules';
import { mustSeeInspection, type InspectionHead } from '@/server/review/findings';
import { issueInspectionNotice } from '@/server/notices/issue';
import { queueDay, refreshQueue } from '@/server/review/queue-refresh';

type DecisionInput = z.output<typeof decisionInputSchema>;

const stateOf = (i: InspectionHead) => ({
  reviewState: i.reviewState,
  reviewedAt: i.reviewedAt,
  reviewedByName: i.reviewedByName,
  reviewNote: i.reviewNote,
});

const pastTense = { approved: 'approved', returned: 'returned' } as const;

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

    const reviewState = input.decision === 'approve' ? 'approved' : 'returned';
    tx.update(inspections)
      .set({ reviewState, reviewedAt: now.toISOString(), reviewedBy: user.id, reviewNote: input.note })
      .where(eq(inspections.id, before.id))
      .run();
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

    if (reviewState === 'approved') {
      const doneOn = dateOf(new Date(before.submittedAt));
      const schedule = tx
        .select({ id: inspectionSchedules.id, lastDoneOn: inspectionSchedules.lastDoneOn })
        .from(inspectionSchedules)
        .where(
          and(
            eq(inspectionSchedules.rideId, before.rideId),
            eq(inspectionSchedules.inspectionType, before.type),
          ),
        )
        .get();
      // The registry's own update: the due date moves the same way, and the audit log records it. `db`,
      // not `tx`: on this one connection it runs as a savepoint inside this transaction.
      if (schedule && (schedule.lastDoneOn === null || doneOn > schedule.lastDoneOn))
        updateSchedule(db, user.id, schedule.id, { lastDoneOn: doneOn }, now);
    }

    // Approving an inspection with findings issues the operator's notice, frozen as of now.
    const notice =
      reviewState === 'approved'
        ? issueInspectionNotice(tx, { inspectionId: before.id, userId: user.id, now, appUrl })
        : null;

    refreshQueue(tx, queueDay(db, now), [before.rideId]);
    return {
      notice: notice ? { id: notice.id, reference: notice.reference } : null,
      inspectionId: after.id,
      reviewState: after.reviewState,
      reviewedAt: after.reviewedAt ?? now.toISOString(),
      reviewedByName: after.reviewedByName,
      reviewNote: after.reviewNote,
    };
  });
}
