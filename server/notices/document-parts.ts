/**
 * The parts of a notice document, read from the database as it stands: the issuer, the ride and its
 * operator, the signer, the findings with their photo captions, whether re-inspection is needed, and an
 * inspection's results against its limits. `issue.ts` puts them together, checks and stores the document.
 */
import { asc, eq, inArray } from 'drizzle-orm';

import { inspectionPhotos, inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import { companies, rides, sites, users } from '@/db/server/schema';
import { formatEnvelopeItem, measuredSources, sortByConcern } from '@/features/loads/format';
import { LOAD_CASE_LABEL } from '@/features/loads/load-cases';
import type { NoticeDocument } from '@/features/notices/schema';
import { lifeNoticePart } from '@/features/pivot-life/life-words';
import { inspectionTypeLabel } from '@/features/registry/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import type { Db } from '@/server/db';
import { notFound } from '@/server/http/errors';
import { rideLife } from '@/server/pivot-life/life';
import { rideStatusWords, roleWords } from '@/server/notices/words';
import { formatCalendarDate, isoDay } from '@/lib/dates';
import type { UnitSystem } from '@/lib/units';

type Reader = Pick<Db, 'select'>;

type FindingRow = typeof findings.$inferSelect;

/** The inspection body issuing notices: the register's (first) inspection-body company. */
export function issuerOf(tx: Reader): NoticeDocument['issuer'] {
  const body = tx
    .select({ name: companies.name, address: companies.address, phone: companies.phone })
    .from(companies)
    .where(eq(companies.kind, 'inspection_body'))
    .orderBy(asc(companies.createdAt))
    .get();
  return body ?? { name: 'The inspection body', address: null, phone: null };
}

export function rideContext(tx: Reader, rideId: string) {
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
      noticeUnits: companies.noticeUnits,
      noticePaper: companies.noticePaper,
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

export function signerOf(tx: Reader, userId: string, signedAt: string): NoticeDocument['signature'] {
  const user = tx
    .select({ name: users.name, role: users.role })
    .from(users)
    .where(eq(users.id, userId))
    .get();
  if (!user) throw notFound('No such user.');
  return { name: user.name, role: roleWords[user.role], signedAt };
}

/** Photo captions of the inspections the findings belong to, by inspection and SHA-256. */
function captionsFor(tx: Reader, rows: FindingRow[]) {
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

export function documentFindings(tx: Reader, rows: FindingRow[]): NoticeDocument['findings'] {
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
export function reinspectionOf(
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

export const joinLines = (...parts: (string | null)[]) => {
  const text = parts.filter((p): p is string => !!p && p.trim() !== '').join('\n');
  return text === '' ? null : text;
};

export const withCause = (status: NoticeDocument['operatingStatus'], cause: string | null | undefined) =>
  cause ? { ...status, reason: status.reason ? `${status.reason} — ${cause}` : cause } : status;

/** The inspection block and its results against the limits, as an inspection notice shows them. */
export function inspectionPart(tx: Reader, inspectionId: string, system: UnitSystem) {
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
      governingCase: row.analysis?.governingCase ? LOAD_CASE_LABEL[row.analysis.governingCase] : null,
    },
    results: row.analysis ? resultsOf(row.analysis.envelope, measuredSources(row.record), system) : [],
  };
}

/**
 * Each value against its limit, formatted once by the one rule (lib/measured-format.ts) and frozen, so the
 * app, the e-mail and the PDF print the same strings; measured values as the inspector typed them, or in
 * the operator's other unit system with the typed precision carried over.
 */
export function resultsOf(
  envelope: Parameters<typeof sortByConcern>[0],
  sources: ReturnType<typeof measuredSources>,
  system: UnitSystem,
): NoticeDocument['results'] {
  return sortByConcern(envelope).map((item) => {
    const source = sources.get(item.id);
    const shown = formatEnvelopeItem(item, system, source);
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

/**
 * The ride's pivot life as the notice carries it, in the documents' UTC dates; null when the ride has
 * nothing to say there. A life that cannot be worked out (damaged data) leaves the notice without it rather
 * than stopping the decision that issues the notice.
 */
export function pivotLifePart(tx: Reader, rideId: string, now: Date): NoticeDocument['pivotLife'] {
  try {
    return lifeNoticePart(rideLife(tx, rideId, isoDay(now)), formatCalendarDate);
  } catch {
    return null;
  }
}
