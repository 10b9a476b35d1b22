/**
 * The whole photo path, on both storage drivers (STORAGE_URL unset: the disk under DATA_DIR; s3://: a
 * local S3, s3rver, through the AWS SDK client): upload by SHA-256 (checked against Node's own SHA-256),
 * dedupe, refusals that store nothing, and reads with the operators' scope checks.
 */
import fs from 'node:fs';
import path from 'node:path';

import { count } from 'drizzle-orm';
import request from 'supertest';

import { photos } from '@/db/server/inspections';
import { storageOf } from '@/server/storage';
import { MAX_PHOTO_BYTES, photoKeyOf } from '@/server/sync/photo-store';

import { expectApiError, makeTestServer, signInAs, type TestServer } from './helpers';
import { startFakeS3, type FakeS3 } from './s3-fake';
import { imageBytes, sha256Hex } from './sync-fixtures';

jest.setTimeout(60_000);

let s3: FakeS3;
beforeAll(async () => {
  s3 = await startFakeS3();
});
afterAll(() => s3.stop());

describe.each(['disk', 's3'] as const)('on the %s storage', (driver) => {
  let server: TestServer;
  let inspector: string;
  let supervisor: string;
  let operator: string;
  beforeAll(async () => {
    server = await makeTestServer({ env: driver === 's3' ? { STORAGE_URL: s3.url() } : {} });
    expect(storageOf(server.config).description).toMatch(driver === 's3' ? /^s3:\/\// : /^disk /);
    inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
    supervisor = await signInAs(server.app, 'supervisor@pivotwatch.test');
    operator = await signInAs(server.app, 'operator@pivotwatch.test');
  });
  afterAll(() => server.close());

  const storage = () => storageOf(server.config);
  /** Stored photos, as the storage lists them (temporary files would start with a dot). */
  const filesOnDisk = () => storage().list('photos');
  /** The bytes stored for a photo, read through the storage. */
  const storedBytes = async (sha: string) => new Uint8Array((await storage().get(photoKeyOf(sha))) ?? []);
  /** On the disk, nothing half-written is left in the photos folder either. */
  const rawNames = () => {
    const dir = path.join(server.dataDir, 'photos');
    return driver === 'disk' && fs.existsSync(dir) ? fs.readdirSync(dir) : [];
  };
  const photoRows = () => server.db.select({ n: count() }).from(photos).get()?.n ?? 0;

  /** For the JSON error answers. */
  const getJson = (sha: string, token: string) =>
    request(server.app).get(`/api/photos/${sha}`).set('Authorization', `Bearer ${token}`);
  /** For the bytes. */
  const get = (sha: string, token: string) =>
    request(server.app)
      .get(`/api/photos/${sha}`)
      .set('Authorization', `Bearer ${token}`)
      .buffer(true)
      .parse((r, done) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => done(null, Buffer.concat(chunks)));
      });

  const put = (sha: string, bytes: Uint8Array, type = 'image/jpeg', token = inspector) =>
    request(server.app)
      .put(`/api/photos/${sha}`)
      .set('Authorization', `Bearer ${token}`)
      .set('Content-Type', type)
      .send(Buffer.from(bytes));

  describe('PUT /api/photos/:sha256', () => {
    test('stores new bytes once (201), and the same bytes again answer 200 without a second copy', async () => {
      const bytes = imageBytes(7);
      const sha = sha256Hex(bytes);
      const filesBefore = (await filesOnDisk()).length;

      const first = await put(sha, bytes);
      expect(first.status).toBe(201);
      expect(first.body).toEqual({ stored: true, sha256: sha });
      const again = await put(sha, bytes);
      expect(again.status).toBe(200);
      expect(again.body).toEqual({ stored: false, sha256: sha });
      // By someone else, too: the address is the content.
      expect((await put(sha, bytes, 'image/jpeg', supervisor)).status).toBe(200);

      expect((await filesOnDisk()).length).toBe(filesBefore + 1);
      expect(await filesOnDisk()).toContain(sha);
      expect(await storedBytes(sha)).toEqual(bytes);
      // Read back through the route: the same bytes, whose SHA-256 is the address.
      const read = await get(sha, supervisor);
      expect(read.status).toBe(200);
      expect(sha256Hex(new Uint8Array(read.body))).toBe(sha);
    });

    test('two uploads of the same new bytes at once: one stores them (201), the other finds them (200)', async () => {
      const bytes = imageBytes(31, 'jpeg', 200_000);
      const sha = sha256Hex(bytes);
      const statuses = (await Promise.all([put(sha, bytes), put(sha, bytes, 'image/jpeg', supervisor)]))
        .map((r) => r.status)
        .sort();
      expect(statuses).toEqual([200, 201]);
      expect((await filesOnDisk()).filter((f) => f === sha)).toHaveLength(1);
      expect(await storedBytes(sha)).toEqual(bytes);
      expect(rawNames().filter((f) => f.startsWith('.'))).toEqual([]);
    });

    test.each([
      ['png', 'image/png'],
      ['webp', 'image/webp'],
    ] as const)('a %s file is stored with its own type and read back with it', async (kind, mime) => {
      const bytes = imageBytes(11, kind);
      const sha = sha256Hex(bytes);
      expect((await put(sha, bytes, mime)).status).toBe(201);
      const res = await get(sha, supervisor);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe(mime);
      expect(res.headers['cache-control']).toMatch(/max-age=31536000/);
      expect(res.headers['cache-control']).toMatch(/private/);
      expect(new Uint8Array(res.body)).toEqual(bytes);
    });

    test('bytes that are not an image are refused with 415 not_an_image, and nothing is stored', async () => {
      const text = new TextEncoder().encode('Just some notes, not a photo at all.');
      const before = { files: (await filesOnDisk()).length, rows: photoRows() };
      const err = expectApiError(await put(sha256Hex(text), text), 415, 'not_an_image');
      expect(err.message).toMatch(/not a JPEG, PNG or WebP/);
      // A PDF labelled as a JPEG is still not an image.
      const pdf = new TextEncoder().encode('%PDF-1.7 fake');
      expectApiError(await put(sha256Hex(pdf), pdf), 415, 'not_an_image');
      expect({ files: (await filesOnDisk()).length, rows: photoRows() }).toEqual(before);
    });

    test('a body sent as something other than image bytes is a 415 that says what to send', async () => {
      const bytes = imageBytes(3);
      const err = expectApiError(
        await put(sha256Hex(bytes), bytes, 'text/plain'),
        415,
        'unsupported_media_type',
      );
      expect(err.message).toMatch(/image\/jpeg/);
    });

    test('more than 8 MB is refused with 413 payload_too_large and a message naming the limit', async () => {
      const big = new Uint8Array(MAX_PHOTO_BYTES + 1);
      big.set([0xff, 0xd8, 0xff, 0xe0]);
      const before = { files: (await filesOnDisk()).length, rows: photoRows() };
      const err = expectApiError(await put(sha256Hex(big), big), 413, 'payload_too_large');
      expect(err.message).toMatch(/8\.0 MB limit/);
      expect({ files: (await filesOnDisk()).length, rows: photoRows() }).toEqual(before);
    });

    test('exactly 8 MB is accepted', async () => {
      const edge = imageBytes(5, 'jpeg', MAX_PHOTO_BYTES);
      expect((await put(sha256Hex(edge), edge)).status).toBe(201);
    });

    test('bytes that do not hash to the address are refused with 400 hash_mismatch', async () => {
      const bytes = imageBytes(21);
      const wrong = sha256Hex(imageBytes(22));
      const before = { files: (await filesOnDisk()).length, rows: photoRows() };
      const err = expectApiError(await put(wrong, bytes), 400, 'hash_mismatch');
      expect(err.issues?.[0].path).toBe('params.sha256');
      expect({ files: (await filesOnDisk()).length, rows: photoRows() }).toEqual(before);
    });

    test('an address that is not a SHA-256 is a 400 naming it', async () => {
      const bytes = imageBytes(2);
      const err = expectApiError(await put('ABC', bytes), 400, 'validation_failed');
      expect(err.issues?.[0].path).toBe('params.sha256');
    });

    test("operators may upload (corrective evidence) but not read the inspection body's photos (403)", async () => {
      const own = imageBytes(4242);
      expect((await put(sha256Hex(own), own, 'image/jpeg', operator)).status).toBe(201);
      const bytes = imageBytes(8);
      const sha = sha256Hex(bytes);
      await put(sha, bytes);
      expectApiError(await getJson(sha, operator), 403, 'forbidden');
      // Their own upload they read back.
      const mine = await get(sha256Hex(own), operator);
      expect(mine.status).toBe(200);
      expect(new Uint8Array(mine.body)).toEqual(own);
    });
  });

  describe('GET /api/photos/:sha256', () => {
    test('an unknown photo is a JSON 404', async () => {
      const res = await request(server.app)
        .get(`/api/photos/${sha256Hex(imageBytes(999))}`)
        .set('Authorization', `Bearer ${inspector}`);
      expectApiError(res, 404, 'not_found');
    });

    test('a photo recorded but missing from the storage is a JSON 404, and uploading it again stores it', async () => {
      const bytes = imageBytes(77);
      const sha = sha256Hex(bytes);
      expect((await put(sha, bytes)).status).toBe(201);
      await storage().remove(photoKeyOf(sha));
      const err = expectApiError(await getJson(sha, inspector), 404, 'not_found');
      expect(err.message).toMatch(/missing/);
      // The row is there but the bytes are not: the upload writes them again.
      expect((await put(sha, bytes)).status).toBe(201);
      expect(new Uint8Array((await get(sha, inspector)).body)).toEqual(bytes);
    });
  });
});
