/**
 * The progress one sync run reports (features/sync/sync-progress.ts), over the real device database
 * (SQLite in memory, real migrations) and the fake server with the real server's idempotency
 * (tests/device/fake-sync-server.ts). What the counts are checked against is outside the engine: the
 * records and photos the fake server holds, and the photos' sizes as written to the phone's store. A run
 * that stops keeps its counts where it stopped, and the phone still holds everything not yet sent.
 */
import { randomUUID } from 'node:crypto';

import { listOutbox } from '@/features/device-db/outbox';
import { getPhotoBlob, putPhotoBlob } from '@/features/device-db/photos';
import { submitDraft } from '@/features/device-db/drafts';
import { MAX_BATCH } from '@/features/sync/push';
import type { Count, SyncProgress } from '@/features/sync/sync-progress';
import { syncOnce } from '@/features/sync/sync-run';

import { FakeSyncServer } from './fake-sync-server';
import { fakeJpeg, makeRecord, photoRef } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, signedInDeviceDb } from '@/tests/support/memory-device-db';

jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

let dev: MemoryDeviceDb;
let server: FakeSyncServer;
const T0 = new Date('2026-06-01T09:00:00.000Z');

beforeEach(async () => {
  dev = await signedInDeviceDb();
  server = new FakeSyncServer();
});
afterEach(async () => {
  await dev.close();
});

/** `records` inspections, the first of which carries `photos` photos of sizes 300, 301, … bytes. */
async function submit(records: number, photos: number) {
  const sizes = Array.from({ length: photos }, (_, i) => 300 + i);
  const refs = [];
  for (const [i, size] of sizes.entries()) {
    const { sha256 } = await putPhotoBlob(dev, { bytes: fakeJpeg(i, size), mime: 'image/jpeg' });
    refs.push(photoRef(sha256, 'image/jpeg', size));
  }
  for (let i = 0; i < records; i++) await submitDraft(dev, makeRecord(i === 0 ? { photos: refs } : {}));
  return { sizes, shas: refs.map((r) => r.sha256) };
}

async function run(): Promise<SyncProgress[]> {
  const seen: SyncProgress[] = [];
  await syncOnce(server, dev, {
    newId: randomUUID,
    now: () => T0,
    force: true,
    onProgress: (p) => seen.push(p),
  });
  return seen;
}

/** Each count never falls within the run, and `done` never passes `total`. */
function expectRising(counts: Count[]) {
  for (const [i, c] of counts.entries()) {
    expect(c.done).toBeLessThanOrEqual(c.total);
    if (i > 0) expect(c.done).toBeGreaterThanOrEqual(counts[i - 1].done);
  }
}

const last = (seen: SyncProgress[]) => seen[seen.length - 1];

test('a run of several batches and photos: counts rise step by step and end at what the server holds', async () => {
  const records = MAX_BATCH + 7; // two batches: the most the server takes in one push, and the rest
  const { sizes } = await submit(records, 4);
  const seen = await run();

  expectRising(seen.map((p) => p.send.records));
  expectRising(seen.map((p) => p.send.batches));
  expectRising(seen.map((p) => p.photos.photos));
  expectRising(seen.map((p) => p.photos.bytes));

  const end = last(seen);
  expect(end.outcome).toBe('finished');
  // Against the fake server's own tally: every record and photo it stored.
  expect(server.records.size).toBe(records);
  expect(end.send.records).toEqual({ done: server.records.size, total: records });
  expect(end.send.batches).toEqual({ done: 2, total: 2 });
  expect(server.photos.size).toBe(4);
  expect(end.photos.photos).toEqual({ done: server.photos.size, total: 4 });
  const bytesHeld = [...server.photos.values()].reduce((s, b) => s + b.length, 0);
  expect(bytesHeld).toBe(sizes.reduce((s, n) => s + n, 0));
  expect(end.photos.bytes).toEqual({ done: bytesHeld, total: bytesHeld });
  expect(end.update).toEqual({ state: 'done', pages: 1, more: false });

  // The steps in order: every sending report before the first photo one, photos before the update.
  const firstRunning = (step: 'send' | 'photos' | 'update') =>
    seen.findIndex((p) => p[step].state === 'running');
  expect(firstRunning('send')).toBeLessThan(firstRunning('photos'));
  expect(firstRunning('photos')).toBeLessThan(firstRunning('update'));
  // The totals were known before anything went: the first batch's report names both batches.
  const firstCount = seen.find((p) => p.send.records.total > 0);
  expect(firstCount?.send).toMatchObject({
    records: { done: 0, total: records },
    batches: { done: 0, total: 2 },
  });
  // A photo's own bytes show while it goes up (the fake server reports half, then all).
  expect(seen.some((p) => p.photos.current !== null && p.photos.current.sentBytes === sizes[0] / 2)).toBe(
    true,
  );
});

test('a photo upload cut half way: the bar stays where it stopped, the rest waits on the phone and the next run finishes', async () => {
  const { sizes, shas } = await submit(3, 3);
  server.photoFaults = ['ok', 'cut-before'];
  const seen = await run();
  expectRising(seen.map((p) => p.photos.photos));
  expectRising(seen.map((p) => p.photos.bytes));

  const end = last(seen);
  expect(end.outcome).toBe('stopped');
  expect(end.send).toMatchObject({ state: 'done', records: { done: 3, total: 3 } });
  expect(end.photos).toMatchObject({
    state: 'stopped',
    photos: { done: 1, total: 3 },
    bytes: { done: sizes[0], total: sizes[0] + sizes[1] + sizes[2] },
    current: null,
  });
  // A network cut stops the run before the update (nothing to gain from asking).
  expect(end.update.state).toBe('waiting');

  // Nothing lost: the server has the first photo, the phone keeps the other two with their bytes.
  expect([...server.photos.keys()]).toEqual([shas[0]]);
  for (const sha of shas.slice(1)) expect((await getPhotoBlob(dev, sha))?.uploadState).toBe('pending');

  const again = last(await run());
  expect(again.outcome).toBe('finished');
  expect(again.photos.photos).toEqual({ done: 2, total: 2 });
  expect(again.photos.bytes).toEqual({ done: sizes[1] + sizes[2], total: sizes[1] + sizes[2] });
  expect(server.photos.size).toBe(3);
});

test('a push cut on the second batch: the first batch counts, the second stays queued on the phone', async () => {
  const records = MAX_BATCH + 5;
  await submit(records, 0);
  server.pushFaults = ['ok', 'cut-before'];
  const seen = await run();
  expectRising(seen.map((p) => p.send.records));

  const end = last(seen);
  expect(end.outcome).toBe('stopped');
  expect(end.send).toEqual({
    state: 'stopped',
    records: { done: MAX_BATCH, total: records },
    batches: { done: 1, total: 2 },
  });
  expect(end.photos.state).toBe('waiting');
  expect(server.records.size).toBe(MAX_BATCH);
  const states = (await listOutbox(dev)).map((o) => o.state);
  expect(states.filter((s) => s === 'accepted')).toHaveLength(MAX_BATCH);
  expect(states.filter((s) => s === 'queued')).toHaveLength(5);
});
