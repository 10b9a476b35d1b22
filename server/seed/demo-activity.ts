/**
 * The demo's inspection history, so a fresh demo opens with a useful review desk: older inspections the
 * supervisor approved (with pin wear and clearances drifting toward their limits over months), and
 * submitted ones waiting for a decision — one over its limit, one with failed checklist items, one near a
 * limit, one with nothing flagged. Everything goes in through the real paths: the push service stores
 * each record and the server's own analysis checks it; only the supervisor's past decisions and findings
 * are written directly, with their historical dates (the demo seed writes no audit entries).
 *
 * Dates are relative to the day the demo is seeded. Ids are derived from fixed names and every record is
 * pushed with its own fixed batch id, so adding the history to an existing demo database happens exactly
 * once: a second run finds every record already stored (and the push service would answer a re-sent
 * batch from its record anyway), and changes nothing.
 */
import { desc, eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import { designVersions, rides, users } from '@/db/server/schema';
import { analyseRecord, previewOf } from '@/features/records/analysis';
import type { ChecklistAnswer, InspectionRecord, Reading } from '@/features/records/schema';
import { DEFAULT_DECLARATION_TEXT } from '@/features/instruments/schema';
import { keyIdOf, newPrivateKey, publicKeyOf } from '@/features/ledger';
import { findSessionUser } from '@/server/auth/service';
import type { Db } from '@/server/db';
import { findChecklistTemplate, listChecklistTemplates } from '@/server/registry/checklists';
import { addDays, dayInZone } from '@/lib/dates';
import { rideTimeZone } from '@/server/schedule-due';
import { queueToday, refreshQueue } from '@/server/queue/queue-refresh';
import { demoInstrumentSnapshot } from '@/server/seed/demo-instruments';
import { demoUuid } from '@/server/seed/demo-ids';
import {
  demoInspections,
  measuredBy,
  otherMeasurements,
  type DemoInspection,
} from '@/server/seed/demo-inspections';
import { demoPhoto } from '@/server/seed/demo-photos';
import { analyseOne } from '@/server/sync/analysis';
import { registerDeviceKey } from '@/server/auth/device-keys';
import { ingestBatch, type SigningKey } from '@/server/sync/ingest';

/** The demo's inspector, who made every demo inspection, and the supervisor who decided them. */
const demoInspectorEmail = 'inspector@pivotwatch.test';
const demoSupervisorEmail = 'supervisor@pivotwatch.test';

type Ctx = {
  db: Db;
  now: Date;
  rideOf: Map<string, { id: string; rideClass: (typeof rides.$inferSelect)['rideClass'] }>;
  inspector: { id: string; name: string };
};

function buildRecord(ctx: Ctx, spec: DemoInspection): InspectionRecord | null {
  const ride = ctx.rideOf.get(spec.serial);
  if (!ride) return null;
  const design = ctx.db
    .select({ id: designVersions.id, data: designVersions.data })
    .from(designVersions)
    .where(eq(designVersions.rideId, ride.id))
    .orderBy(desc(designVersions.version))
    .get();
  if (!design) return null;

  const submitted = new Date(
    ctx.now.getTime() - ((spec.ago.days ?? 0) * 24 + (spec.ago.hours ?? 0)) * 3_600_000,
  );
  const minutesBefore = (m: number) => new Date(submitted.getTime() - m * 60_000).toISOString();
  const readings: Reading[] = spec.readings.map(({ instrument, ...r }, i) => ({
    id: demoUuid(`${spec.key}:reading:${i}`),
    ...r,
    ...(instrument ? { instrument: demoInstrumentSnapshot(instrument, ctx.now) } : {}),
    spreadSI: r.spreadSI ?? null,
    takenAt: minutesBefore(40 - i * 3),
  }));

  const summary = listChecklistTemplates(ctx.db, { rideClass: ride.rideClass })[0];
  const template = summary ? findChecklistTemplate(ctx.db, summary.id) : null;
  const checklist: ChecklistAnswer[] = (template?.version.content.areas ?? []).flatMap((area) =>
    area.items.map((item) => {
      const fail = spec.fails?.[item.id];
      const by = measuredBy[item.id];
      const reading = by ? readings.findLast((r) => r.kind === by.kind && r.joint === by.joint) : undefined;
      const measurement = !item.measurementRequired
        ? undefined
        : reading
          ? { valueSI: reading.valueSI, unit: reading.unit, readingId: reading.id }
          : (otherMeasurements[item.id] ?? null);
      return {
        itemId: item.id,
        area: area.title,
        text: item.text,
        result: fail ? ('fail' as const) : ('pass' as const),
        ...(fail ? { note: fail } : {}),
        ...(measurement !== undefined ? { measurement } : {}),
      };
    }),
  );

  const preview = previewOf(
    analyseRecord(design.data, { readings, checklist }, template?.version.content ?? null),
  );
  return {
    id: demoUuid(spec.key),
    rideId: ride.id,
    designVersionId: design.id,
    templateId: template?.id ?? null,
    templateVersion: template?.version.version ?? null,
    type: spec.type,
    startedAt: minutesBefore(55),
    submittedAt: submitted.toISOString(),
    checklist,
    readings,
    photos: (spec.photos ?? []).map((p, i) => {
      const photo = demoPhoto(p.name);
      return {
        id: demoUuid(`${spec.key}:photo:${i}`),
        sha256: photo.sha256,
        mime: 'image/jpeg' as const,
        bytes: photo.bytes.length,
        caption: p.caption,
        joint: p.joint,
        checklistItemId: p.checklistItemId,
        takenAt: minutesBefore(30 - i),
      };
    }),
    ...(spec.notes ? { notes: spec.notes } : {}),
    preview: spec.olderPhone
      ? { ...preview, engineVersion: '0.9.8', status: preview.status === 'near' ? 'within' : preview.status }
      : preview,
    amendsId: spec.amends ? demoUuid(spec.amends) : null,
    declaration: {
      text: DEFAULT_DECLARATION_TEXT,
      declaredAt: submitted.toISOString(),
      declaredBy: ctx.inspector.id,
      declaredByName: ctx.inspector.name,
    },
  };
}

/**
 * Adds the demo's inspection history where it is missing. Needs the demo inspector, supervisor and rides
 * (by serial) with design data; inspections of a ride that lacks them are left out. Each record is pushed
 * in its own transaction, as a phone's would be (the push service sets up its connection outside any
 * transaction), and its analysis, decision and findings follow in one more. Returns how many inspections
 * it added.
 */
export function addDemoActivity(db: Db, now: Date = new Date()): number {
  const userId = (email: string) =>
    db.select({ id: users.id }).from(users).where(eq(users.email, email)).get()?.id;
  const inspectorId = userId(demoInspectorEmail);
  const inspector = inspectorId ? findSessionUser(db, inspectorId) : null;
  const supervisorId = userId(demoSupervisorEmail);
  if (!inspector || !supervisorId) return 0;
  const rideOf = new Map(
    db
      .select({ id: rides.id, serial: rides.serial, rideClass: rides.rideClass })
      .from(rides)
      .all()
      .flatMap((r) => (r.serial ? [[r.serial, { id: r.id, rideClass: r.rideClass }] as const] : [])),
  );
  const ctx: Ctx = { db, now, rideOf, inspector };
  // The demo inspector's phone: a key registered to them when the first record is pushed, which signs
  // each record as a phone would, so the demo rides' chains show signed records. Nothing keeps its
  // private half; a later run that adds history registers a key of its own.
  let phone: SigningKey | null = null;
  let added = 0;
  for (const spec of demoInspections) {
    // Already stored (or decided on since): nothing to build.
    if (
      db
        .select({ id: inspections.id })
        .from(inspections)
        .where(eq(inspections.id, demoUuid(spec.key)))
        .get()
    )
      continue;
    const record = buildRecord(ctx, spec);
    if (!record) continue;
    const receivedAt = new Date(Date.parse(record.submittedAt) + 5 * 60_000);
    if (!phone) {
      const privateKey = newPrivateKey();
      const publicKey = publicKeyOf(privateKey);
      registerDeviceKey(db, inspector, { publicKey, label: 'Demo phone' }, new Date(record.startedAt));
      phone = { keyId: keyIdOf(publicKey), privateKey };
    }
    const outcome = ingestBatch(
      db,
      inspector,
      { batchId: demoUuid(`${spec.key}:batch`), records: [record] },
      receivedAt,
      { signWith: phone },
    );
    const result = outcome.result.results[0];
    if (outcome.replayed || result?.status === 'duplicate') continue;
    if (result?.status !== 'accepted')
      throw new Error(`demo inspection ${spec.key} was refused: ${JSON.stringify(result?.issues)}`);
    db.transaction(() => finish(db, spec, record, supervisorId, receivedAt, now));
    added++;
  }
  return added;
}

/** The server's analysis of a newly stored demo record, and the supervisor's decision and findings. */
function finish(
  db: Db,
  spec: DemoInspection,
  record: InspectionRecord,
  supervisorId: string,
  receivedAt: Date,
  now: Date,
): void {
  const submitted = Date.parse(record.submittedAt);
  // Due dates count from the date at the ride's site, as the app and the queue read them.
  const siteDay = dayInZone(now, rideTimeZone(db, record.rideId));
  analyseOne(db, record.id, new Date(receivedAt.getTime() + 1_000));
  const reviewedAt = spec.review
    ? new Date(submitted + spec.review.hoursLater * 3_600_000).toISOString()
    : null;
  if (spec.review && reviewedAt)
    db.update(inspections)
      .set({
        reviewState: spec.review.state,
        reviewedAt,
        reviewedBy: supervisorId,
        reviewNote: spec.review.note ?? null,
      })
      .where(eq(inspections.id, record.id))
      .run();
  const findingAt = reviewedAt ?? new Date(submitted + 3_600_000).toISOString();
  (spec.findings ?? []).forEach((f, i) => {
    db.insert(findings)
      .values({
        id: demoUuid(`${spec.key}:finding:${i}`),
        inspectionId: record.id,
        rideId: record.rideId,
        number: i + 1,
        severity: f.severity,
        description: f.description,
        ruleRef: f.ruleRef ?? null,
        requiredAction: f.requiredAction ?? null,
        dueOn: f.dueInDays === undefined ? null : addDays(siteDay, f.dueInDays),
        photoShas: (f.photos ?? []).map((name) => demoPhoto(name).sha256),
        createdAt: findingAt,
        createdBy: supervisorId,
        updatedAt: findingAt,
        updatedBy: supervisorId,
      })
      .run();
  });
  // The decision and findings change the ride's place in the queue; judge it as of today.
  refreshQueue(db, queueToday(now), [record.rideId]);
}

/** A demo inspection's id, by its key. */
export function demoInspectionId(key: string): string {
  if (!demoInspections.some((s) => s.key === key)) throw new Error(`no demo inspection ${key}`);
  return demoUuid(key);
}
