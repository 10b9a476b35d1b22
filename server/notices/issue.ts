/**
 * Issuing a notice: the document is built once from the database as it stands, checked against
 * `noticeDocumentSchema`, and stored frozen with one pending e-mail delivery per notice address of the
 * operator company. Everything runs in the caller's transaction, so a notice exists exactly when the
 * approval or status change that caused it does.
 */
import { randomUUID } from 'node:crypto';

import { and, asc, eq, ne, sql } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { noticeDeliveries, noticeFindings, notices } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { designVersions, users } from '@/db/server/schema';
import { CAUTION_FULL } from '@/lib/caution-text';
import { appLink, noticePath } from '@/lib/paths';
import { formatBesideLimit, measuredSources } from '@/features/loads/format';
import { LOAD_CASE_LABEL } from '@/features/loads/load-cases';
import { noticeDocumentSchema, type NoticeDocument } from '@/features/notices/schema';
import { inspectionTypeLabel } from '@/features/registry/schema';
import { rideClassLabel } from '@/features/rides/schema';
import type { Db } from '@/server/db';
import { notFound } from '@/server/http/errors';
import { deliveryKey } from '@/server/mail/mailer';
import { appendToLedger } from '@/server/ledger/append';
import { deliveriesQueued } from '@/server/notices/nudge';
import { appealText, noticeReference } from '@/server/notices/words';
import { numberRideFindings } from '@/server/findings/findings';
import {
  documentFindings,
  inspectionPart,
  issuerOf,
  joinLines,
  pivotLifePart,
  reinspectionOf,
  resultsOf,
  rideContext,
  signerOf,
  withCause,
} from '@/server/notices/document-parts';
import { recordAudit } from '@/server/registry/audit';
import { rideTimeZone } from '@/server/schedule-due';

export type NoticeTx = Pick<Db, 'select' | 'insert' | 'update' | 'run' | 'get' | 'all'>;

type IssuedNotice = { id: string; reference: string; recipients: string[] };

/** The next reference of the year. Sequential because every issue runs in a write transaction. */
function nextReference(tx: NoticeTx, year: number) {
  const last = tx
    .select({ seq: sql<number | null>`max(${notices.seq})` })
    .from(notices)
    .where(eq(notices.year, year))
    .get();
  const seq = (last?.seq ?? 0) + 1;
  return { year, seq, reference: noticeReference(year, seq) };
}

type Common = { userId: string; now: Date; appUrl: string };

/** Stores the document and its deliveries; the caller has checked the document. */
function insertNotice(
  tx: NoticeTx,
  input: Common & {
    id: string;
    ref: { year: number; seq: number; reference: string };
    doc: NoticeDocument;
    inspectionId: string | null;
    rideId: string;
    operatorId: string;
    noticeEmails: string[];
    findingIds: string[];
  },
): IssuedNotice {
  const issuedAt = input.doc.issuedAt;
  tx.insert(notices)
    .values({
      id: input.id,
      reference: input.ref.reference,
      year: input.ref.year,
      seq: input.ref.seq,
      kind: input.doc.kind,
      inspectionId: input.inspectionId,
      rideId: input.rideId,
      operatorCompanyId: input.operatorId,
      issuedAt,
      issuedBy: input.userId,
      document: input.doc,
    })
    .run();
  appendToLedger(tx, { kind: 'notice', refId: input.id }, input.now);
  if (input.findingIds.length > 0)
    tx.insert(noticeFindings)
      .values(input.findingIds.map((findingId) => ({ noticeId: input.id, findingId })))
      .run();

  const recipients = [...new Set(input.noticeEmails.map((e) => e.trim().toLowerCase()).filter(Boolean))];
  if (recipients.length > 0) {
    tx.insert(noticeDeliveries)
      .values(
        recipients.map((recipient) => ({
          kind: 'notice' as const,
          noticeId: input.id,
          operatorCompanyId: input.operatorId,
          recipient,
          idempotencyKey: deliveryKey(input.id, recipient),
          createdAt: issuedAt,
          nextAttemptAt: issuedAt,
        })),
      )
      .run();
    deliveriesQueued();
  }

  recordAudit(tx, {
    userId: input.userId,
    entity: 'notice',
    entityId: input.id,
    action: 'create',
    rideId: input.rideId,
    summary:
      `${input.doc.ride.name}: notice ${input.ref.reference} issued to ${input.doc.operator.name}` +
      (recipients.length === 0 ? ' (no notice address: not e-mailed)' : ''),
    after: {
      reference: input.ref.reference,
      kind: input.doc.kind,
      inspectionId: input.inspectionId,
      findings: input.findingIds.length,
      operatingStatus: input.doc.operatingStatus,
      recipients,
    },
  });
  return { id: input.id, reference: input.ref.reference, recipients };
}

function commonParts(tx: NoticeTx, rideId: string, input: Common) {
  const ride = rideContext(tx, rideId);
  const issuedAt = input.now.toISOString();
  const id = randomUUID();
  const ref = nextReference(tx, input.now.getUTCFullYear());
  const issuer = issuerOf(tx);
  const operatingStatus = { status: ride.status, reason: ride.statusReason };
  const base = {
    reference: ref.reference,
    issuedAt,
    issuer,
    operator: { id: ride.operatorId, name: ride.operatorName, address: ride.operatorAddress },
    ride: {
      id: ride.id,
      name: ride.name,
      rideClass: rideClassLabel[ride.rideClass],
      maker: ride.maker,
      model: ride.model,
      serial: ride.serial,
      year: ride.year,
    },
    site: ride.siteName
      ? { name: ride.siteName, address: joinLines(ride.siteAddress, ride.siteLocality) }
      : null,
    // The site's clock, frozen with the notice: its PDF and e-mail print times on it, named.
    timeZone: rideTimeZone(tx, rideId),
    // The operator's units and paper, frozen likewise: a later change of the company's choice leaves this
    // notice, its PDF and its e-mail as issued.
    units: ride.noticeUnits,
    paper: ride.noticePaper,
    appeal: appealText(issuer.name, ref.reference),
    caution: CAUTION_FULL,
    signature: signerOf(tx, input.userId, issuedAt),
    url: appLink(input.appUrl, noticePath(id)),
  };
  return { ride, id, ref, base, operatingStatus };
}

/**
 * The notice for an approved inspection with findings: what was checked and found, what must be done and
 * by when, the ride's status, the load summary and the caution. Call it in the approval's transaction,
 * after the inspection is marked approved. Returns null when the inspection has no findings (nothing to
 * tell the operator), and the notice already issued when there is one (issuing is idempotent).
 */
export function issueInspectionNotice(
  tx: NoticeTx,
  input: Common & {
    inspectionId: string;
    /** The decision changed the ride's status: a notice is owed even without findings. */
    statusChanged?: boolean;
    /** What caused the change (findings, values over their limits), added to the status's reason. */
    statusCause?: string | null;
  },
): IssuedNotice | null {
  const existing = tx
    .select({ id: notices.id, reference: notices.reference })
    .from(notices)
    .where(and(eq(notices.inspectionId, input.inspectionId), eq(notices.kind, 'inspection')))
    .get();
  if (existing) {
    const recipients = tx
      .select({ recipient: noticeDeliveries.recipient })
      .from(noticeDeliveries)
      .where(eq(noticeDeliveries.noticeId, existing.id))
      .all()
      .map((r) => r.recipient);
    return { ...existing, recipients };
  }

  const inspection = tx
    .select({
      id: inspections.id,
      rideId: inspections.rideId,
      type: inspections.type,
      startedAt: inspections.startedAt,
      record: inspections.record,
      analysis: inspections.analysis,
      reviewNote: inspections.reviewNote,
      inspectorName: users.name,
    })
    .from(inspections)
    .innerJoin(users, eq(users.id, inspections.inspectorId))
    .where(eq(inspections.id, input.inspectionId))
    .get();
  if (!inspection) throw notFound('No such inspection.');
  numberRideFindings(tx, inspection.rideId);
  const rows = tx
    .select()
    .from(findings)
    .where(eq(findings.inspectionId, inspection.id))
    .orderBy(asc(findings.number))
    .all();
  if (rows.length === 0 && !input.statusChanged) return null;

  const parts = commonParts(tx, inspection.rideId, input);
  const { ride, id, ref, base } = parts;
  const operatingStatus = withCause(parts.operatingStatus, input.statusCause);
  const analysis = inspection.analysis;
  const design = analysis
    ? tx
        .select({ data: designVersions.data })
        .from(designVersions)
        .where(eq(designVersions.id, analysis.designVersionId))
        .get()
    : undefined;
  const docFindings = documentFindings(tx, rows);
  const checklist = inspection.record.checklist;

  const doc = noticeDocumentSchema.parse({
    ...base,
    kind: 'inspection',
    inspection: {
      id: inspection.id,
      type: inspection.type,
      typeLabel: `${inspectionTypeLabel[inspection.type]} inspection`,
      date: inspection.startedAt.slice(0, 10),
      inspectorName: inspection.inspectorName,
      inspectorCredential: null,
      designVersion: analysis?.designVersion ?? null,
      engineVersion: analysis?.engineVersion ?? null,
      governingCase: analysis?.governingCase ? LOAD_CASE_LABEL[analysis.governingCase] : null,
    },
    results: analysis ? resultsOf(analysis.envelope, measuredSources(inspection.record), base.units) : [],
    loadSummary: (analysis?.joints ?? []).map((j, joint) => {
      const maxForceN = design?.data.pivots.find((p) => p.joint === joint)?.maxForceN;
      const peak = formatBesideLimit(
        j.peakForceN,
        maxForceN === undefined ? null : { side: 'max', si: maxForceN },
        'force',
        base.units,
        false,
      );
      return { pivot: j.name, peakForce: peak.value, limit: peak.limit === null ? null : `≤ ${peak.limit}` };
    }),
    checklist:
      checklist.length > 0
        ? { total: checklist.length, failed: checklist.filter((a) => a.result === 'fail').length }
        : null,
    findings: docFindings,
    operatingStatus,
    reinspection: reinspectionOf(docFindings, operatingStatus),
    pivotLife: pivotLifePart(tx, ride.id, input.now),
    note: inspection.reviewNote,
  } satisfies NoticeDocument);

  return insertNotice(tx, {
    ...input,
    id,
    ref,
    doc,
    inspectionId: inspection.id,
    rideId: ride.id,
    operatorId: ride.operatorId,
    noticeEmails: ride.noticeEmails,
    findingIds: rows.map((f) => f.id),
  });
}

/**
 * The notice of a change of a ride's status: the status as it now stands, the reason, and the ride's
 * findings still open from approved inspections. Call it in the transaction that changed the status,
 * after the change.
 */
export function issueStatusNotice(
  tx: NoticeTx,
  input: Common & {
    rideId: string;
    reason: string | null;
    /** The inspection whose decision changed the status (a return with a stop): its values are listed. */
    inspectionId?: string | null;
    statusCause?: string | null;
  },
): IssuedNotice {
  numberRideFindings(tx, input.rideId);
  const rows = tx
    .select({ finding: findings })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .where(
      and(
        eq(findings.rideId, input.rideId),
        ne(findings.state, 'closed'),
        eq(inspections.reviewState, 'approved'),
      ),
    )
    .orderBy(asc(inspections.submittedAt), asc(findings.number))
    .all()
    .map((r) => r.finding);
  const { ride, id, ref, base, operatingStatus } = commonParts(tx, input.rideId, input);
  const status = withCause(
    { ...operatingStatus, reason: operatingStatus.reason ?? input.reason },
    input.statusCause,
  );
  const docFindings = documentFindings(tx, rows);
  const decided = input.inspectionId ? inspectionPart(tx, input.inspectionId, base.units) : null;

  const doc = noticeDocumentSchema.parse({
    ...base,
    kind: 'status_change',
    inspection: decided?.inspection ?? null,
    // Only what is near or over its limit: the values behind the change.
    results: (decided?.results ?? []).filter((r) => r.status !== 'within'),
    loadSummary: [],
    checklist: null,
    findings: docFindings,
    operatingStatus: status,
    reinspection: reinspectionOf(docFindings, status),
    pivotLife: pivotLifePart(tx, ride.id, input.now),
    note: input.reason,
  } satisfies NoticeDocument);

  return insertNotice(tx, {
    ...input,
    id,
    ref,
    doc,
    inspectionId: input.inspectionId ?? null,
    rideId: ride.id,
    operatorId: ride.operatorId,
    noticeEmails: ride.noticeEmails,
    findingIds: rows.map((f) => f.id),
  });
}
