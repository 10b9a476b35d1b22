/**
 * After a notice is issued: who may read it, the operator's acknowledgement, the corrective action the
 * operator reports on each finding, and the verification that closes a finding or reopens it, under the
 * status rules (`features/review/status-rules.ts`). Closing needs the verifier's note and evidence and
 * never changes the ride's status: closing the last finding that forbids operation on a stopped ride books
 * its follow-up inspection, and only that inspection's approval (or a supervisor's override) puts the ride
 * back in service. Reopening such a finding stops a ride in service, with one status notice.
 * Every change is one transaction with its audit entries and the ride's review-queue rows.
 *
 * Operators reach notices and findings only through notices addressed to their company; anything else
 * answers the same 404 as a missing record, so ids cannot be probed.
 */
import { and, asc, count, desc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { z } from 'zod';

import { inspections, photos } from '@/db/server/inspections';
import { correctiveActions, noticeDeliveries, noticeFindings, notices } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { companies, rides, users } from '@/db/server/schema';
import type { SessionUser } from '@/features/auth/schema';
import type {
  findingCloseInputSchema,
  correctiveActionInputSchema,
  CorrectiveAction,
  FindingStateResponse,
  NoticeDeliveryState,
  NoticeDetail,
  NoticeFinding,
  NoticeListItem,
  NoticeListQuery,
  NoticeListResponse,
} from '@/features/notices/schema';
import { severityInfo, type FindingSeverity } from '@/features/review/schema';
import { companyScope } from '@/server/auth/scope';
import type { Db } from '@/server/db';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { issueStatusNotice } from '@/server/notices/issue';
import { recordAudit } from '@/server/registry/audit';
import { findingNumber, findingRows } from '@/server/review/findings';
import { applyStatus, ensureFollowUp, mustTransition } from '@/server/review/ride-status';
import { queueToday, refreshQueue } from '@/server/review/queue-refresh';

type Reader = Pick<Db, 'select'>;

const issuer = alias(users, 'notice_issuer');
const acknowledger = alias(users, 'notice_acknowledger');

// ——— reading notices ———

const deliveryCount = (status?: 'sent' | 'failed') =>
  sql<number>`(SELECT count(*) FROM ${noticeDeliveries} WHERE ${noticeDeliveries.noticeId} = ${notices.id}${
    status ? sql` AND ${noticeDeliveries.status} = ${status}` : sql``
  })`;

const headColumns = {
  id: notices.id,
  reference: notices.reference,
  kind: notices.kind,
  inspectionId: notices.inspectionId,
  rideId: notices.rideId,
  rideName: rides.name,
  operatorId: notices.operatorCompanyId,
  operatorName: companies.name,
  issuedAt: notices.issuedAt,
  issuedByName: issuer.name,
  acknowledgedAt: notices.acknowledgedAt,
  acknowledgedByName: acknowledger.name,
  deliveriesTotal: deliveryCount(),
  deliveriesSent: deliveryCount('sent'),
  deliveriesFailed: deliveryCount('failed'),
  openFindings: sql<number>`(SELECT count(*) FROM ${noticeFindings} nf JOIN ${findings} f ON f.id = nf.finding_id
    WHERE nf.notice_id = ${notices.id} AND f.state <> 'closed')`,
  findingsTotal: sql<number>`(SELECT count(*) FROM ${noticeFindings} nf WHERE nf.notice_id = ${notices.id})`,
};

function headQuery(db: Reader) {
  return db
    .select(headColumns)
    .from(notices)
    .innerJoin(rides, eq(rides.id, notices.rideId))
    .innerJoin(companies, eq(companies.id, notices.operatorCompanyId))
    .leftJoin(issuer, eq(issuer.id, notices.issuedBy))
    .leftJoin(acknowledger, eq(acknowledger.id, notices.acknowledgedBy));
}

type HeadRow = Awaited<ReturnType<ReturnType<typeof headQuery>['all']>>[number];

export function deliveryStateOf(total: number, sent: number, failed: number): NoticeDeliveryState {
  if (total === 0) return 'no_address';
  if (sent + failed < total) return 'sending';
  if (failed === 0) return 'sent';
  return sent === 0 ? 'failed' : 'partly_sent';
}

function toHead(row: HeadRow): NoticeListItem {
  const { deliveriesTotal: total, deliveriesSent: sent, deliveriesFailed: failed, ...rest } = row;
  return { ...rest, delivery: { state: deliveryStateOf(total, sent, failed), total, sent, failed } };
}

/** A page of notices, newest first. Operators get their own company's whatever the filters say. */
export function listNotices(db: Db, user: SessionUser, query: NoticeListQuery): NoticeListResponse {
  const scope = companyScope(user);
  const where = and(
    scope === null ? undefined : eq(notices.operatorCompanyId, scope),
    query.operatorId ? eq(notices.operatorCompanyId, query.operatorId) : undefined,
    query.rideId ? eq(notices.rideId, query.rideId) : undefined,
  );
  const total = db.select({ n: count() }).from(notices).where(where).get()?.n ?? 0;
  const rows = headQuery(db)
    .where(where)
    .orderBy(desc(notices.issuedAt), desc(notices.year), desc(notices.seq))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize)
    .all();
  return { notices: rows.map(toHead), total, page: query.page, pageSize: query.pageSize };
}

/** The notice if `user` may read it: staff any, an operator their own company's only (404 otherwise). */
export function mustSeeNotice(db: Reader, user: SessionUser, id: string) {
  const scope = companyScope(user);
  const row = db
    .select({ id: notices.id, operatorCompanyId: notices.operatorCompanyId, document: notices.document })
    .from(notices)
    .where(and(eq(notices.id, id), scope === null ? undefined : eq(notices.operatorCompanyId, scope)))
    .get();
  if (!row) throw notFound('No such notice.');
  return row;
}

function actionsOf(db: Reader, findingIds: string[]): Map<string, CorrectiveAction[]> {
  const byFinding = new Map<string, CorrectiveAction[]>();
  if (findingIds.length === 0) return byFinding;
  const rows = db
    .select({
      id: correctiveActions.id,
      findingId: correctiveActions.findingId,
      note: correctiveActions.note,
      photoShas: correctiveActions.photoShas,
      reportedAt: correctiveActions.reportedAt,
      reportedByName: users.name,
    })
    .from(correctiveActions)
    .leftJoin(users, eq(users.id, correctiveActions.reportedBy))
    .where(inArray(correctiveActions.findingId, findingIds))
    .orderBy(asc(correctiveActions.reportedAt), asc(correctiveActions.id))
    .all();
  for (const row of rows) byFinding.set(row.findingId, [...(byFinding.get(row.findingId) ?? []), row]);
  return byFinding;
}

/** Findings as they stand now, each with its corrective actions, in the order of `ids`. */
function currentFindings(db: Reader, ids: string[]): NoticeFinding[] {
  if (ids.length === 0) return [];
  const rows = findingRows(db).where(inArray(findings.id, ids)).all();
  const actions = actionsOf(db, ids);
  const order = new Map(ids.map((id, i) => [id, i]));
  return rows
    .map((f) => ({ ...f, correctiveActions: actions.get(f.id) ?? [] }))
    .sort((a, b) => (order.get(a.id) ?? 0) - (order.get(b.id) ?? 0));
}

export function getNotice(db: Reader, user: SessionUser, id: string): NoticeDetail {
  const { document } = mustSeeNotice(db, user, id);
  const head = headQuery(db).where(eq(notices.id, id)).get();
  if (!head) throw notFound('No such notice.');
  const staff = user.role !== 'operator';
  const deliveries = db
    .select({
      id: noticeDeliveries.id,
      recipient: noticeDeliveries.recipient,
      status: noticeDeliveries.status,
      attempts: noticeDeliveries.attempts,
      nextAttemptAt: noticeDeliveries.nextAttemptAt,
      lastError: noticeDeliveries.lastError,
      sentAt: noticeDeliveries.sentAt,
    })
    .from(noticeDeliveries)
    .where(eq(noticeDeliveries.noticeId, id))
    .orderBy(asc(noticeDeliveries.recipient))
    .all()
    .map((d) => ({
      ...d,
      nextAttemptAt: d.status === 'pending' ? d.nextAttemptAt : null,
      // SMTP replies name servers and accounts: the inspection body's business, not the operator's.
      lastError: staff ? d.lastError : null,
    }));
  return {
    ...toHead(head),
    document,
    deliveries,
    findings: currentFindings(
      db,
      document.findings.map((f) => f.id),
    ),
  };
}

// ——— acknowledgement ———

/**
 * The operator's acknowledgement: recorded once, by the first person of the company to acknowledge;
 * acknowledging again answers the notice as it stands (the first acknowledgement), not an error.
 */
export function acknowledgeNotice(db: Db, user: SessionUser, id: string, now: Date): NoticeDetail {
  return db.transaction((tx) => {
    mustSeeNotice(tx, user, id);
    const at = now.toISOString();
    const changed = tx
      .update(notices)
      .set({ acknowledgedAt: at, acknowledgedBy: user.id })
      .where(and(eq(notices.id, id), sql`${notices.acknowledgedAt} IS NULL`))
      .returning({ reference: notices.reference, rideId: notices.rideId })
      .get();
    if (changed)
      recordAudit(tx, {
        userId: user.id,
        entity: 'notice',
        entityId: id,
        action: 'update',
        rideId: changed.rideId,
        summary: `Notice ${changed.reference} acknowledged by ${user.name}`,
        before: { acknowledgedAt: null, acknowledgedBy: null },
        after: { acknowledgedAt: at, acknowledgedBy: user.name },
      });
    return getNotice(tx, user, id);
  });
}

// ——— findings: corrective action, close, reopen ———

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

type FindingHead = {
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
function mustSeeFinding(db: Reader, user: SessionUser, id: string): FindingHead {
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

function findingNow(db: Reader, id: string): NoticeFinding {
  const [finding] = currentFindings(db, [id]);
  if (!finding) throw notFound('No such finding.');
  return finding;
}

const stateOf = (f: { state: string; stateNote: string | null; closedAt: string | null }) => ({
  state: f.state,
  stateNote: f.stateNote,
  closedAt: f.closedAt,
});

/** The audit entry of a change of a finding's state; `what` ends its summary. */
function recordStateChange(
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

function rideNow(db: Reader, rideId: string) {
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
 * names each one that is missing.
 */
function assertPhotosUploaded(db: Reader, shas: string[]) {
  if (shas.length === 0) return;
  const have = new Set(
    db
      .select({ sha256: photos.sha256 })
      .from(photos)
      .where(inArray(photos.sha256, shas))
      .all()
      .map((p) => p.sha256),
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
    assertPhotosUploaded(tx, input.photoShas);
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
      recordStateChange(tx, user, before, '— action reported', {
        ...stateOf(before),
        state: 'action_reported',
      });
    }
    refreshQueue(tx, queueToday(now), [before.rideId]);
    return { finding: findingNow(tx, findingId), ride: rideNow(tx, before.rideId), statusNotice: null };
  });
}

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

// ——— photos for operators ———

/**
 * Whether an operator of `companyId` may see a photo: one shown on a notice to the company (as issued, or
 * on the notice's findings as they are now), one attached to a corrective action on those findings or
 * taken by the verifier on closing one, or one uploaded by someone of the company (their own evidence,
 * before they report it).
 */
export function operatorMaySeePhoto(db: Pick<Db, 'get'>, companyId: string, sha256: string): boolean {
  const row = db.get<{ ok: number } | undefined>(
    sql`SELECT 1 AS ok WHERE EXISTS (
          SELECT 1 FROM ${notices} n, json_each(n.document, '$.findings') f, json_each(f.value, '$.photos') p
          WHERE n.operator_company_id = ${companyId} AND json_extract(p.value, '$.sha256') = ${sha256})
        OR EXISTS (
          SELECT 1 FROM ${notices} n JOIN ${noticeFindings} nf ON nf.notice_id = n.id
            JOIN ${findings} fi ON fi.id = nf.finding_id, json_each(fi.photo_shas) p
          WHERE n.operator_company_id = ${companyId} AND p.value = ${sha256})
        OR EXISTS (
          SELECT 1 FROM ${notices} n JOIN ${noticeFindings} nf ON nf.notice_id = n.id
            JOIN ${correctiveActions} ca ON ca.finding_id = nf.finding_id, json_each(ca.photo_shas) p
          WHERE n.operator_company_id = ${companyId} AND p.value = ${sha256})
        OR EXISTS (
          SELECT 1 FROM ${notices} n JOIN ${noticeFindings} nf ON nf.notice_id = n.id
            JOIN ${findings} fi ON fi.id = nf.finding_id, json_each(fi.close_evidence, '$.photoShas') p
          WHERE n.operator_company_id = ${companyId} AND p.value = ${sha256})
        OR EXISTS (
          SELECT 1 FROM ${photos} ph JOIN ${users} u ON u.id = ph.uploaded_by
          WHERE ph.sha256 = ${sha256} AND u.company_id = ${companyId})`,
  );
  return row !== undefined;
}
