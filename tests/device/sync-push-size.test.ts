/**
 * Records that carry ride cycles recorded with the phone are large: the phone splits its outbox so that no
 * push goes over what the server accepts (express.json's 16 MB limit on /api/sync/push, server/app.ts),
 * and a single large record still goes on its own.
 */
import { randomUUID } from 'node:crypto';

import { saveDraft, submitDraft } from '@/features/device-db/drafts';
import { trimToCycles } from '@/features/motion-recording';
import type { MotionRecord } from '@/features/records/motion-record-schema';
import { MAX_BATCH_BYTES, pushOutbox } from '@/features/sync/push';

import { FakeSyncServer } from './fake-sync-server';
import { makeRecord } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, signedInDeviceDb } from '@/tests/support/memory-device-db';
import { swingTrace } from '@/tests/support/motion-fixtures';

jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

let dev: MemoryDeviceDb;
beforeEach(async () => {
  dev = await signedInDeviceDb();
});
afterEach(async () => {
  await dev.close();
});

/** A long recording: 57 whole swings at 100 Hz, close to the 24,000 samples a record may hold. */
function longRecord(): MotionRecord {
  const out = trimToCycles(
    swingTrace({ rateHz: 100, durationS: 230, noiseRadS: 0.003 }),
    { joint: 0, seat: 0, axis: 'z', sign: -1, parentRateRadS: 0 },
    '2026-06-01T09:00:00.000Z',
    randomUUID(),
  );
  if (!out.ok) throw new Error(out.message);
  return out.record;
}

test('big records go in batches under the size the server takes, every one delivered once', async () => {
  const big = longRecord();
  expect(big.timeS.length).toBeGreaterThan(20_000);
  const records = [];
  for (let i = 0; i < 3; i++) {
    const motionRecords = [0, 1, 2, 3].map((joint) => ({ ...big, id: randomUUID(), joint }));
    const rec = { ...makeRecord(), motionRecords };
    await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: {} });
    records.push(await submitDraft(dev, rec));
  }
  const size = JSON.stringify(records[0]).length;
  // Three of them do not fit in one batch, two do not either (as built here), one does.
  expect(size * 2).toBeGreaterThan(MAX_BATCH_BYTES);
  expect(size).toBeLessThan(MAX_BATCH_BYTES);

  const server = new FakeSyncServer();
  const bodies: number[] = [];
  const push = server.push.bind(server);
  server.push = async (body) => {
    bodies.push(JSON.stringify(body).length);
    return push(body);
  };
  const report = await pushOutbox(server, dev, { newId: randomUUID, now: () => new Date(), force: false });
  expect(report).toMatchObject({ accepted: 3, rejected: 0, failure: null });
  expect(report.batches).toBe(3);
  for (const b of bodies) expect(b).toBeLessThan(16 * 1024 * 1024);
});
