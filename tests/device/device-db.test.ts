/**
 * The device database layer over real SQLite (in memory) with the generated device migrations: the
 * migration runner, transactions that nothing else can slip into, drafts, submit into the outbox, and
 * the photo store. SHA-256 is checked against the FIPS 180-2 example ("abc", Appendix B.1).
 */
import { createHash } from 'node:crypto';

import { sql } from 'drizzle-orm';

import { outbox } from '@/db/device/schema';
import { DeviceDataError } from '@/features/device-db/errors';
import { applyMigrations } from '@/features/device-db/migrations';
import { deleteDraft, listDrafts, loadDraft, saveDraft, submitDraft } from '@/features/device-db/drafts';
import { countOutbox, getOutboxItem, requeueRejected } from '@/features/device-db/outbox';
import {
  getPhotoBlob,
  getPhotoBytes,
  getPhotoDataUri,
  putPhotoBlob,
  sha256Hex,
  sniffImageMime,
} from '@/features/device-db/photos';

import { stripJpegMetadata } from '@/lib/jpeg-metadata';
import { jpegWithExif } from '@/tests/support/exif-jpeg';
import { fakeJpeg, makeRecord, photoRef } from '@/tests/support/inspection-fixtures';
import {
  type MemoryDeviceDb,
  deviceMigrationsFromDisk,
  signedInDeviceDb,
} from '@/tests/support/memory-device-db';

let dev: MemoryDeviceDb;
beforeEach(async () => {
  dev = await signedInDeviceDb();
});
afterEach(async () => {
  await dev.close();
});

const tables = () =>
  dev.sqlite
    .prepare("SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name")
    .all()
    .map((r) => (r as { name: string }).name);

describe('migrations', () => {
  test('create every device table once and record the tag; a second run does nothing', async () => {
    expect(tables()).toEqual([
      '__migrations',
      'assignments',
      'cached_checklist_templates',
      'cached_design_versions',
      'cached_instruments',
      'cached_rides',
      'cached_settings',
      'decisions',
      'device_keys',
      'drafts',
      'outbox',
      'photo_blobs',
      'sync_meta',
    ]);
    expect(await applyMigrations(dev, deviceMigrationsFromDisk())).toEqual([]);
    expect(dev.sqlite.prepare('SELECT tag FROM __migrations ORDER BY tag').all()).toEqual(
      deviceMigrationsFromDisk().map((m) => ({ tag: m.tag })),
    );
  });

  test('a database already up to date is checked with one read and nothing else (every start of the app)', async () => {
    dev.statements.length = 0;
    expect(await applyMigrations(dev, deviceMigrationsFromDisk())).toEqual([]);
    expect(dev.statements).toEqual(['SELECT tag FROM __migrations']);
  });

  test('a database behind the bundle gets only the migrations it lacks', async () => {
    const extra = { tag: '9999_extra', statements: ['CREATE TABLE extra (x TEXT)'] };
    expect(await applyMigrations(dev, [...deviceMigrationsFromDisk(), extra])).toEqual(['9999_extra']);
    expect(tables()).toContain('extra');
    expect(await applyMigrations(dev, [...deviceMigrationsFromDisk(), extra])).toEqual([]);
  });

  test('a migration that fails leaves nothing half-applied', async () => {
    const broken = [{ tag: '9999_broken', statements: ['CREATE TABLE extra (x TEXT)', 'NOT SQL AT ALL'] }];
    await expect(applyMigrations(dev, broken)).rejects.toThrow();
    expect(tables()).not.toContain('extra');
    expect(
      dev.sqlite.prepare("SELECT count(*) AS n FROM __migrations WHERE tag = '9999_broken'").get(),
    ).toEqual({
      n: 0,
    });
  });

  test('the database checks outbox states itself', () => {
    expect(() =>
      dev.sqlite
        .prepare(
          "INSERT INTO outbox (id, kind, json, state, created_at, updated_at) VALUES ('x', 'inspection', '{}', 'lost', '', '')",
        )
        .run(),
    ).toThrow(/CHECK constraint failed/);
  });
});

describe('transactions', () => {
  test('a statement issued during a transaction waits for it, so a rollback cannot take it along', async () => {
    const a = makeRecord();
    const draftId = makeRecord().id;
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const tx = dev.transaction(async (t) => {
      await t.db
        .insert(outbox)
        .values({ id: a.id, kind: 'inspection', json: '{}', state: 'queued', createdAt: 'x', updatedAt: 'x' })
        .run();
      await gate;
      throw new Error('abandon');
    });
    // Issued while the transaction is open; over a bare proxy it would run inside it and be rolled back.
    const save = saveDraft(dev, { id: draftId, rideId: 'ride-demo-1', data: { n: 1 } });
    await new Promise((r) => setTimeout(r, 20));
    release();
    await expect(tx).rejects.toThrow('abandon');
    await save;
    expect(await getOutboxItem(dev, a.id)).toBeNull();
    expect((await loadDraft(dev, draftId))?.data).toEqual({ n: 1 });
    // The statements ran in order: BEGIN … ROLLBACK, and only then the draft's own transaction.
    const order = dev.statements.filter((s) => /^(BEGIN|COMMIT|ROLLBACK)|insert into "drafts"/i.test(s));
    expect(order.slice(-5).map((s) => s.split(' ')[0].toUpperCase())).toEqual([
      'BEGIN',
      'ROLLBACK',
      'BEGIN',
      'INSERT',
      'COMMIT',
    ]);
  });

  test('a nested transaction joins the outer one', async () => {
    await expect(
      dev.transaction(async (outer) => {
        await outer.transaction((inner) => saveDraft(inner, { id: makeRecord().id, rideId: 'r', data: 1 }));
        throw new Error('undo all');
      }),
    ).rejects.toThrow('undo all');
    expect(await listDrafts(dev)).toEqual([]);
  });
});

describe('drafts', () => {
  test('save, save again (updates in place), load, list newest first, delete', async () => {
    const a = makeRecord().id;
    const b = makeRecord().id;
    await saveDraft(dev, { id: a, rideId: 'ride-1', data: { step: 1 } }, new Date('2026-06-01T08:00:00Z'));
    await saveDraft(dev, { id: b, rideId: 'ride-2', data: { step: 1 } }, new Date('2026-06-01T08:01:00Z'));
    await saveDraft(dev, { id: a, rideId: 'ride-1', data: { step: 2 } }, new Date('2026-06-01T08:02:00Z'));
    expect(await loadDraft(dev, a)).toEqual({
      id: a,
      rideId: 'ride-1',
      data: { step: 2 },
      createdAt: '2026-06-01T08:00:00.000Z',
      updatedAt: '2026-06-01T08:02:00.000Z',
    });
    expect((await listDrafts(dev)).map((d) => d.id)).toEqual([a, b]);
    expect((await listDrafts(dev, 'ride-2')).map((d) => d.id)).toEqual([b]);
    await deleteDraft(dev, b);
    expect(await loadDraft(dev, b)).toBeNull();
  });

  test('bad input is refused with the field named, and nothing is written', async () => {
    const err = await saveDraft(dev, { id: 'not-a-uuid', rideId: '', data: {} }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DeviceDataError);
    expect((err as DeviceDataError).issues.map((i) => i.path)).toEqual(['id', 'rideId']);
    const circular: Record<string, unknown> = {};
    circular.self = circular;
    await expect(saveDraft(dev, { id: makeRecord().id, rideId: 'r', data: circular })).rejects.toThrow(
      DeviceDataError,
    );
    expect(await listDrafts(dev)).toEqual([]);
  });
});

describe('submit', () => {
  test('moves the record into the outbox and removes the draft in one step; photos join the upload queue', async () => {
    const { sha256 } = await putPhotoBlob(dev, { bytes: fakeJpeg(1), mime: 'image/jpeg' });
    const rec = makeRecord({ photos: [photoRef(sha256)] });
    await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: { any: 'shape' } });
    await submitDraft(dev, rec, new Date('2026-06-01T08:10:00Z'));
    expect(await loadDraft(dev, rec.id)).toBeNull();
    expect(await getOutboxItem(dev, rec.id)).toMatchObject({
      state: 'queued',
      attempts: 0,
      batchId: null,
      record: rec,
      createdAt: '2026-06-01T08:10:00.000Z',
    });
    expect((await getPhotoBlob(dev, sha256))?.uploadState).toBe('pending');
    // Submitted means immutable: neither a second submit nor a late draft save may change it.
    await expect(submitDraft(dev, rec)).rejects.toThrow(/already submitted/);
    await expect(saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: {} })).rejects.toThrow(/submitted/);
    expect(await countOutbox(dev)).toEqual({ queued: 1, sending: 0, accepted: 0, rejected: 0 });
  });

  test('an invalid record is refused with reasons per field; the draft stays', async () => {
    const rec = makeRecord();
    await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: { keep: true } });
    const bad = { ...rec, readings: [{ ...rec.readings[0], valueSI: Number.NaN }] };
    const err = await submitDraft(dev, bad).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DeviceDataError);
    expect((err as DeviceDataError).issues).toContainEqual({
      path: 'readings.0.valueSI',
      message: 'Must be a finite number',
    });
    expect((await loadDraft(dev, rec.id))?.data).toEqual({ keep: true });
    expect(await countOutbox(dev)).toEqual({ queued: 0, sending: 0, accepted: 0, rejected: 0 });
  });

  test('a record naming a photo the phone does not hold is refused', async () => {
    const rec = makeRecord({ photos: [photoRef('a'.repeat(64))] });
    const err = await submitDraft(dev, rec).catch((e: unknown) => e);
    expect((err as DeviceDataError).issues).toEqual([
      { path: 'photos.0.sha256', message: 'This photo is not stored on the phone' },
    ]);
    expect(await getOutboxItem(dev, rec.id)).toBeNull();
  });

  test('only a rejected record can be re-queued', async () => {
    const rec = makeRecord();
    await submitDraft(dev, rec);
    await expect(requeueRejected(dev, rec.id)).rejects.toThrow(/queued, not rejected/);
    dev.sqlite.prepare("UPDATE outbox SET state = 'rejected', batch_id = 'b', issues = '[]'").run();
    await requeueRejected(dev, rec.id);
    expect(await getOutboxItem(dev, rec.id)).toMatchObject({ state: 'queued', batchId: null });
  });
});

describe('photo store', () => {
  test('SHA-256 matches the FIPS 180-2 example', () => {
    expect(sha256Hex(new TextEncoder().encode('abc'))).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
  });

  test('file signatures: JPEG, PNG, WebP, and text is none of them', () => {
    expect(sniffImageMime(fakeJpeg(1))).toBe('image/jpeg');
    expect(sniffImageMime(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))).toBe(
      'image/png',
    );
    expect(sniffImageMime(new TextEncoder().encode('RIFF\0\0\0\0WEBPVP8 '))).toBe('image/webp');
    expect(sniffImageMime(new TextEncoder().encode('hello, not a photo'))).toBeNull();
  });

  test('putting the same bytes twice stores them once; bytes and data URI come back unchanged', async () => {
    const bytes = fakeJpeg(3, 300);
    const first = await putPhotoBlob(dev, { bytes, mime: 'image/jpeg' });
    const again = await putPhotoBlob(dev, {
      base64: Buffer.from(bytes).toString('base64'),
      mime: 'image/jpeg',
    });
    expect(first).toEqual({ sha256: sha256Hex(bytes), created: true });
    expect(again).toEqual({ sha256: first.sha256, created: false });
    expect(dev.sqlite.prepare('SELECT count(*) AS n FROM photo_blobs').get()).toEqual({ n: 1 });
    expect(await getPhotoBytes(dev, first.sha256)).toEqual(bytes);
    expect(await getPhotoDataUri(dev, first.sha256)).toBe(
      `data:image/jpeg;base64,${Buffer.from(bytes).toString('base64')}`,
    );
    expect(await getPhotoBlob(dev, first.sha256)).toMatchObject({ bytes: 300, uploadState: 'local' });
  });

  test('not an image, the wrong type, a wrong hash, empty: each refused with a clear message', async () => {
    await expect(
      putPhotoBlob(dev, { bytes: new TextEncoder().encode('plain text'), mime: 'image/jpeg' }),
    ).rejects.toThrow('The file is not a JPEG, PNG or WebP image.');
    await expect(putPhotoBlob(dev, { bytes: fakeJpeg(1), mime: 'image/png' })).rejects.toThrow(
      'The file is image/jpeg, not image/png as stated.',
    );
    await expect(
      putPhotoBlob(dev, { bytes: fakeJpeg(1), mime: 'image/jpeg', sha256: 'b'.repeat(64) }),
    ).rejects.toThrow(/does not match its SHA-256/);
    await expect(putPhotoBlob(dev, { bytes: new Uint8Array(), mime: 'image/jpeg' })).rejects.toThrow(/empty/);
    expect(dev.sqlite.prepare('SELECT count(*) AS n FROM photo_blobs').get()).toEqual({ n: 0 });
  });

  test('a JPEG still carrying EXIF (written by piexifjs) is refused; its stripped copy is kept under its own hash', async () => {
    const camera = jpegWithExif({ dateTimeOriginal: '2026:12:03 14:05:09', lat: 51.5034, lon: -0.1276 });
    await expect(putPhotoBlob(dev, { bytes: camera, mime: 'image/jpeg' })).rejects.toThrow(
      'The photo still carries EXIF metadata; it must be removed before the photo is kept.',
    );
    expect(dev.sqlite.prepare('SELECT count(*) AS n FROM photo_blobs').get()).toEqual({ n: 0 });
    const stripped = stripJpegMetadata(camera);
    const { sha256 } = await putPhotoBlob(dev, { bytes: stripped, mime: 'image/jpeg' });
    // Node's own SHA-256 of the kept bytes is the name the record and the server use.
    expect(sha256).toBe(createHash('sha256').update(stripped).digest('hex'));
    expect(await getPhotoBytes(dev, sha256)).toEqual(stripped);
  });
});

test('drizzle reads through the proxy return typed rows and single rows', async () => {
  const rec = makeRecord();
  await submitDraft(dev, rec);
  const n = await dev.db.get<{ n: number }>(sql`SELECT count(*) AS n FROM outbox`);
  expect(n).toEqual([1]);
  const none = await dev.db
    .select()
    .from(outbox)
    .where(sql`id = 'nope'`)
    .get();
  expect(none).toBeUndefined();
});
