/**
 * The sync engine end to end on the device side: the real device schema and migrations (in-memory
 * SQLite), the real push/photo/pull code, and a fake server with the idempotency the real one must have
 * (tests/device/fake-sync-server.ts). Faults: a connection cut before or after the server stored
 * a batch, 502, an answer that is not ours, a server that forgets a record. The invariant checked after
 * each: no record lost on the phone, none stored twice on the server.
 */
import { randomUUID } from 'node:crypto';

import { ApiRequestError } from '@/lib/api-errors';
import { getOutboxItem, listOutbox } from '@/features/device-db/outbox';
import { getPhotoBlob, putPhotoBlob } from '@/features/device-db/photos';
import { saveDraft, submitDraft } from '@/features/device-db/drafts';
import { readAssignments, readRides, readTemplates } from '@/features/sync/cache';
import { getSyncMeta } from '@/features/device-db/sync-meta';
import { type InspectionRecord, pushBatchSchema } from '@/features/records/schema';
import { uploadPhotos } from '@/features/sync/photo-upload';
import { PullResponseError, pull } from '@/features/sync/pull';
import { MAX_BATCH, pushOutbox } from '@/features/sync/push';
import { syncOnce } from '@/features/sync/sync-run';

import { FakeSyncServer } from './fake-sync-server';
import { fakeJpeg, makeRecord, photoRef } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, signedInDeviceDb } from '@/tests/support/memory-device-db';

// The API client reads the session from expo-secure-store, which has no native side under node (ts-jest hoists this).
jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

let dev: MemoryDeviceDb;
let server: FakeSyncServer;
const T0 = new Date('2026-06-01T09:00:00.000Z');
const at = (seconds: number) => () => new Date(T0.getTime() + seconds * 1000);
const opts = (seconds = 0, force = false) => ({ newId: randomUUID, now: at(seconds), force });

beforeEach(async () => {
  dev = await signedInDeviceDb();
  server = new FakeSyncServer();
});
afterEach(async () => {
  await dev.close();
});

async function submit(n: number, overrides: Partial<InspectionRecord> = {}): Promise<InspectionRecord[]> {
  const out: InspectionRecord[] = [];
  for (let i = 0; i < n; i++) {
    const rec = makeRecord(overrides);
    await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: { step: 'done' } });
    out.push(await submitDraft(dev, rec));
  }
  return out;
}

async function statesOnPhone() {
  return (await listOutbox(dev)).map((i) => i.state);
}

test(`sends in batches of at most ${MAX_BATCH}, each with its own batch id`, async () => {
  const total = 2 * MAX_BATCH + 20;
  await submit(total);
  const report = await pushOutbox(server, dev, opts());
  expect(report).toMatchObject({ batches: 3, accepted: total, rejected: 0, requeued: 0, failure: null });
  expect(new Set(server.batchIdsSeen).size).toBe(3);
  expect([...server.batches.values()].map((b) => b.results.length)).toEqual([MAX_BATCH, MAX_BATCH, 20]);
  expect(server.records.size).toBe(total);
  expect(new Set(await statesOnPhone())).toEqual(new Set(['accepted']));
});

test('the phone’s batch is the most the server takes in one push, and no more', () => {
  const records = Array.from({ length: MAX_BATCH + 1 }, () => ({}));
  const batchId = randomUUID();
  expect(pushBatchSchema.safeParse({ batchId, records: records.slice(0, MAX_BATCH) }).success).toBe(true);
  expect(pushBatchSchema.safeParse({ batchId, records }).success).toBe(false);
});

test('a connection cut after the server stored the batch: the re-send reuses the batch id, nothing doubles', async () => {
  const records = await submit(3);
  server.pushFaults = ['cut-after'];
  const first = await pushOutbox(server, dev, opts());
  expect(first.failure?.kind).toBe('network');
  const afterCut = await listOutbox(dev);
  expect(afterCut.map((i) => i.state)).toEqual(['queued', 'queued', 'queued']);
  const batchId = afterCut[0].batchId;
  expect(batchId).toBe(server.batchIdsSeen[0]);
  expect(afterCut.every((i) => i.batchId === batchId && i.attempts === 1)).toBe(true);

  // Not before the back-off (5 s after the first failure)…
  expect((await pushOutbox(server, dev, opts(4))).batches).toBe(0);
  // …then with the same batch id, answered from what the server already stored.
  const second = await pushOutbox(server, dev, opts(6));
  expect(second).toMatchObject({ batches: 1, accepted: 3, failure: null });
  expect(server.batchIdsSeen).toEqual([batchId, batchId]);
  expect(server.records.size).toBe(3);
  for (const r of records) expect((await getOutboxItem(dev, r.id))?.state).toBe('accepted');
});

test('a connection cut before the server got anything: re-sent under the same id and stored once', async () => {
  await submit(2);
  server.pushFaults = ['cut-before'];
  await pushOutbox(server, dev, opts());
  await pushOutbox(server, dev, opts(0, true));
  expect(server.batchIdsSeen[0]).toBe(server.batchIdsSeen[1]);
  expect(server.records.size).toBe(2);
  expect(await statesOnPhone()).toEqual(['accepted', 'accepted']);
});

test('502: the batch waits in the queue with the error shown, then goes through', async () => {
  await submit(2);
  server.pushFaults = ['502'];
  const report = await pushOutbox(server, dev, opts());
  expect(report.failure).toMatchObject({ kind: 'server', status: 502 });
  const waiting = await listOutbox(dev);
  expect(waiting.map((i) => [i.state, i.attempts])).toEqual([
    ['queued', 1],
    ['queued', 1],
  ]);
  expect(waiting[0].lastError).toMatch(/502/);
  expect(waiting[0].nextAttemptAt).toBe('2026-06-01T09:00:05.000Z');
  expect((await pushOutbox(server, dev, opts(10))).accepted).toBe(2);
  expect(server.records.size).toBe(2);
});

test('an answer that is not a push result is a failure to retry, not a loss', async () => {
  await submit(1);
  server.pushFaults = ['garbage'];
  expect((await pushOutbox(server, dev, opts())).failure?.kind).toBe('server');
  expect(await statesOnPhone()).toEqual(['queued']);
  await pushOutbox(server, dev, opts(60));
  expect(await statesOnPhone()).toEqual(['accepted']);
});

test('a duplicate answer (the server had the record from an earlier batch) counts as delivered', async () => {
  const [rec] = await submit(1);
  server.records.set(rec.id, rec);
  const report = await pushOutbox(server, dev, opts());
  expect(report.accepted).toBe(1);
  expect([...server.batches.values()][0].results[0].status).toBe('duplicate');
  expect(await statesOnPhone()).toEqual(['accepted']);
  expect(server.records.size).toBe(1);
});

test('a rejected record stays on the phone with the reasons; the valid ones of its batch go through', async () => {
  const good = await submit(2);
  const [bad] = await submit(1, { rideId: server.rejectRideId });
  const report = await pushOutbox(server, dev, opts());
  expect(report).toMatchObject({ accepted: 2, rejected: 1 });
  const kept = await getOutboxItem(dev, bad.id);
  expect(kept).toMatchObject({ state: 'rejected', issues: [{ path: 'rideId', message: 'No such ride' }] });
  expect(kept?.record).toEqual(bad);
  for (const g of good) expect((await getOutboxItem(dev, g.id))?.state).toBe('accepted');
  // A later run does not send it again on its own.
  await pushOutbox(server, dev, opts(3600, true));
  expect(server.batchIdsSeen).toHaveLength(1);
});

test('a record the server left out of its answer is sent again in a new batch', async () => {
  const [a, b] = await submit(2);
  server.omitFromAnswer.add(b.id);
  await pushOutbox(server, dev, opts());
  expect((await getOutboxItem(dev, a.id))?.state).toBe('accepted');
  expect(await getOutboxItem(dev, b.id)).toMatchObject({ state: 'queued', batchId: null });
  server.omitFromAnswer.clear();
  await pushOutbox(server, dev, opts(60));
  expect((await getOutboxItem(dev, b.id))?.state).toBe('accepted');
  expect(new Set(server.batchIdsSeen).size).toBe(2);
  expect(server.records.size).toBe(2);
});

test('the app closed while a batch was on its way: the next run re-sends it under the same id', async () => {
  await submit(2);
  // What a run leaves behind when the page dies between marking `sending` and the answer.
  const batchId = randomUUID();
  dev.sqlite.prepare("UPDATE outbox SET state = 'sending', batch_id = ?").run(batchId);
  await pushOutbox(server, dev, opts());
  expect(server.batchIdsSeen).toEqual([batchId]);
  expect(await statesOnPhone()).toEqual(['accepted', 'accepted']);
});

test('many runs through random faults: every record ends on the server exactly once', async () => {
  const records = await submit(130);
  const faults = ['ok', 'cut-before', 'cut-after', '502', 'garbage'] as const;
  let seed = 7;
  const rand = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
  server.pushFaults = Array.from({ length: 60 }, () => faults[Math.floor(rand() * faults.length)]);
  for (let run = 0; run < 80 && (await statesOnPhone()).some((s) => s !== 'accepted'); run++)
    await pushOutbox(server, dev, opts(run * 1000, true));
  expect(await statesOnPhone()).toEqual(records.map(() => 'accepted'));
  expect(server.records.size).toBe(130);
  expect([...server.records.keys()].sort()).toEqual(records.map((r) => r.id).sort());
  // 130 records through many faulty runs: give a loaded machine room.
}, 20_000);

describe('photos', () => {
  async function submitWithPhotos(count: number) {
    const refs = [];
    for (let i = 0; i < count; i++) {
      const { sha256 } = await putPhotoBlob(dev, { bytes: fakeJpeg(i, 200 + i), mime: 'image/jpeg' });
      refs.push(photoRef(sha256, 'image/jpeg', 200 + i));
    }
    const rec = makeRecord({ photos: refs });
    await submitDraft(dev, rec);
    return refs.map((r) => r.sha256);
  }

  test('uploaded once each with progress, also when re-sent', async () => {
    const shas = await submitWithPhotos(2);
    const progress: number[] = [];
    const report = await uploadPhotos(server, dev, { onProgress: (p) => progress.push(p.sentBytes) });
    expect(report).toEqual({ uploaded: 2, rejected: 0, failure: null });
    expect(server.photos.size).toBe(2);
    expect(progress).toContain(100);
    for (const sha of shas) expect((await getPhotoBlob(dev, sha))?.uploadState).toBe('uploaded');
    // Putting the same bytes on the server again stores nothing new.
    await server.putPhoto({ sha256: shas[0], mime: 'image/jpeg', bytes: fakeJpeg(0, 200) });
    expect(server.photos.size).toBe(2);
  });

  test('a photo refused by the server (not an image, too large) is kept with the message', async () => {
    const [a, b] = await submitWithPhotos(2);
    server.photoFaults = ['not-image', 'too-large'];
    const report = await uploadPhotos(server, dev);
    expect(report).toMatchObject({ uploaded: 0, rejected: 2 });
    expect(await getPhotoBlob(dev, a)).toMatchObject({
      uploadState: 'rejected',
      lastError: 'The file is not a JPEG, PNG or WebP image.',
    });
    expect((await getPhotoBlob(dev, b))?.lastError).toMatch(/larger than/);
  });

  test('a cut or a 502 leaves the photo waiting, with back-off', async () => {
    const [a] = await submitWithPhotos(1);
    server.photoFaults = ['502'];
    const report = await uploadPhotos(server, dev, { now: at(0) });
    expect(report.failure?.kind).toBe('server');
    expect(await getPhotoBlob(dev, a)).toMatchObject({
      uploadState: 'pending',
      attempts: 1,
      nextAttemptAt: '2026-06-01T09:00:05.000Z',
    });
    expect((await uploadPhotos(server, dev, { now: at(1) })).uploaded).toBe(0);
    expect((await uploadPhotos(server, dev, { now: at(6) })).uploaded).toBe(1);
  });

  test("a draft's photos wait until its inspection is submitted", async () => {
    await putPhotoBlob(dev, { bytes: fakeJpeg(9), mime: 'image/jpeg' });
    expect((await uploadPhotos(server, dev)).uploaded).toBe(0);
  });
});

describe('pull', () => {
  const ride = {
    id: 'ride-demo-1',
    name: 'Harbour Swing',
    rideClass: 'pendulum_swing',
    description: null,
    maker: null,
    model: null,
    serial: null,
    year: 2019,
    status: 'in_service',
    statusReason: null,
    statusSince: null,
    siteId: null,
    siteName: 'Tamsworth Pier',
    operatorCompanyId: 'co-1',
    operatorName: 'Tamsworth Pier Leisure',
  };

  test('pages are written with their cursor, and the cursor is sent back next time', async () => {
    server.pullPages = [
      {
        cursor: 'c1',
        rides: [ride],
        assignments: [{ id: 'as-1', rideId: ride.id, dueOn: '2026-06-02' }],
        hasMore: true,
      },
      { cursor: 'c2', assignments: [{ id: 'as-2', rideId: ride.id }] },
    ];
    const report = await pull(server, dev);
    expect(report).toMatchObject({ pages: 2, rides: 1, assignments: 2, cursor: 'c2' });
    expect(server.pullCursorsSeen).toEqual([null, 'c1']);
    expect((await readRides(dev)).map((r) => r.name)).toEqual(['Harbour Swing']);
    expect((await readAssignments(dev)).map((a) => a.id).sort()).toEqual(['as-1', 'as-2']);
    expect(await getSyncMeta(dev, 'pullCursor')).toBe('c2');

    server.pullPages = [{ cursor: 'c3', removed: { assignments: ['as-1'] } }];
    await pull(server, dev);
    expect(server.pullCursorsSeen.at(-1)).toBe('c2');
    expect((await readAssignments(dev)).map((a) => a.id)).toEqual(['as-2']);
  });

  test('a cursor the server no longer knows starts a full download instead of failing forever', async () => {
    server.pullPages = [{ cursor: 'c1', rides: [ride] }];
    await pull(server, dev);
    server.pullPages = [
      new ApiRequestError(400, 'validation_failed', 'Invalid request', [
        { path: 'query.cursor', message: 'Not a cursor from this server' },
      ]),
      { cursor: 'fresh-1', rides: [ride] },
    ];
    expect((await pull(server, dev)).cursor).toBe('fresh-1');
    expect(server.pullCursorsSeen).toEqual([null, 'c1', null]);
  });

  test('a malformed answer changes nothing and keeps the cursor', async () => {
    server.pullPages = [{ cursor: 'c1', rides: [ride] }];
    await pull(server, dev);
    server.pullPages = [{ cursor: 'c9', rides: [{ ...ride, name: 'Changed' }], templates: [{ id: 't' }] }];
    await expect(pull(server, dev)).rejects.toThrow(PullResponseError);
    expect(await getSyncMeta(dev, 'pullCursor')).toBe('c1');
    expect((await readRides(dev))[0].name).toBe('Harbour Swing');
    expect(await readTemplates(dev)).toEqual([]);
  });
});

test('one sync run: push, photos, pull, then the last success is recorded; a failure is recorded too', async () => {
  await submit(1);
  server.pullPages = [{ cursor: 'c1' }];
  const ok = await syncOnce(server, dev, opts());
  expect(ok.error).toBeNull();
  expect(await getSyncMeta(dev, 'lastSuccessAt')).toBe(T0.toISOString());

  await submit(1);
  server.pushFaults = ['cut-before'];
  const failed = await syncOnce(server, dev, opts(30));
  expect(failed.error).toBe('No connection to the server.');
  expect(failed.pull).toBeNull();
  expect(await getSyncMeta(dev, 'lastError')).toBe('No connection to the server.');
  expect(await getSyncMeta(dev, 'lastSuccessAt')).toBe(T0.toISOString());
  expect(await statesOnPhone()).toEqual(['accepted', 'queued']);
});
