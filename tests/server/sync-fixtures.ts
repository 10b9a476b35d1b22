/**
 * Records and photo bytes for the sync tests. Values are invented demo data; the physics checks that use
 * them name their source where they make one.
 */
import { createHash, randomUUID } from 'node:crypto';

import { desc, eq } from 'drizzle-orm';

import { designVersions, rides } from '@/db/server/schema';
import { analyseInspection, previewOf } from '@/features/records/analysis';
import { checkAgainstDesign } from '@/features/records/plausibility';
import type { InspectionRecord, PhotoRef, Reading } from '@/features/records/schema';
import type { DesignData } from '@/features/loads/design-schema';
import type { Db } from '@/server/db';

export const sha256Hex = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/** A demo ride by name, with its current design-data version. */
export function demoRide(db: Db, name: string): { id: string; designVersionId: string; design: DesignData } {
  const ride = db.select({ id: rides.id }).from(rides).where(eq(rides.name, name)).get();
  if (!ride) throw new Error(`no demo ride ${name}`);
  const design = db
    .select({ id: designVersions.id, data: designVersions.data })
    .from(designVersions)
    .where(eq(designVersions.rideId, ride.id))
    .orderBy(desc(designVersions.version))
    .get();
  if (!design) throw new Error(`demo ride ${name} has no design data`);
  return { id: ride.id, designVersionId: design.id, design: design.data };
}

/** Bytes that start with a real file signature and differ by `seed`; enough for a type check by magic number. */
export function imageBytes(seed: number, kind: 'jpeg' | 'png' | 'webp' = 'jpeg', size = 256): Uint8Array {
  const bytes = new Uint8Array(size);
  for (let i = 0; i < size; i++) bytes[i] = (seed * 131 + i * 17 + (seed >> 3)) & 0xff;
  if (kind === 'jpeg') bytes.set([0xff, 0xd8, 0xff, 0xe0]);
  if (kind === 'png') bytes.set([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  if (kind === 'webp') {
    bytes.set([0x52, 0x49, 0x46, 0x46]);
    bytes.set([0x57, 0x45, 0x42, 0x50], 8);
  }
  return bytes;
}

export function photoRefFor(bytes: Uint8Array, patch: Partial<PhotoRef> = {}): PhotoRef {
  return {
    id: randomUUID(),
    sha256: sha256Hex(bytes),
    mime: 'image/jpeg',
    bytes: bytes.length,
    caption: 'Main axle, drive side',
    joint: 0,
    checklistItemId: null,
    takenAt: '2026-05-04T08:12:00.000Z',
    ...patch,
  };
}

export const rpmToRadS = (rpm: number) => (rpm * 2 * Math.PI) / 60;

export function speedReading(rpm: number, joint = 0, patch: Partial<Reading> = {}): Reading {
  return {
    id: randomUUID(),
    kind: 'speed',
    joint,
    label: 'Arm speed',
    valueSI: rpmToRadS(rpm),
    unit: 'rpm',
    method: 'tap_timer',
    spreadSI: 0.002,
    takenAt: '2026-05-04T08:10:00.000Z',
    ...patch,
  };
}

/** Filler readings that do not change the load check (kind "other"), to reach a given reading count. */
export function otherReading(i: number): Reading {
  return {
    id: randomUUID(),
    kind: 'other',
    joint: null,
    label: `Brake gap ${i + 1}`,
    valueSI: 0.002 + i * 1e-5,
    unit: 'mm',
    method: 'gauge',
    takenAt: '2026-05-04T08:20:00.000Z',
  };
}

/**
 * The reading as the phone stores it after the inspector confirmed a value far from the design motion
 * (the phone asks before such a reading counts); unchanged when it is near the design or not checked.
 */
export function confirmedIfImplausible(design: DesignData, r: Reading): Reading {
  const check = checkAgainstDesign(design, r);
  if (!check || check.plausible || r.plausibility) return r;
  return {
    ...r,
    plausibility: { designSI: check.designSI, ratio: check.ratio, confirmedAt: '2026-05-04T08:11:00.000Z' },
  };
}

/** The inspector's declaration every record now carries (the server refuses a record without one). */
export const testDeclaration = {
  text: 'I carried out this inspection and recorded only what I saw and measured.',
  declaredAt: '2026-05-04T08:40:00.000Z',
  declaredBy: 'demo-inspector',
  declaredByName: 'Test Inspector',
};

/**
 * A complete record as the phone would submit it, with the phone's own preview computed by the shared
 * analysis when `design` is given. With `design`, readings far from its motion carry the inspector's
 * confirmation, as the phone's would, unless `confirm` is false (to test the server's refusal).
 */
export function makeRecord(
  ride: { id: string; designVersionId: string | null; design?: DesignData },
  patch: Partial<InspectionRecord> = {},
  { confirm = true }: { confirm?: boolean } = {},
): InspectionRecord {
  const given = patch.readings ?? [speedReading(11.5)];
  const design = ride.design;
  const readings = design && confirm ? given.map((r) => confirmedIfImplausible(design, r)) : given;
  return {
    id: randomUUID(),
    rideId: ride.id,
    designVersionId: ride.designVersionId,
    templateId: null,
    templateVersion: null,
    type: 'periodic',
    startedAt: '2026-05-04T08:00:00.000Z',
    submittedAt: '2026-05-04T08:40:00.000Z',
    checklist: [
      { itemId: 'item-a', area: 'Main axle', text: 'Retaining plate bolts tight', result: 'pass' },
      {
        itemId: 'item-b',
        area: 'Gondolas',
        text: 'Lap bars lock',
        result: 'fail',
        note: 'Seat 3 slow to lock',
      },
    ],
    photos: [],
    notes: 'Windy, 8 m/s from the sea.',
    preview: ride.design ? previewOf(analyseInspection(ride.design, readings)) : null,
    amendsId: null,
    declaration: testDeclaration,
    ...patch,
    // A record submitted at a given time started 40 minutes before it (the server refuses a start after
    // the submission), unless the test gives its own start.
    ...(patch.submittedAt && !patch.startedAt
      ? { startedAt: new Date(Date.parse(patch.submittedAt) - 40 * 60_000).toISOString() }
      : {}),
    // After the patch: its readings are the ones given, confirmed above where the phone would have asked.
    readings,
  };
}
