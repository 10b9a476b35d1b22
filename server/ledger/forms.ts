import { sql } from 'drizzle-orm';

import type { LedgerKind } from '@/features/ledger';
import type { Db } from '@/server/db';

/*
 * What the chain records of each kind: the fields of the live row that say what was accepted. The same
 * function gives the form when an entry is appended and when the live row is checked against its latest
 * entry, so the two can only differ when the row changed outside the paths that append.
 */

type Reader = Pick<Db, 'get'>;
export type LiveForm = { rideId: string; kind: LedgerKind; value: unknown };

const json = (text: string | null): unknown => (text === null ? null : JSON.parse(text));

/**
 * An inspection or amendment: the record itself as stored, which is the record as the phone queued and
 * signed it, so the entry's record hash is what the phone's signature covers. Who sent it and when the
 * server accepted it are the entry's own (`at`) and the decision's.
 */
function inspectionForm(db: Reader, id: string): LiveForm | null {
  const row = db.get<{ rideId: string; amendsId: string | null; record: string }>(
    sql`SELECT ride_id AS rideId, amends_id AS amendsId, record FROM inspections WHERE id = ${id}`,
  );
  if (!row) return null;
  return { rideId: row.rideId, kind: row.amendsId ? 'amendment' : 'inspection', value: json(row.record) };
}

function decisionForm(db: Reader, id: string): LiveForm | null {
  const row = db.get<{
    rideId: string;
    reviewState: string;
    reviewedAt: string | null;
    reviewedBy: string | null;
    reviewNote: string | null;
  }>(sql`SELECT ride_id AS rideId, review_state AS reviewState, reviewed_at AS reviewedAt,
           reviewed_by AS reviewedBy, review_note AS reviewNote FROM inspections WHERE id = ${id}`);
  if (!row) return null;
  return { rideId: row.rideId, kind: 'decision', value: { inspectionId: id, ...row } };
}

function findingForm(db: Reader, id: string): LiveForm | null {
  const row = db.get<Record<string, string | number | null> & { rideId: string }>(
    sql`SELECT ride_id AS rideId, inspection_id AS inspectionId, number, severity, description,
          rule_ref AS ruleRef, required_action AS requiredAction, due_on AS dueOn, photo_shas AS photoShas,
          state, state_note AS stateNote, created_at AS createdAt, created_by AS createdBy,
          updated_at AS updatedAt, updated_by AS updatedBy, closed_at AS closedAt, closed_by AS closedBy,
          close_evidence AS closeEvidence
        FROM findings WHERE id = ${id}`,
  );
  if (!row) return null;
  const value = {
    id,
    ...row,
    photoShas: json(row.photoShas as string),
    closeEvidence: json(row.closeEvidence as string | null),
  };
  return { rideId: row.rideId, kind: 'finding', value };
}

function ndtForm(db: Reader, id: string): LiveForm | null {
  const row = db.get<Record<string, string | number | null> & { rideId: string }>(
    sql`SELECT ride_id AS rideId, joint, tested_on AS testedOn, method, technician, level, result, note,
          report_sha256 AS reportSha256, created_by AS createdBy, created_at AS createdAt
        FROM ndt_records WHERE id = ${id}`,
  );
  return row ? { rideId: row.rideId, kind: 'ndt', value: { id, ...row } } : null;
}

function noticeForm(db: Reader, id: string): LiveForm | null {
  const row = db.get<Record<string, string | number | null> & { rideId: string; document: string }>(
    sql`SELECT ride_id AS rideId, reference, kind, inspection_id AS inspectionId,
          operator_company_id AS operatorCompanyId, issued_at AS issuedAt, issued_by AS issuedBy, document
        FROM notices WHERE id = ${id}`,
  );
  return row
    ? { rideId: row.rideId, kind: 'notice', value: { id, ...row, document: json(row.document) } }
    : null;
}

/**
 * The record of `kind` and `refId` as it stands now; null when the row is gone (a finding removed before
 * the decision). An inspection and its amendment share one reader: which kind it is comes from the row.
 */
export function liveForm(db: Reader, kind: LedgerKind, refId: string): LiveForm | null {
  switch (kind) {
    case 'inspection':
    case 'amendment':
      return inspectionForm(db, refId);
    case 'decision':
      return decisionForm(db, refId);
    case 'finding':
      return findingForm(db, refId);
    case 'ndt':
      return ndtForm(db, refId);
    case 'notice':
      return noticeForm(db, refId);
  }
}
