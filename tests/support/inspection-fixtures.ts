import { randomUUID } from 'node:crypto';

import { type InspectionRecord, type PhotoRef, inspectionTypes } from '@/features/records/schema';
import type { RideSummary } from '@/features/rides/schema';

/** Invented demo values; only the shape matters to the sync tests. */
export function makeRecord(overrides: Partial<InspectionRecord> = {}): InspectionRecord {
  return {
    id: randomUUID(),
    rideId: 'ride-demo-1',
    designVersionId: null,
    templateId: null,
    templateVersion: null,
    type: inspectionTypes[0],
    startedAt: '2026-06-01T07:30:00.000Z',
    submittedAt: '2026-06-01T08:05:00.000Z',
    checklist: [{ itemId: 'item-1', area: 'Main pivot', text: 'Pin retainer in place', result: 'pass' }],
    readings: [
      {
        id: randomUUID(),
        kind: 'period',
        joint: 0,
        label: 'Swing period',
        valueSI: 6.2,
        unit: 's',
        method: 'tap_timer',
        spreadSI: 0.08,
        takenAt: '2026-06-01T07:40:00.000Z',
      },
    ],
    photos: [],
    preview: null,
    ...overrides,
  };
}

export function photoRef(sha256: string, mime: PhotoRef['mime'] = 'image/jpeg', bytes = 100): PhotoRef {
  return {
    id: randomUUID(),
    sha256,
    mime,
    bytes,
    caption: 'Main pivot, left side',
    joint: 0,
    checklistItemId: null,
    takenAt: '2026-06-01T07:45:00.000Z',
  };
}

/** A few bytes that start like a JPEG file (SOI marker FF D8 FF), different per `seed`. */
export function fakeJpeg(seed: number, size = 64): Uint8Array {
  const bytes = new Uint8Array(size);
  bytes.set([0xff, 0xd8, 0xff, 0xe0]);
  for (let i = 4; i < size; i++) bytes[i] = (seed * 31 + i * 7) & 0xff;
  return bytes;
}

/** A ride as the ride list gives it, with only what a test sets; invented demo values. */
export function makeRideSummary(
  overrides: Partial<RideSummary> & Pick<RideSummary, 'id' | 'name'>,
): RideSummary {
  return {
    rideClass: 'rotating_arm',
    description: null,
    maker: null,
    model: null,
    serial: null,
    year: null,
    status: 'in_service',
    statusReason: null,
    statusSince: null,
    siteId: null,
    siteName: null,
    operatorCompanyId: 'op-1',
    operatorName: 'Tamsworth Pier Leisure',
    ...overrides,
  };
}
