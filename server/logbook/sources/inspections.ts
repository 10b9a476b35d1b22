/**
 * Inspections submitted and the review's decisions on them. Operators see neither (they learn of a
 * decision through its notice); an inspector sees their own, as everywhere else; supervisors and
 * administrators see all, with the review screen. The report PDF goes to those the report route serves.
 * Operators' daily pre-opening checks are stored as inspections too; they are the daily-check source's.
 */
import { and, eq, inArray, ne } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { inspections } from '@/db/server/inspections';
import { users } from '@/db/server/schema';
import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import type { LogbookDocument, LogbookEvent } from '@/features/logbook/schema';
import type { SessionUser } from '@/features/session/schema';
import { envelopeStatusVocabulary, inspectionTypeVocabulary, reviewStateVocabulary } from '@/lib/vocabulary';
import {
  inRange,
  isDecider,
  lines,
  staffOnly,
  when,
  type LogbookSource,
  type Reader,
  type SourceQuery,
} from '@/server/logbook/source';

const inspector = alias(users, 'logbook_inspector');
const reviewer = alias(users, 'logbook_reviewer');

const reviewPath = (id: string) => `/review/${encodeURIComponent(id)}`;

function rows(db: Reader, q: SourceQuery, decided: boolean) {
  return db
    .select({
      id: inspections.id,
      type: inspections.type,
      submittedAt: inspections.submittedAt,
      inspectorId: inspections.inspectorId,
      inspectorName: inspector.name,
      amendsId: inspections.amendsId,
      failedItems: inspections.failedItems,
      analysisStatus: inspections.analysisStatus,
      reviewState: inspections.reviewState,
      reviewedAt: inspections.reviewedAt,
      reviewerName: reviewer.name,
      reviewNote: inspections.reviewNote,
    })
    .from(inspections)
    .innerJoin(inspector, eq(inspector.id, inspections.inspectorId))
    .leftJoin(reviewer, eq(reviewer.id, inspections.reviewedBy))
    .where(
      and(
        eq(inspections.rideId, q.rideId),
        // Operators' daily checks are entries of their own (sources/daily-checks.ts).
        ne(inspections.type, DAILY_CHECK_TYPE),
        q.viewer.role === 'inspector' ? eq(inspections.inspectorId, q.viewer.id) : undefined,
        decided ? inArray(inspections.reviewState, ['approved', 'returned']) : undefined,
        inRange(decided ? inspections.reviewedAt : inspections.submittedAt, q),
      ),
    )
    .all();
}

type Row = ReturnType<typeof rows>[number];

const typeWord = (r: Row) => inspectionTypeVocabulary[r.type].label;

function reviewLink(viewer: SessionUser, id: string) {
  return isDecider(viewer) ? { label: 'Open the inspection', href: reviewPath(id) } : null;
}

function reportOf(r: Row): LogbookDocument {
  return {
    label: 'Inspection report (PDF)',
    apiPath: `/api/inspections/${encodeURIComponent(r.id)}/report.pdf`,
    fileName: `inspection-${r.submittedAt.slice(0, 10)}.pdf`,
  };
}

export const inspectionsSource: LogbookSource = {
  kind: 'inspection',
  shownTo: staffOnly,
  read: (db, q) =>
    rows(db, q, false).map((r): LogbookEvent => ({
      id: `inspection:${r.id}`,
      rideId: q.rideId,
      ...when(r.submittedAt, q.zone),
      kind: 'inspection',
      title: `${typeWord(r)} inspection submitted${r.amendsId ? ' (a correction of an earlier one)' : ''}`,
      detail: lines(
        `Load check: ${r.analysisStatus ? envelopeStatusVocabulary[r.analysisStatus].label : 'no envelope result'}`,
        r.failedItems > 0 ? `${r.failedItems} checklist item${r.failedItems === 1 ? '' : 's'} failed` : null,
        `Review: ${reviewStateVocabulary[r.reviewState].label}`,
      ),
      who: r.inspectorName,
      link: reviewLink(q.viewer, r.id),
      // The report route serves deciders any report and an inspector their own (the only ones listed).
      documents: [reportOf(r)],
    })),
};

export const decisionsSource: LogbookSource = {
  kind: 'decision',
  shownTo: staffOnly,
  read: (db, q) =>
    rows(db, q, true).map((r): LogbookEvent => ({
      id: `decision:${r.id}`,
      rideId: q.rideId,
      ...when(r.reviewedAt ?? r.submittedAt, q.zone),
      kind: 'decision',
      title:
        r.reviewState === 'approved'
          ? `${typeWord(r)} inspection approved`
          : `${typeWord(r)} inspection returned to ${r.inspectorName}`,
      detail: lines(
        `Inspection of ${when(r.submittedAt, q.zone).day} by ${r.inspectorName}`,
        r.reviewNote ? `${r.reviewState === 'approved' ? 'Note' : 'Reason'}: ${r.reviewNote}` : null,
      ),
      who: r.reviewerName,
      link: reviewLink(q.viewer, r.id),
      documents: [],
    })),
};
