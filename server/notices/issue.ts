/**
 * Issuing a notice: the document is built once from the database as it stands, checked against
 * `noticeDocumentSchema`, and stored frozen with one pending e-mail delivery per notice address of the
 * operator company. Everything runs in the caller's transaction, so a notice exists exactly when the
 * approval or status change that caused it does.
 */
import { randomUUID } from 'node:crypto';

import { and, asc, eq, inArray, ne, sql } from 'drizzle-orm';

import { inspectionPhotos, inspections } from '@/db/server/inspections';
import { noticeDeliveries, noticeFindings, notices } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { companies, designVersions, rides, sites, users } from '@/db/server/schema';
import { CAUTION_FULL } from '@/lib/caution-text';
import {
  formatBesideLimit,
  formatEnvelopeItem,
  measuredSources,
  sortByConcern,
} from '@/features/loads/format';
import { noticeDocumentSchema, type NoticeDocument } from '@/features/notices/schema';
import { inspectionTypeLabel } from '@/features/registry/schema';
import { severityInfo } from '@/features/review/schema';
import { rideClassLabel } from '@/features/rides/schema';
import type { Db } from '@/server/db';
import { notFound } from '@/server/http/errors';
import { deliveryKey } from '@/server/mail/mailer';
import { deliveriesQueued } from '@/server/notices/nudge';
import { appealText, noticeReference, rideStatusWords, roleWords } from '@/server/notices/words';
import { recordAudit } from '@/server/registry/audit';
import { numberRideFindings } from '@/server/findings/findings';

export type NoticeTx = Pick<Db, 'select' | 'insert' | 'update' | 'run' | 'get' | 'all'>;

export type IssuedNotice = { id: string; reference: string; recipients: string[] };

type FindingRow = typeof findings.$inferSelect;

/** The inspection body issuing notices: the register's (first) inspection-body company. */
function issuerOf(tx: NoticeTx): NoticeDocument['issuer'] {
  const body = tx
    .select({ name: companies.name, address: companies.address, phone: companies.phone })
    .from(companies)
    .where(eq(companies.kind, 'inspection_body'))
    .orderBy(asc(companies.createdAt))
    .get();
  return body ?? { name: 'The inspection body', address: null, phone: null };
}

function rideContext(tx: NoticeTx, rideId: string) {
  const ride = tx
    .select({
      id: rides.id,
      name: rides.name,
      rideClass: rides.rideClass,
      maker: rides.maker,
      model: rides.model,
      serial: rides.serial,
      year: rides.year,
      status: rides.status,
      statusReason: rides.statusReason,
      operatorId: companies.id,
      operatorName: companies.name,
      operatorAddress: companies.address,
      noticeEmails: companies.noticeEmails,
      siteName: sites.name,
      siteAddress: sites.address,
      siteLocality: sites.locality,
    })
    .from(rides)
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .leftJoin(sites, eq(sites.id, rides.siteId))
    .where(eq(rides.id, rideId))
    .get();
  if (!ride) throw notFound('No such ride.');
  return ride;
}

function signerOf(tx: NoticeTx, userId: string, signedAt: string): NoticeDocument['signature'] {
  const user = tx
    .select({ name: users.name, role: users.role })
    .from(users)
    .where(eq(users.id, userId))
    .get();
  if (!user) throw notFound('No such user.');
  return { name: user.name, role: roleWords[user.role], signedAt };
}

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

/** Photo captions of the inspections the findings belong to, by inspection and SHA-256. */
function captionsFor(tx: NoticeTx, rows: FindingRow[]) {
  const ids = [...new Set(rows.map((f) => f.inspectionId))];
  const captions = new Map<string, string>();
  if (ids.length === 0) return captions;
  for (const p of tx
    .select({
      inspectionId: inspectionPhotos.inspectionId,
      sha256: inspectionPhotos.sha256,
      caption: inspectionPhotos.caption,
    })
    .from(inspectionPhotos)
    .where(inArray(inspectionPhotos.inspectionId, ids))
    .all())
    captions.set(`${p.inspectionId}:${p.sha256}`, p.caption);
  return captions;
}

function documentFindings(tx: NoticeTx, rows: FindingRow[]): NoticeDocument['findings'] {
  const captions = captionsFor(tx, rows);
  return rows.map((f) => ({
    id: f.id,
    number: f.rideNumber ?? f.number,
    severity: f.severity,
    description: f.description,
    ruleRef: f.ruleRef,
    requiredAction: f.requiredAction,
    dueOn: f.dueOn,
    state: f.state,
    photos: f.photoShas.map((sha256, i) => ({
      sha256,
      caption: captions.get(`${f.inspectionId}:${sha256}`) ?? `Photo ${i + 1}`,
    })),
  }));
}

/**
 * Re-inspection is needed when a finding that stops operation is still open, or the ride is not in plain
 * service: only a competent person's check can put it back.
 */
function reinspectionOf(
  docFindings: NoticeDocument['findings'],
  status: NoticeDocument['operatingStatus'],
): NoticeDocument['reinspection'] {
  const blocking = docFindings.filter((f) => f.state !== 'closed' && !severityInfo[f.severity].mayOperate);
  if (blocking.length > 0) {
    const list = blocking.map((f) => f.number).join(', ');
    return {
      required: true,
      reason:
        `Finding${blocking.length > 1 ? 's' : ''} ${list} must be corrected and verified closed by the ` +
        'inspection body, and a follow-up inspection approved, before the ride carries riders again.',
    };
  }
  if (status.status !== 'in_service')
    return {
      required: true,
      reason:
        `The ride is ${rideStatusWords[status.status].toLowerCase()}; it returns to service only after an ` +
        'approved follow-up inspection or a supervisor’s recorded override.',
    };
  return { required: false, reason: null };
}

const joinLines = (...parts: (string | null)[]) => {
  const text = parts.filter((p): p is string => !!p && p.trim() !== '').join('\n');
  return text === '' ? null : text;
};

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
    appeal: appealText(issuer.name, ref.reference),
    caution: CAUTION_FULL,
    signature: signerOf(tx, input.userId, issuedAt),
    url: `${input.appUrl.replace(/\/+$/, '')}/notices/${id}`,
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
    },
    results: analysis ? resultsOf(analysis.envelope, measuredSources(inspection.record)) : [],
    loadSummary: (analysis?.joints ?? []).map((j, joint) => {
      const maxForceN = design?.data.pivots.find((p) => p.joint === joint)?.maxForceN;
      const peak = formatBesideLimit(
        j.peakForceN,
        maxForceN === undefined ? null : { side: 'max', si: maxForceN },
        'force',
        'si',
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
  const decided = input.inspectionId ? inspectionPart(tx, input.inspectionId) : null;

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

const withCause = (status: NoticeDocument['operatingStatus'], cause: string | null | undefined) =>
  cause ? { ...status, reason: status.reason ? `${status.reason} — ${cause}` : cause } : status;

/** The inspection block and its results against the limits, as an inspection notice shows them. */
function inspectionPart(tx: NoticeTx, inspectionId: string) {
  const row = tx
    .select({
      id: inspections.id,
      type: inspections.type,
      startedAt: inspections.startedAt,
      analysis: inspections.analysis,
      record: inspections.record,
      inspectorName: users.name,
    })
    .from(inspections)
    .innerJoin(users, eq(users.id, inspections.inspectorId))
    .where(eq(inspections.id, inspectionId))
    .get();
  if (!row) throw notFound('No such inspection.');
  return {
    inspection: {
      id: row.id,
      type: row.type,
      typeLabel: `${inspectionTypeLabel[row.type]} inspection`,
      date: row.startedAt.slice(0, 10),
      inspectorName: row.inspectorName,
      inspectorCredential: null,
      designVersion: row.analysis?.designVersion ?? null,
      engineVersion: row.analysis?.engineVersion ?? null,
    },
    results: row.analysis ? resultsOf(row.analysis.envelope, measuredSources(row.record)) : [],
  };
}

/**
 * Each value against its limit, formatted once by the one rule (lib/measured-format.ts) and frozen, so the
 * app, the e-mail and the PDF print the same strings; measured values as the inspector typed them.
 */
export function resultsOf(
  envelope: Parameters<typeof sortByConcern>[0],
  sources: ReturnType<typeof measuredSources>,
): NoticeDocument['results'] {
  return sortByConcern(envelope).map((item) => {
    const source = sources.get(item.id);
    const shown = formatEnvelopeItem(item, 'si', source);
    return {
      label: item.label,
      value: shown.value,
      limit: shown.limit,
      ratio: Number.isFinite(item.ratio) ? item.ratio : null,
      status: item.status,
      ...(Number.isFinite(item.value) && {
        measured: {
          valueSI: item.value,
          quantity: item.quantity,
          entered: source?.entered ?? null,
          unit: source?.unit ?? null,
        },
      }),
    };
  });
}
