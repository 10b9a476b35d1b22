/**
 * The corrective action the operator reports on a finding of a notice (open → action reported), and the
 * reading of a finding that the inspection body's verdict shares (`server/review/finding-verdict.ts`).
 * Every change is one transaction with its audit entries and the ride's review-queue rows.
 *
 * An operator acts only on findings listed on a notice to their company; anything else answers the same
 * 404 as a missing record, so ids cannot be probed.
 */
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { z } from 'zod';

import { inspections, photos } from '@/db/server/inspections';
import { correctiveActions, noticeFindings, notices } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { rides } from '@/db/server/schema';
import type { SessionUser } from '@/features/session/schema';
import type {
  correctiveActionInputSchema,
  FindingStateResponse,
  NoticeFinding,
} from '@/features/notices/schema';
import type { FindingSeverity } from '@/features/review/schema';
import { companyScope } from '@/server/auth/scope';
import type { Db } from '@/server/db';
import { findingNumber } from '@/server/findings/findings';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { appendToLedger } from '@/server/ledger/append';
import { operatorMaySeePhoto } from '@/server/notices/photo-access';
import { currentFindings } from '@/server/notices/read';
import { queueToday, refreshQueue } from '@/server/queue/queue-refresh';
import { recordAudit } from '@/server/registry/audit';

type Reader = Pick<Db, 'select'>;

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export type FindingHead = {
  id: string;
  rideId: string;
  number: number;
  severity: FindingSeverity;
  state: (typeof findings.$inferSelect)['state'];
  stateNote: string | null;
  closedAt: string | null;
  inspectionId: string;
  reviewState: (typeof inspections.$inferSelect)['reviewState'];
  rideName: string;
};

/**
 * The finding if `user` may act on it: staff any; an operator only one listed on a notice to their
 * company (a finding not yet issued to them does not exist for them).
 */
export function mustSeeFinding(db: Reader, user: SessionUser, id: string): FindingHead {
  const scope = companyScope(user);
  const row = db
    .select({
      id: findings.id,
      rideId: findings.rideId,
      number: findingNumber,
      severity: findings.severity,
      state: findings.state,
      stateNote: findings.stateNote,
      closedAt: findings.closedAt,
      inspectionId: findings.inspectionId,
      reviewState: inspections.reviewState,
      rideName: rides.name,
    })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .innerJoin(rides, eq(rides.id, findings.rideId))
    .where(
      and(
        eq(findings.id, id),
        scope === null
          ? undefined
          : sql`EXISTS (SELECT 1 FROM ${noticeFindings} nf JOIN ${notices} n ON n.id = nf.notice_id
              WHERE nf.finding_id = ${findings.id} AND n.operator_company_id = ${scope})`,
      ),
    )
    .get();
  if (!row) throw notFound('No such finding.');
  return row;
}

export function findingNow(db: Reader, id: string): NoticeFinding {
  const [finding] = currentFindings(db, [id]);
  if (!finding) throw notFound('No such finding.');
  return finding;
}

export const stateOf = (f: { state: string; stateNote: string | null; closedAt: string | null }) => ({
  state: f.state,
  stateNote: f.stateNote,
  closedAt: f.closedAt,
});

/** The audit entry of a change of a finding's state; `what` ends its summary. */
export function recordStateChange(
  tx: Tx,
  user: SessionUser,
  before: FindingHead,
  what: string,
  after: ReturnType<typeof stateOf>,
) {
  recordAudit(tx, {
    userId: user.id,
    entity: 'finding',
    entityId: before.id,
    action: 'update',
    rideId: before.rideId,
    summary: `${before.rideName}: finding ${before.number} ${what}`,
    before: stateOf(before),
    after,
  });
}

export function rideNow(db: Reader, rideId: string) {
  const ride = db
    .select({ id: rides.id, status: rides.status, statusReason: rides.statusReason })
    .from(rides)
    .where(eq(rides.id, rideId))
    .get();
  if (!ride) throw notFound('No such ride.');
  return ride;
}

/**
 * `photoShas` must name photos the server already has (uploaded with PUT /api/photos/:sha256); a 400
 * names each one that is missing. An operator (`scopeOf` their company) may attach only photos their
 * company uploaded or can already see: anyone else's counts as missing, in the same words, so knowing a
 * hash neither reaches a photo nor tells whether it exists.
 */
export function assertPhotosUploaded(db: Pick<Db, 'select' | 'get'>, shas: string[], scopeOf?: SessionUser) {
  if (shas.length === 0) return;
  const company = scopeOf ? companyScope(scopeOf) : null;
  const have = new Set(
    db
      .select({ sha256: photos.sha256 })
      .from(photos)
      .where(inArray(photos.sha256, shas))
      .all()
      .map((p) => p.sha256)
      .filter((sha) => company === null || operatorMaySeePhoto(db, company, sha)),
  );
  const issues = shas.flatMap((sha, i) =>
    have.has(sha)
      ? []
      : [
          {
            path: `photoShas.${i}`,
            message: 'This photo has not been uploaded yet; upload it, then send again.',
          },
        ],
  );
  if (issues.length > 0)
    throw new HttpError(400, 'validation_failed', 'Some photos have not reached the server yet.', issues);
}

type ActionInput = z.output<typeof correctiveActionInputSchema>;

/** The operator's report of what was done about a finding: open → action reported. */
export function reportCorrectiveAction(
  db: Db,
  user: SessionUser,
  findingId: string,
  input: ActionInput,
  now: Date,
): FindingStateResponse {
  return db.transaction((tx) => {
    const before = mustSeeFinding(tx, user, findingId);
    if (before.state === 'closed')
      throw conflict(
        'This finding was verified and closed; it takes no more corrective actions. If the deficiency is ' +
          'back, ask the inspection body to reopen it.',
        'finding_closed',
      );
    assertPhotosUploaded(tx, input.photoShas, user);
    const at = now.toISOString();
    const action = tx
      .insert(correctiveActions)
      .values({
        findingId,
        reportedBy: user.id,
        reportedAt: at,
        note: input.note,
        photoShas: input.photoShas,
      })
      .returning({ id: correctiveActions.id })
      .get();
    recordAudit(tx, {
      userId: user.id,
      entity: 'corrective_action',
      entityId: action.id,
      action: 'create',
      rideId: before.rideId,
      summary: `${before.rideName}: corrective action reported on finding ${before.number}`,
      after: { findingId, note: input.note, photoShas: input.photoShas },
    });
    if (before.state === 'open') {
      tx.update(findings)
        .set({ state: 'action_reported', updatedAt: at, updatedBy: user.id })
        .where(eq(findings.id, findingId))
        .run();
      appendToLedger(tx, { kind: 'finding', refId: findingId }, now);
      recordStateChange(tx, user, before, '— action reported', {
        ...stateOf(before),
        state: 'action_reported',
      });
    }
    refreshQueue(tx, queueToday(now), [before.rideId]);
    return { finding: findingNow(tx, findingId), ride: rideNow(tx, before.rideId), statusNotice: null };
  });
}
