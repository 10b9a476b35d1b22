/**
 * The review queue's wear flag: when a pin's wear is projected (cautiously, by the 95 % prediction bound)
 * to reach its limit before the next scheduled inspection, the ride's queue rows say so with the earlier
 * inspection date suggested, and count as near a limit. The readings are the hand-computed series of
 * tests/server/wear.test.ts (ordinary least squares and the prediction interval of a new observation, e.g.
 * Montgomery & Runger §11.7, from memory), whose bound reaches the limit on 2026-07-31, suggested 14 days
 * earlier (2026-07-17), before the periodic inspection due on 2026-09-01.
 */
import { randomUUID } from 'node:crypto';

import { and, eq } from 'drizzle-orm';

import { runningLog } from '@/db/server/life';
import { rideLifeFlags } from '@/db/server/ndt';
import { reviewQueue } from '@/db/server/review';
import { inspectionSchedules } from '@/db/server/schema';
import type { Reading } from '@/features/records/schema';
import { queueResponseSchema } from '@/features/review/schema';
import { refreshRideLifeFlags } from '@/server/pivot-life/flags';
import { refreshQueue } from '@/server/queue/queue-refresh';

import type { TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { pushAccepted } from './review-desk-fixtures';
import { demoRide, makeRecord } from './sync-fixtures';

jest.setTimeout(60_000);

const today = '2026-06-15';
let server: TestServer;
let api: Clients;
let wheel: ReturnType<typeof demoRide>;

const um = 1e-6;
const days = ['2026-01-05', '2026-02-04', '2026-03-06', '2026-04-05', '2026-05-05'];
const w = [0, 10, 25, 32, 50];

const reading = (kind: 'pin_diameter' | 'clearance', valueSI: number, takenAt: string): Reading => ({
  id: randomUUID(),
  kind,
  joint: 0,
  label: kind,
  valueSI,
  unit: 'mm',
  method: kind === 'clearance' ? 'dial_indicator' : 'micrometer',
  takenAt,
});

beforeAll(async () => {
  server = await makePinnedServer(new Date(`${today}T10:00:00Z`));
  api = await demoClients(server.app);
  wheel = demoRide(server.db, 'Lantern Wheel');
  // The hand computation is by days alone: without the demo's running log no date comes from cycles.
  server.db.delete(runningLog).where(eq(runningLog.rideId, wheel.id)).run();
});
afterAll(() => server.close());

async function wheelRows() {
  const res = await api.supervisor.get(
    `/api/review/queue?q=${encodeURIComponent('lantern wheel')}&pageSize=100`,
  );
  expect(res.status).toBe(200);
  return queueResponseSchema.parse(res.body).items.filter((i) => i.rideId === wheel.id);
}

test('a wear limit projected before the next inspection flags the ride’s rows with the suggested date', async () => {
  const pivot = wheel.design.pivots.find((p) => p.joint === 0)!;
  const records = days.map((day, i) =>
    makeRecord(wheel, {
      type: 'periodic',
      startedAt: `${day}T07:00:00.000Z`,
      submittedAt: `${day}T10:00:00.000Z`,
      readings: [
        reading('pin_diameter', pivot.minimumDiameterM + (100 - w[i]) * um, `${day}T09:00:00.000Z`),
        reading('clearance', pivot.maxClearanceM - (100 - w[i]) * um, `${day}T09:00:00.000Z`),
      ],
    }),
  );
  await pushAccepted(server.db, api.inspector, records);
  // The next periodic inspection (the type that measured the wear) is due on 1 September.
  for (const [type, dueOn] of [
    ['periodic', '2026-09-01'],
    ['annual', '2026-12-01'],
  ] as const)
    server.db
      .update(inspectionSchedules)
      .set({ dueOn })
      .where(and(eq(inspectionSchedules.rideId, wheel.id), eq(inspectionSchedules.inspectionType, type)))
      .run();
  refreshRideLifeFlags(server.db, wheel.id, today);

  expect(
    server.db.select().from(rideLifeFlags).where(eq(rideLifeFlags.rideId, wheel.id)).get(),
  ).toMatchObject({
    wearLimitOn: '2026-07-31',
    wearSuggestedOn: '2026-07-17',
  });
  const rows = await wheelRows();
  expect(rows.length).toBeGreaterThan(0);
  for (const row of rows) {
    expect(row).toMatchObject({ wearLimitOn: '2026-07-31', wearSuggestedOn: '2026-07-17' });
    // Near a limit, unless something more urgent already holds the row.
    expect(['over', 'failed', 'near']).toContain(row.urgency);
  }
  // The queue is what a full rebuild makes of the same data.
  const all = () => server.db.select().from(reviewQueue).orderBy(reviewQueue.key).all();
  const kept = all();
  refreshQueue(server.db, today);
  expect(all()).toEqual(kept);

  // An inspection booked before the cautious date clears the flag.
  server.db
    .update(inspectionSchedules)
    .set({ dueOn: '2026-07-10' })
    .where(and(eq(inspectionSchedules.rideId, wheel.id), eq(inspectionSchedules.inspectionType, 'periodic')))
    .run();
  refreshRideLifeFlags(server.db, wheel.id, today);
  for (const row of await wheelRows())
    expect(row).toMatchObject({ wearLimitOn: null, wearSuggestedOn: null });
});
