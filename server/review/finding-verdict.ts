/**
 * The inspection body's verification of a finding after its notice: closed (verified corrected) or open
 * again, under the status rules (`features/rides/status-rules.ts`). Closing needs the verifier's note and
 * evidence and never changes the ride's status: closing the last finding that forbids operation on a
 * stopped ride books its follow-up inspection, and only that inspection's approval (or a supervisor's
 * override) puts the ride back in service. Reopening such a finding stops a ride in service, with one
 * status notice. Every change is one transaction with its audit entries and the ride's review-queue rows.
 */
import { eq } from 'drizzle-orm';
import type { z } from 'zod';

import { findings } from '@/db/server/review';
import type { SessionUser } from '@/features/session/schema';
import type { findingCloseInputSchema, FindingStateResponse } from '@/features/notices/schema';
import { type FindingSeverity } from '@/features/review/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import type { Db } from '@/server/db';
import { conflict } from '@/server/http/errors';
import { appendToLedger } from '@/server/ledger/append';
import {
  assertPhotosUploaded,
  findingNow,
  mustSeeFinding,
  recordStateChange,
  rideNow,
  type FindingHead,
} from '@/server/notices/corrective-action';
import { issueStatusNotice } from '@/server/notices/issue';
import { actionsOf } from '@/server/notices/read';
import { queueToday, refreshQueue } from '@/server/queue/queue-refresh';
import { applyStatus, ensureFollowUp, mustTransition } from '@/server/review/ride-status';

const forbidsOperation = (severity: FindingSeverity) => !severityInfo[severity].mayOperate;

function mustBeIssued(f: FindingHead) {
  if (f.reviewState !== 'approved')
    throw conflict(
      'The finding’s inspection has not been approved yet; findings are verified after the notice is issued.',
      'not_issued',
    );
}

/**
 * The inspection body's verdict on a finding: closed (verified corrected) or open again (not corrected
 * after all), with the comment. Both are one change of state; only the ride's follow-up differs.
 */
type CloseInput = z.output<typeof findingCloseInputSchema>;
type Verdict = ({ to: 'closed' } & CloseInput) | { to: 'open'; note: string };

type Evidence = { photoShas: string[]; reference: string | null; correctiveActions: number };

const alreadyIn = {
  closed: () => conflict('This finding is already closed.', 'already_closed'),
  open: () => conflict('This finding is already open; there is nothing to reopen.', 'already_open'),
};

function setFindingState(
  db: Db,
  user: SessionUser,
  findingId: string,
  verdict: Verdict,
  ctx: { now: Date; appUrl: string },
): FindingStateResponse {
  return db.transaction((tx) => {
    const before = mustSeeFinding(tx, user, findingId);
    mustBeIssued(before);
    if (before.state === verdict.to) throw alreadyIn[verdict.to]();
    const closing = verdict.to === 'closed';
    const ride = rideNow(tx, before.rideId);
    const blocking = forbidsOperation(before.severity);
    let evidence: Evidence | null = null;
    if (verdict.to === 'closed') {
      assertPhotosUploaded(tx, verdict.photoShas);
      const reports = actionsOf(tx, [findingId]).get(findingId)?.length ?? 0;
      evidence = { photoShas: verdict.photoShas, reference: verdict.evidenceRef, correctiveActions: reports };
      mustTransition(ride.status, 'finding_closed', user.role, {
        note: verdict.note,
        evidence: verdict.photoShas.length > 0 || verdict.evidenceRef !== null || reports > 0,
      });
    }
    const at = ctx.now.toISOString();
    const closedAt = closing ? at : null;
    tx.update(findings)
      .set({
        state: verdict.to,
        closedAt,
        closedBy: closing ? user.id : null,
        stateNote: verdict.note,
        closeEvidence: evidence,
        updatedAt: at,
        updatedBy: user.id,
      })
      .where(eq(findings.id, findingId))
      .run();
    appendToLedger(tx, { kind: 'finding', refId: findingId }, ctx.now);
    recordStateChange(tx, user, before, closing ? 'verified and closed' : 'reopened', {
      state: verdict.to,
      stateNote: verdict.note,
      closedAt,
      ...(evidence ? { evidence } : {}),
    });
    let statusNotice: FindingStateResponse['statusNotice'] = null;
    if (blocking && verdict.to === 'open') {
      const check = mustTransition(ride.status, 'blocking_finding_reopened', user.role, {
        note: verdict.note,
      });
      if (check.to !== ride.status) {
        applyStatus(tx, {
          userId: user.id,
          rideId: before.rideId,
          event: 'blocking_finding_reopened',
          to: check.to,
          override: false,
          reason: verdict.note,
          now: ctx.now,
          findingId,
        });
        const notice = issueStatusNotice(tx, {
          rideId: before.rideId,
          userId: user.id,
          now: ctx.now,
          appUrl: ctx.appUrl,
          reason: verdict.note,
          statusCause: `Because finding ${before.number} (${severityInfo[before.severity].label}) was reopened.`,
        });
        statusNotice = { id: notice.id, reference: notice.reference };
      }
    }
    // The last blocking finding verified on a stopped ride: its follow-up inspection is booked now.
    if (blocking && closing) ensureFollowUp(db, tx, user.id, before.rideId, ctx.now);
    refreshQueue(tx, queueToday(ctx.now), [before.rideId]);
    return { finding: findingNow(tx, findingId), ride: rideNow(tx, before.rideId), statusNotice };
  });
}

/**
 * Verified corrected: the finding is closed, with the verifier's note and evidence. The ride's status
 * stays: when it was the last open finding that forbids operation on a stopped ride, the follow-up
 * inspection is booked, and its approval returns the ride to service.
 */
export function closeFinding(
  db: Db,
  user: SessionUser,
  findingId: string,
  input: CloseInput,
  ctx: { now: Date; appUrl: string },
): FindingStateResponse {
  return setFindingState(db, user, findingId, { to: 'closed', ...input }, ctx);
}

/**
 * Not corrected after all (or the corrective action is not accepted): the finding is open again with the
 * comment. A reopened finding that forbids operation takes a ride in service out of service, with the
 * comment as the reason.
 */
export function reopenFinding(
  db: Db,
  user: SessionUser,
  findingId: string,
  note: string,
  ctx: { now: Date; appUrl: string },
): FindingStateResponse {
  return setFindingState(db, user, findingId, { to: 'open', note }, ctx);
}
