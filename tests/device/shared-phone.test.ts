/**
 * One person's data per phone, on the real device schema and migrations (in-memory SQLite) and the real
 * sync code against the fake server: rows carry their author, every read is scoped to the phone's person,
 * a change of person (sign-out, or someone else signing in) wipes the shared caches and the pull cursor,
 * and the previous person's unsent work — drafts, queued and refused records, the photos they need —
 * survives untouched, sealed, and goes out under their own name only once they are back.
 */
import { randomUUID } from 'node:crypto';

import {
  bindDeviceOwner,
  countUnsentWork,
  getDeviceOwner,
  releaseDeviceOwner,
} from '@/features/device-db/device-owner';
import { listDrafts, loadDraft, saveDraft, submitDraft } from '@/features/device-db/drafts';
import { readDeviceHoldings } from '@/features/device-db/holdings';
import { DeviceDataError } from '@/features/device-db/errors';
import { countOutbox, getOutboxItem, listOutbox } from '@/features/device-db/outbox';
import { getPhotoBlob, listOwnPhotoBlobs, putPhotoBlob } from '@/features/device-db/photos';
import { getSyncMeta, setSyncMeta } from '@/features/device-db/sync-meta';
import type { InspectionRecord } from '@/features/records/schema';
import { readDecisions, writeDecisions } from '@/features/sync/cache';
import { uploadPhotos } from '@/features/sync/photo-upload';
import { pushOutbox } from '@/features/sync/push';
import { syncOnce } from '@/features/sync/sync-run';

import { FakeSyncServer } from './fake-sync-server';
import { fakeJpeg, makeRecord, photoRef } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';

// sync-run reaches the API client, which reads the session from expo-secure-store (no native side in node).
jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

const ANNA = 'user-inspector-anna';
const BORIS = 'user-inspector-boris';

let dev: MemoryDeviceDb;
let server: FakeSyncServer;
beforeEach(async () => {
  dev = await memoryDeviceDb();
  server = new FakeSyncServer();
});
afterEach(async () => {
  await dev.close();
});

const count = (table: string): number =>
  (dev.sqlite.prepare(`SELECT count(*) AS n FROM ${table}`).get() as { n: number }).n;
const opts = () => ({ newId: randomUUID, force: true });

async function photo(seed: number): Promise<string> {
  return (await putPhotoBlob(dev, { bytes: fakeJpeg(seed), mime: 'image/jpeg' })).sha256;
}

async function submitted(overrides: Partial<InspectionRecord> = {}): Promise<InspectionRecord> {
  const rec = makeRecord(overrides);
  await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: { step: 'done' } });
  return submitDraft(dev, rec);
}

/** Fills every shared cache the way a pull would leave it (raw rows: only their going away matters here). */
function fillCaches() {
  const now = '2026-06-01T09:00:00.000Z';
  dev.sqlite.prepare(`INSERT INTO cached_rides (id, json, updated_at) VALUES ('r1', '{}', ?)`).run(now);
  dev.sqlite
    .prepare(`INSERT INTO cached_design_versions (id, ride_id, version, json) VALUES ('d1', 'r1', 1, '{}')`)
    .run();
  dev.sqlite
    .prepare(
      `INSERT INTO cached_checklist_templates (id, ride_class, json, updated_at) VALUES ('t1', 'swing', '{}', ?)`,
    )
    .run(now);
  dev.sqlite
    .prepare(`INSERT INTO assignments (id, ride_id, json, updated_at) VALUES ('a1', 'r1', '{}', ?)`)
    .run(now);
  dev.sqlite.prepare(`INSERT INTO cached_instruments (id, json, updated_at) VALUES ('i1', '{}', ?)`).run(now);
  dev.sqlite
    .prepare(`INSERT INTO cached_settings (key, json, updated_at) VALUES ('declaration', '{}', ?)`)
    .run(now);
}

describe('rows carry their author', () => {
  test('a draft, the submitted record, its outbox row and its photo are stamped with the phone’s person', async () => {
    await bindDeviceOwner(dev, ANNA);
    const sha = await photo(1);
    const rec = await submitted({ photos: [photoRef(sha)] });
    expect(rec.authorId).toBe(ANNA);
    expect((await getOutboxItem(dev, rec.id))?.record.authorId).toBe(ANNA);
    expect(dev.sqlite.prepare('SELECT author_id AS a FROM outbox').get()).toEqual({ a: ANNA });
    expect((await getPhotoBlob(dev, sha))?.authorId).toBe(ANNA);
    await saveDraft(dev, { id: randomUUID(), rideId: 'ride-demo-1', data: {} });
    expect(dev.sqlite.prepare('SELECT author_id AS a FROM drafts').get()).toEqual({ a: ANNA });
  });

  test('a record naming someone else as author is refused at submit and nothing changes', async () => {
    await bindDeviceOwner(dev, ANNA);
    const rec = makeRecord({ authorId: BORIS });
    await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: {} });
    await expect(submitDraft(dev, rec)).rejects.toThrow(DeviceDataError);
    expect(count('outbox')).toBe(0);
    expect(count('drafts')).toBe(1);
  });

  test('pulled decisions are kept for the person whose pull brought them', async () => {
    await bindDeviceOwner(dev, ANNA);
    await writeDecisions(dev, [{ inspectionId: 'insp-1', state: 'approved' }]);
    expect(dev.sqlite.prepare('SELECT author_id AS a FROM decisions').get()).toEqual({ a: ANNA });
    expect((await readDecisions(dev)).map((d) => d.inspectionId)).toEqual(['insp-1']);
  });
});

describe('a change of person', () => {
  test('sign-out wipes the caches, decisions, accepted rows, uploaded photos and the pull cursor; unsent work stays', async () => {
    await bindDeviceOwner(dev, ANNA);
    fillCaches();
    await writeDecisions(dev, [{ inspectionId: 'insp-1', state: 'approved' }]);
    await setSyncMeta(dev, 'pullCursor', 'cursor-42');
    await setSyncMeta(dev, 'lastSuccessAt', '2026-06-01T09:00:00.000Z');

    // Accepted and fully uploaded: nothing of it is unsent.
    const doneSha = await photo(1);
    const done = await submitted({ photos: [photoRef(doneSha)] });
    await syncOnce(server, dev, opts());
    expect((await getOutboxItem(dev, done.id))?.state).toBe('accepted');
    expect((await getPhotoBlob(dev, doneSha))?.uploadState).toBe('uploaded');
    // Taken, then dropped from the draft: nobody needs it.
    const strayLocal = await photo(2);
    // Queued, with its photo waiting; a draft with a photo of its own; a record the server refused.
    const queuedSha = await photo(3);
    const queued = await submitted({ photos: [photoRef(queuedSha)] });
    const draftSha = await photo(4);
    const draftId = randomUUID();
    await saveDraft(dev, { id: draftId, rideId: 'ride-demo-1', data: { photos: [{ sha256: draftSha }] } });
    const refused = await submitted({ rideId: server.rejectRideId });
    await pushOutbox(server, dev, { newId: randomUUID, force: true, batchSize: 50 });
    // That push sent `queued` too: put it back to queued, as if the phone had been offline.
    dev.sqlite.prepare(`UPDATE outbox SET state = 'queued', batch_id = NULL WHERE id = ?`).run(queued.id);
    dev.sqlite.prepare(`UPDATE photo_blobs SET upload_state = 'pending' WHERE sha256 = ?`).run(queuedSha);
    expect((await getOutboxItem(dev, refused.id))?.state).toBe('rejected');

    expect(await countUnsentWork(dev)).toEqual({ drafts: 1, queued: 1, rejected: 1, photos: 1 });
    await releaseDeviceOwner(dev);

    for (const table of [
      'cached_rides',
      'cached_design_versions',
      'cached_checklist_templates',
      'assignments',
      'cached_instruments',
      'cached_settings',
      'decisions',
    ])
      expect([table, count(table)]).toEqual([table, 0]);
    expect(await getSyncMeta(dev, 'pullCursor')).toBeNull();
    expect(await getSyncMeta(dev, 'lastSuccessAt')).toBeNull();
    expect(await getDeviceOwner(dev)).toBeNull();
    const outboxLeft = dev.sqlite.prepare('SELECT id, state, author_id AS a FROM outbox ORDER BY id').all();
    expect(outboxLeft).toEqual(
      [
        { id: queued.id, state: 'queued', a: ANNA },
        { id: refused.id, state: 'rejected', a: ANNA },
      ].sort((x, y) => x.id.localeCompare(y.id)),
    );
    const blobsLeft = (dev.sqlite.prepare('SELECT sha256 FROM photo_blobs').all() as { sha256: string }[])
      .map((r) => r.sha256)
      .sort();
    expect(blobsLeft).toEqual([queuedSha, draftSha].sort());
    expect(blobsLeft).not.toContain(doneSha);
    expect(blobsLeft).not.toContain(strayLocal);
    expect(count('drafts')).toBe(1);
  });

  test('the next person sees none of it, cannot change it and sends none of it', async () => {
    await bindDeviceOwner(dev, ANNA);
    const sha = await photo(1);
    const annas = await submitted({ photos: [photoRef(sha)] });
    const annaDraft = randomUUID();
    await saveDraft(dev, { id: annaDraft, rideId: 'ride-demo-1', data: { note: 'half done' } });
    await releaseDeviceOwner(dev);

    expect(await bindDeviceOwner(dev, BORIS)).toEqual({ changed: true });
    expect(await listDrafts(dev)).toEqual([]);
    expect(await loadDraft(dev, annaDraft)).toBeNull();
    expect(await listOutbox(dev)).toEqual([]);
    expect(await getOutboxItem(dev, annas.id)).toBeNull();
    expect(await countOutbox(dev)).toEqual({ queued: 0, sending: 0, accepted: 0, rejected: 0 });
    expect(await countUnsentWork(dev)).toEqual({ drafts: 0, queued: 0, rejected: 0, photos: 0 });
    expect(await listOwnPhotoBlobs(dev, ['pending', 'uploading', 'local'])).toEqual([]);
    // The storage card: Boris's own holdings are empty; Anna's sealed work is one count and size only.
    const held = await readDeviceHoldings(dev);
    expect([held.drafts.count, held.unsentRecords.count, held.unsentPhotos.count]).toEqual([0, 0, 0]);
    expect(held.keptForOthers.count).toBe(2); // her draft and her queued record
    expect(held.keptForOthers.bytes).toBeGreaterThan(fakeJpeg(1).length); // ... and the photo it needs
    await expect(saveDraft(dev, { id: annaDraft, rideId: 'ride-demo-1', data: {} })).rejects.toThrow(
      'belongs to someone else',
    );

    const borisOwn = await submitted();
    expect((await syncOnce(server, dev, { ...opts(), signedInUserId: BORIS })).error).toBeNull();
    expect([...server.records.keys()]).toEqual([borisOwn.id]);
    expect(server.records.get(borisOwn.id)?.authorId).toBe(BORIS);
    expect(server.photos.size).toBe(0);
    // Anna's work is all still there, untouched.
    expect(dev.sqlite.prepare('SELECT state FROM outbox WHERE id = ?').get(annas.id)).toEqual({
      state: 'queued',
    });
    expect(dev.sqlite.prepare('SELECT count(*) AS n FROM drafts WHERE id = ?').get(annaDraft)).toEqual({
      n: 1,
    });

    // Anna again (Boris's accepted row and caches go; his nothing-unsent leaves nothing behind).
    expect(await bindDeviceOwner(dev, ANNA)).toEqual({ changed: true });
    expect((await listDrafts(dev)).map((d) => d.id)).toEqual([annaDraft]);
    expect((await syncOnce(server, dev, { ...opts(), signedInUserId: ANNA })).error).toBeNull();
    expect(server.records.get(annas.id)?.authorId).toBe(ANNA);
    expect(server.photos.has(sha)).toBe(true);
    expect((await getOutboxItem(dev, annas.id))?.state).toBe('accepted');
  });

  test('someone else signing in without a sign-out (a token ran out) wipes just the same', async () => {
    await bindDeviceOwner(dev, ANNA);
    fillCaches();
    await setSyncMeta(dev, 'pullCursor', 'cursor-42');
    const annas = await submitted();
    expect(await bindDeviceOwner(dev, BORIS)).toEqual({ changed: true });
    expect(count('cached_rides')).toBe(0);
    expect(await getSyncMeta(dev, 'pullCursor')).toBeNull();
    expect(await getOutboxItem(dev, annas.id)).toBeNull();
    expect(count('outbox')).toBe(1);
  });

  test('the same person again keeps everything (no needless download on every start)', async () => {
    await bindDeviceOwner(dev, ANNA);
    fillCaches();
    await setSyncMeta(dev, 'pullCursor', 'cursor-42');
    expect(await bindDeviceOwner(dev, ANNA)).toEqual({ changed: false });
    expect(count('cached_rides')).toBe(1);
    expect(await getSyncMeta(dev, 'pullCursor')).toBe('cursor-42');
  });

  test('the same person again is one read of the owner, with no transaction (the usual start)', async () => {
    await bindDeviceOwner(dev, ANNA);
    dev.statements.length = 0;
    expect(await bindDeviceOwner(dev, ANNA)).toEqual({ changed: false });
    expect(dev.statements).toHaveLength(1);
    expect(dev.statements[0]).toMatch(/^select .* from "sync_meta" where/i);
    // Someone else is still checked and bound inside one transaction.
    dev.statements.length = 0;
    expect(await bindDeviceOwner(dev, BORIS)).toEqual({ changed: true });
    expect(dev.statements[1]).toBe('BEGIN IMMEDIATE');
    expect(dev.statements.at(-1)).toBe('COMMIT');
    expect(await getDeviceOwner(dev)).toBe(BORIS);
  });

  test('a sync under another person’s token while the phone is still bound to the first sends nothing', async () => {
    await bindDeviceOwner(dev, ANNA);
    await submitted();
    const report = await syncOnce(server, dev, { ...opts(), signedInUserId: BORIS });
    expect(report.push.batches).toBe(0);
    expect(server.batchIdsSeen).toEqual([]);
    expect((await syncOnce(server, dev, { ...opts(), signedInUserId: null })).push.batches).toBe(0);
    expect(server.batchIdsSeen).toEqual([]);
  });

  test('photos of someone else’s accepted record still waiting to upload are kept and uploaded only by them', async () => {
    await bindDeviceOwner(dev, ANNA);
    const sha = await photo(7);
    await submitted({ photos: [photoRef(sha)] });
    await pushOutbox(server, dev, opts());
    await releaseDeviceOwner(dev);
    expect((await getPhotoBlob(dev, sha))?.uploadState).toBe('pending');
    await bindDeviceOwner(dev, BORIS);
    expect(await uploadPhotos(server, dev, { force: true })).toMatchObject({ uploaded: 0 });
    expect(server.photos.size).toBe(0);
    await bindDeviceOwner(dev, ANNA);
    expect(await uploadPhotos(server, dev, { force: true })).toMatchObject({ uploaded: 1 });
  });
});

describe('rows from before authors were recorded', () => {
  test('belong to the first person bound after the update, keep the caches, and go out under their name', async () => {
    const rec = makeRecord();
    const now = '2026-06-01T09:00:00.000Z';
    dev.sqlite
      .prepare(
        `INSERT INTO outbox (id, kind, json, state, attempts, created_at, updated_at) VALUES (?, 'inspection', ?, 'queued', 0, ?, ?)`,
      )
      .run(rec.id, JSON.stringify(rec), now, now);
    dev.sqlite
      .prepare(
        `INSERT INTO drafts (id, ride_id, json, created_at, updated_at) VALUES ('old-draft', 'r1', '{}', ?, ?)`,
      )
      .run(now, now);
    fillCaches();

    await bindDeviceOwner(dev, ANNA);
    expect(count('cached_rides')).toBe(1);
    expect((await listDrafts(dev)).map((d) => d.id)).toEqual(['old-draft']);
    await pushOutbox(server, dev, opts());
    expect(server.records.get(rec.id)?.authorId).toBe(ANNA);
  });
});
