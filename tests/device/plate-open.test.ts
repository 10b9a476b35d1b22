/**
 * Where a scanned plate leads (features/inspections/plate-open.ts), from the phone's database alone: the
 * real device schema and migrations in memory, filled as a sync fills them. The pivots are the demo
 * design's (server/seed/demo-design.ts); "Pivot n" counts joints from 1, as the Readings step does.
 */
import { randomUUID } from 'node:crypto';

import { saveDraft } from '@/features/device-db';
import { openPlate } from '@/features/inspections/plate-open';
import { writeAssignments, writeDesignVersions, writeRides } from '@/features/sync/cache';
import { tidebreakerDesign } from '@/server/seed/demo-design';
import { makeRideSummary } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';

const tide = makeRideSummary({ id: 'r-tide', name: 'Tidebreaker', siteName: 'Lowfield Common' });
const bare = makeRideSummary({ id: 'r-bare', name: 'Plain Carousel' });
const design = {
  id: 'dv-tide-1',
  rideId: tide.id,
  version: 1,
  createdAt: '2026-06-01T08:00:00.000Z',
  createdByName: 'Rowan Ashby',
  reason: 'Entered from the design report',
  origin: 'seed' as const,
  approvalState: 'in_force' as const,
  data: tidebreakerDesign,
};

let dev: MemoryDeviceDb;
beforeEach(async () => {
  dev = await memoryDeviceDb();
  await writeRides(dev, [tide, bare]);
  await writeDesignVersions(dev, [design]);
});

test('a ride on the phone: its own plate shows the ride', async () => {
  expect(await openPlate(dev, { rideId: tide.id, joint: null })).toEqual({ kind: 'ride', ride: tide });
});

test('a pivot, nothing in progress, nothing assigned: start one, the inspector picks the type', async () => {
  const pivot = tidebreakerDesign.pivots.find((p) => p.joint === 1)!;
  expect(await openPlate(dev, { rideId: tide.id, joint: 1 })).toEqual({
    kind: 'start',
    ride: tide,
    joint: 1,
    pivotName: pivot.name,
    type: null,
  });
});

test('a pivot of an assigned ride starts the assigned type', async () => {
  // An assignment as the register's schedule list serves it (scheduleSchema).
  await writeAssignments(dev, [
    {
      id: 'a-1',
      rideId: tide.id,
      rideName: tide.name,
      rideClass: 'rotating_arm',
      rideStatus: 'in_service',
      siteName: 'Lowfield Common',
      operatorName: 'Tamsworth Pier Leisure',
      inspectionType: 'follow_up',
      intervalDays: null,
      lastDoneOn: null,
      dueOn: '2026-12-01',
      nextDueOn: '2026-12-01',
      dueStatus: 'overdue',
      daysUntilDue: -3,
      assignedTo: { id: 'u-ins', name: 'Tomas Reyne' },
      assignedAt: '2026-11-20T09:00:00.000Z',
      notes: null,
      createdAt: '2026-11-20T09:00:00.000Z',
    },
  ]);
  expect(await openPlate(dev, { rideId: tide.id, joint: 0 })).toMatchObject({
    kind: 'start',
    joint: 0,
    type: 'follow_up',
  });
});

test('a pivot with inspections of its ride in progress: the latest one continues', async () => {
  const older = randomUUID();
  const newer = randomUUID();
  await saveDraft(dev, { id: older, rideId: tide.id, data: {} }, new Date('2026-06-01T08:00:00Z'));
  await saveDraft(dev, { id: newer, rideId: tide.id, data: {} }, new Date('2026-06-01T09:00:00Z'));
  await saveDraft(dev, { id: randomUUID(), rideId: bare.id, data: {} }, new Date('2026-06-01T10:00:00Z'));
  expect(await openPlate(dev, { rideId: tide.id, joint: 2 })).toEqual({
    kind: 'continue',
    draftId: newer,
    joint: 2,
  });
});

test('what the phone cannot place gets a plain message, and nothing is written', async () => {
  const before = dev.sqlite.serialize();
  const missingRide = await openPlate(dev, { rideId: 'r-elsewhere', joint: 0 });
  expect(missingRide).toEqual({ kind: 'refused', message: expect.stringMatching(/not on your phone.*Sync/) });
  const noDesign = await openPlate(dev, { rideId: bare.id, joint: 0 });
  expect(noDesign).toEqual({
    kind: 'refused',
    message: expect.stringMatching(/^Plain Carousel’s design data is not on your phone/),
  });
  const n = tidebreakerDesign.bodies.length;
  const noPivot = await openPlate(dev, { rideId: tide.id, joint: n });
  expect(noPivot).toEqual({
    kind: 'refused',
    message: expect.stringMatching(new RegExp(`^Tidebreaker has no pivot ${n + 1} .*out of date`)),
  });
  expect(Buffer.compare(dev.sqlite.serialize(), before)).toBe(0);
});
