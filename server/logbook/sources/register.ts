/**
 * The ride's own records: NDT at its pivots (the operator reads these too), design data versions (made,
 * proposed, approved, rejected) and the documents attached to and removed from them (both staff only, as
 * design data and its version history are; an operator reads the in-force version's documents on the parts
 * page, not their history), and its operating status changes (the operator is sent each one as a notice).
 */
import { and, eq, isNull, or } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { ndtRecords } from '@/db/server/ndt';
import { rideStatusChanges } from '@/db/server/review';
import { designDocuments } from '@/db/server/parts';
import { designVersions, users } from '@/db/server/schema';
import { NDT_METHOD_WORDS } from '@/features/loads/design-schema';
import type { LogbookEvent } from '@/features/logbook/schema';
import { ndtResultInfo } from '@/features/pivot-life/ndt-schema';
import { formatDate } from '@/lib/dates';
import { designDocumentKindVocabulary, rideStatusVocabulary } from '@/lib/vocabulary';
import {
  everyone,
  inRange,
  lines,
  pdfFileName,
  staffOnly,
  when,
  type LogbookSource,
  type SourceQuery,
} from '@/server/logbook/source';

const originWords: Record<string, string> = {
  editor: 'edited field by field',
  import_csv: 'imported from a CSV file',
  import_json: 'imported from a JSON file',
  seed: 'the demo data',
};

const ridePath = (id: string) => `/rides/${encodeURIComponent(id)}`;
const inside = (q: SourceQuery, at: string) =>
  (!q.fromAt || at >= q.fromAt) && (!q.beforeAt || at < q.beforeAt);

export const ndtSource: LogbookSource = {
  kind: 'ndt',
  shownTo: everyone,
  read: (db, q) =>
    db
      .select({ r: ndtRecords, who: users.name })
      .from(ndtRecords)
      .leftJoin(users, eq(users.id, ndtRecords.createdBy))
      .where(and(eq(ndtRecords.rideId, q.rideId), inRange(ndtRecords.createdAt, q)))
      .all()
      .map(({ r, who }): LogbookEvent => ({
        id: `ndt:${r.id}`,
        rideId: q.rideId,
        ...when(r.createdAt, q.zone),
        kind: 'ndt',
        title: `${r.method} (${NDT_METHOD_WORDS[r.method]}) at pivot ${r.joint + 1}: ${ndtResultInfo[r.result].label}`,
        detail: lines(
          `Tested ${formatDate(r.testedOn)} by ${r.technician}, EN ISO 9712 level ${r.level}`,
          r.note,
          who ? `Recorded by ${who}` : null,
        ),
        who: r.technician,
        link: { label: 'Open the NDT records', href: `${ridePath(q.rideId)}/ndt` },
        documents: r.reportSha256
          ? [
              {
                label: 'NDT report (PDF)',
                apiPath: `/api/ndt-reports/${r.reportSha256}`,
                fileName: `ndt-report-${r.testedOn}-${r.method}.pdf`,
              },
            ]
          : [],
      })),
};

const maker = alias(users, 'logbook_design_maker');
const decider = alias(users, 'logbook_design_decider');

export const designSource: LogbookSource = {
  kind: 'design',
  shownTo: staffOnly,
  read: (db, q) => {
    const rows = db
      .select({
        id: designVersions.id,
        version: designVersions.version,
        reason: designVersions.reason,
        origin: designVersions.origin,
        createdAt: designVersions.createdAt,
        state: designVersions.approvalState,
        decidedAt: designVersions.decidedAt,
        decisionReason: designVersions.decisionReason,
        makerName: maker.name,
        deciderName: decider.name,
      })
      .from(designVersions)
      .leftJoin(maker, eq(maker.id, designVersions.createdBy))
      .leftJoin(decider, eq(decider.id, designVersions.decidedBy))
      .where(
        and(
          eq(designVersions.rideId, q.rideId),
          or(inRange(designVersions.createdAt, q), inRange(designVersions.decidedAt, q)),
        ),
      )
      .all();
    const out: LogbookEvent[] = [];
    for (const r of rows) {
      const link = { label: 'Open the version', href: `${ridePath(q.rideId)}/versions/${r.version}` };
      // A version that waited for a second person was proposed; any other came into force as it was made.
      const proposed = r.state === 'pending' || r.decidedAt !== null;
      const made = when(r.createdAt, q.zone);
      if (inside(q, made.at))
        out.push({
          id: `design:${r.id}`,
          rideId: q.rideId,
          ...made,
          kind: 'design',
          title: proposed
            ? `Design data version ${r.version} proposed (it loosens a limit)`
            : `Design data version ${r.version} made`,
          detail: lines(`Reason: ${r.reason}`, `How: ${originWords[r.origin] ?? r.origin}`),
          who: r.makerName,
          link,
          documents: [],
        });
      if (r.decidedAt && inside(q, when(r.decidedAt, q.zone).at))
        out.push({
          id: `design-decision:${r.id}`,
          rideId: q.rideId,
          ...when(r.decidedAt, q.zone),
          kind: 'design',
          title: `Design data version ${r.version} ${r.state === 'rejected' ? 'rejected' : 'approved'}`,
          detail: lines(r.decisionReason ? `Reason: ${r.decisionReason}` : null),
          who: r.deciderName,
          link,
          documents: [],
        });
    }
    return out;
  },
};

const attacher = alias(users, 'logbook_document_attacher');
const detacher = alias(users, 'logbook_document_detacher');

/**
 * Documents attached to design versions, and their removal. A copy carried to a new version is not
 * repeated (the new version is its own entry); a removal is, as it is an act of its own.
 */
export const designDocumentsSource: LogbookSource = {
  kind: 'design',
  shownTo: staffOnly,
  read: (db, q) => {
    const rows = db
      .select({
        d: designDocuments,
        attacherName: attacher.name,
        detacherName: detacher.name,
      })
      .from(designDocuments)
      .leftJoin(attacher, eq(attacher.id, designDocuments.attachedBy))
      .leftJoin(detacher, eq(detacher.id, designDocuments.detachedBy))
      .where(
        and(
          eq(designDocuments.rideId, q.rideId),
          or(
            and(isNull(designDocuments.carriedFromId), inRange(designDocuments.attachedAt, q)),
            inRange(designDocuments.detachedAt, q),
          ),
        ),
      )
      .all();
    const out: LogbookEvent[] = [];
    for (const { d, attacherName, detacherName } of rows) {
      const what =
        `${designDocumentKindVocabulary[d.kind].label} “${d.title}”` + (d.revision ? ` (${d.revision})` : '');
      const link = { label: 'Open the version', href: `${ridePath(q.rideId)}/versions/${d.version}` };
      const file = [
        { label: `${d.title} (PDF)`, apiPath: `/api/documents/${d.sha256}`, fileName: pdfFileName(d.title) },
      ];
      const detail = lines(d.issuedOn ? `Issued ${formatDate(d.issuedOn)}` : null);
      const attached = when(d.attachedAt, q.zone);
      if (d.carriedFromId === null && inside(q, attached.at))
        out.push({
          id: `design-document:${d.id}`,
          rideId: q.rideId,
          ...attached,
          kind: 'design',
          title: `${what} attached to design data version ${d.version}`,
          detail,
          who: attacherName,
          link,
          documents: file,
        });
      if (d.detachedAt && inside(q, when(d.detachedAt, q.zone).at))
        out.push({
          id: `design-document-removed:${d.id}`,
          rideId: q.rideId,
          ...when(d.detachedAt, q.zone),
          kind: 'design',
          title: `${what} removed from design data version ${d.version}`,
          detail,
          who: detacherName,
          link,
          documents: file,
        });
    }
    return out;
  },
};

export const statusSource: LogbookSource = {
  kind: 'status',
  shownTo: everyone,
  read: (db, q) =>
    db
      .select({ c: rideStatusChanges, who: users.name })
      .from(rideStatusChanges)
      .leftJoin(users, eq(users.id, rideStatusChanges.byUser))
      .where(and(eq(rideStatusChanges.rideId, q.rideId), inRange(rideStatusChanges.at, q)))
      .all()
      .map(({ c, who }): LogbookEvent => ({
        id: `status:${c.id}`,
        rideId: q.rideId,
        ...when(c.at, q.zone),
        kind: 'status',
        title:
          c.fromStatus === c.toStatus
            ? `Status stays ${rideStatusVocabulary[c.toStatus].label}`
            : `Status: ${rideStatusVocabulary[c.fromStatus].label} → ${rideStatusVocabulary[c.toStatus].label}`,
        detail: lines(c.reason ? `Reason: ${c.reason}` : null, c.override ? 'A supervisor’s override' : null),
        who,
        link: c.noticeId
          ? { label: 'Open the notice', href: `/notices/${encodeURIComponent(c.noticeId)}` }
          : { label: 'Open the ride', href: ridePath(q.rideId) },
        documents: [],
      })),
};
