/**
 * After a notice is issued: who may read it, reading it (with its findings as they stand now and their
 * corrective actions), and the operator's acknowledgement.
 *
 * Operators reach notices and findings only through notices addressed to their company; anything else
 * answers the same 404 as a missing record, so ids cannot be probed.
 */
import { and, asc, count, desc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { correctiveActions, noticeDeliveries, noticeFindings, notices } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { companies, rides, users } from '@/db/server/schema';
import type { SessionUser } from '@/features/session/schema';
import type {
  CorrectiveAction,
  NoticeDeliveryState,
  NoticeDetail,
  NoticeFinding,
  NoticeListItem,
  NoticeListQuery,
  NoticeListResponse,
} from '@/features/notices/schema';
import { companyScope } from '@/server/auth/scope';
import type { Db } from '@/server/db';
import { findingRows } from '@/server/findings/findings';
import { notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';

type Reader = Pick<Db, 'select'>;

const issuer = alias(users, 'notice_issuer');
const acknowledger = alias(users, 'notice_acknowledger');

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

function deliveryStateOf(total: number, sent: number, failed: number): NoticeDeliveryState {
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

export function actionsOf(db: Reader, findingIds: string[]): Map<string, CorrectiveAction[]> {
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
export function currentFindings(db: Reader, ids: string[]): NoticeFinding[] {
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
