/**
 * Findings as their history stands in the audit log (raised, changed, closed, reopened, removed) and the
 * operators' corrective-action reports. Who sees which finding follows the rest of the app: supervisors
 * and administrators every finding; an inspector those of their own inspections and those on the ride's
 * notices (which every member of staff may read); an operator only those on notices issued to their own
 * company, and of those only what happened from the first such notice on (and the finding's raising).
 */
import { and, eq, sql, type SQL } from 'drizzle-orm';

import { correctiveActions } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { auditLog, users } from '@/db/server/schema';
import type { LogbookEvent, LogbookLink } from '@/features/logbook/schema';
import { formatDate } from '@/lib/dates';
import { findingSeverityVocabulary, type FindingSeverity } from '@/lib/vocabulary';
import {
  inRange,
  isDecider,
  lines,
  everyone,
  when,
  type LogbookSource,
  type SourceQuery,
} from '@/server/logbook/source';

/** The notices of this ride the viewer may read: all of them for staff, their company's for an operator. */
function noticeScope(q: SourceQuery): SQL {
  return q.viewer.role === 'operator'
    ? sql`n.ride_id = ${q.rideId} AND n.operator_company_id = ${q.viewer.companyId ?? ''}`
    : sql`n.ride_id = ${q.rideId}`;
}

/** The first notice the viewer may read that lists the finding whose id is `findingId`. */
const firstNotice = (findingId: SQL, q: SourceQuery) =>
  sql<string | null>`(SELECT n.id FROM notice_findings nf JOIN notices n ON n.id = nf.notice_id
    WHERE nf.finding_id = ${findingId} AND ${noticeScope(q)} ORDER BY n.issued_at, n.id LIMIT 1)`;

/** Whether the viewer may see the finding whose id is `findingId` (SQL; null = every finding). */
function findingVisible(findingId: SQL, q: SourceQuery): SQL | undefined {
  if (isDecider(q.viewer)) return undefined;
  const onNotice = sql`${firstNotice(findingId, q)} IS NOT NULL`;
  if (q.viewer.role === 'operator') return onNotice;
  return sql`(${onNotice} OR EXISTS (SELECT 1 FROM findings f JOIN inspections i ON i.id = f.inspection_id
    WHERE f.id = ${findingId} AND i.inspector_id = ${q.viewer.id}))`;
}

function findingLink(
  q: SourceQuery,
  noticeId: string | null,
  inspectionId: string | null,
): LogbookLink | null {
  if (isDecider(q.viewer) && inspectionId)
    return { label: 'Open the inspection', href: `/review/${encodeURIComponent(inspectionId)}` };
  if (noticeId) return { label: 'Open the notice', href: `/notices/${encodeURIComponent(noticeId)}` };
  return null;
}

type Kept = {
  number?: number;
  rideNumber?: number | null;
  inspectionId?: string;
  severity?: FindingSeverity;
  description?: string;
  requiredAction?: string | null;
  dueOn?: string | null;
  state?: string;
  stateNote?: string | null;
  evidence?: { reference?: string | null; photoShas?: string[] };
};
const kept = (v: unknown): Kept => (v && typeof v === 'object' ? (v as Kept) : {});

const severityWord = (s: FindingSeverity | undefined) =>
  s ? findingSeverityVocabulary[s]?.label : undefined;

function findingEvent(
  row: { id: string; at: string; action: string; before: unknown; after: unknown; who: string | null },
  current: { rideNumber: number | null; inspectionId: string | null; noticeId: string | null },
  q: SourceQuery,
): LogbookEvent | null {
  const b = kept(row.before);
  const a = kept(row.after);
  const n = current.rideNumber ?? a.rideNumber ?? b.rideNumber ?? a.number ?? b.number;
  const name = `Finding ${n ?? ''}`.trim();
  const base = {
    id: `finding:${row.id}`,
    rideId: q.rideId,
    ...when(row.at, q.zone),
    kind: 'finding' as const,
    who: row.who,
    link: findingLink(q, current.noticeId, current.inspectionId ?? a.inspectionId ?? b.inspectionId ?? null),
    documents: [],
  };
  const content = (f: Kept) =>
    lines(
      f.description,
      f.requiredAction ? `Required action: ${f.requiredAction}` : null,
      f.dueOn ? `Due: ${formatDate(f.dueOn)}` : null,
    );
  if (row.action === 'create')
    return {
      ...base,
      title: `${name} raised — ${severityWord(a.severity) ?? 'finding'}`,
      detail: content(a),
    };
  if (row.action === 'delete') return { ...base, title: `${name} removed`, detail: lines(b.description) };
  if (a.state && b.state && a.state !== b.state) {
    // The operator's report has its own entry (corrective actions).
    if (a.state === 'action_reported') return null;
    const evidence = a.evidence;
    if (a.state === 'closed')
      return {
        ...base,
        title: `${name} verified and closed`,
        detail: lines(
          a.stateNote ? `Verifier’s note: ${a.stateNote}` : null,
          evidence?.reference ? `Evidence: ${evidence.reference}` : null,
          evidence?.photoShas?.length ? `${evidence.photoShas.length} photo(s) as evidence` : null,
        ),
      };
    return {
      ...base,
      title: `${name} reopened`,
      detail: lines(a.stateNote ? `Comment: ${a.stateNote}` : null),
    };
  }
  const severityChange =
    a.severity && b.severity && a.severity !== b.severity
      ? ` (${severityWord(b.severity)} → ${severityWord(a.severity)})`
      : '';
  return { ...base, title: `${name} changed${severityChange}`, detail: content(a) };
}

export const findingsSource: LogbookSource = {
  kind: 'finding',
  shownTo: everyone,
  read: (db, q) => {
    // Written out in full: drizzle drops table names from columns inside a select's sql.
    const entityId = sql.raw('"audit_log"."entity_id"');
    const notice = firstNotice(entityId, q);
    return db
      .select({
        id: auditLog.id,
        at: auditLog.at,
        action: auditLog.action,
        before: auditLog.before,
        after: auditLog.after,
        who: users.name,
        rideNumber: findings.rideNumber,
        inspectionId: findings.inspectionId,
        noticeId: notice,
        noticeAt: sql<string | null>`(SELECT issued_at FROM notices WHERE id = ${notice})`,
      })
      .from(auditLog)
      .leftJoin(users, eq(users.id, auditLog.userId))
      .leftJoin(findings, eq(findings.id, auditLog.entityId))
      .where(
        and(
          eq(auditLog.rideId, q.rideId),
          eq(auditLog.entity, 'finding'),
          findingVisible(entityId, q),
          inRange(auditLog.at, q),
        ),
      )
      .all()
      .filter(
        (r) =>
          q.viewer.role !== 'operator' ||
          r.action === 'create' ||
          (r.noticeAt !== null && r.at >= r.noticeAt),
      )
      .map((r) => findingEvent(r, r, q))
      .filter((e): e is LogbookEvent => e !== null);
  },
};

const findingId = sql.raw('"findings"."id"');

export const correctiveActionsSource: LogbookSource = {
  kind: 'corrective_action',
  shownTo: everyone,
  read: (db, q) =>
    db
      .select({
        id: correctiveActions.id,
        at: correctiveActions.reportedAt,
        note: correctiveActions.note,
        photoShas: correctiveActions.photoShas,
        who: users.name,
        rideNumber: findings.rideNumber,
        number: findings.number,
        inspectionId: findings.inspectionId,
        noticeId: firstNotice(findingId, q),
      })
      .from(correctiveActions)
      .innerJoin(findings, eq(findings.id, correctiveActions.findingId))
      .leftJoin(users, eq(users.id, correctiveActions.reportedBy))
      .where(
        and(
          eq(findings.rideId, q.rideId),
          findingVisible(findingId, q),
          inRange(correctiveActions.reportedAt, q),
        ),
      )
      .all()
      .map((r): LogbookEvent => ({
        id: `corrective-action:${r.id}`,
        rideId: q.rideId,
        ...when(r.at, q.zone),
        kind: 'corrective_action',
        title: `Corrective action reported on finding ${r.rideNumber ?? r.number}`,
        detail: lines(r.note, r.photoShas.length ? `${r.photoShas.length} photo(s) attached` : null),
        who: r.who,
        link: findingLink(q, r.noticeId, r.inspectionId),
        documents: [],
      })),
};
