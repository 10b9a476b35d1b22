import fs from 'node:fs';
import path from 'node:path';

import { count } from 'drizzle-orm';
import request from 'supertest';

import { photos } from '@/db/server/inspections';
import { MAX_PHOTO_BYTES } from '@/server/sync/photo-store';

import { expectApiError, makeTestServer, signInAs, type TestServer } from './helpers';
import { imageBytes, sha256Hex } from './sync-fixtures';

let server: TestServer;
let inspector: string;
let supervisor: string;
let operator: string;
beforeAll(async () => {
  server = await makeTestServer();
  inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
  supervisor = await signInAs(server.app, 'supervisor@pivotwatch.test');
  operator = await signInAs(server.app, 'operator@pivotwatch.test');
});
afterAll(() => server.close());

const photoDir = () => path.join(server.dataDir, 'photos');
/** Stored photo files; temporary files would start with a dot. */
const filesOnDisk = () => (fs.existsSync(photoDir()) ? fs.readdirSync(photoDir()) : []);
const photoRows = () => server.db.select({ n: count() }).from(photos).get()?.n ?? 0;

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
    const filesBefore = filesOnDisk().length;

    const first = await put(sha, bytes);
    expect(first.status).toBe(201);
    expect(first.body).toEqual({ stored: true, sha256: sha });
    const again = await put(sha, bytes);
    expect(again.status).toBe(200);
    expect(again.body).toEqual({ stored: false, sha256: sha });
    // By someone else, too: the address is the content.
    expect((await put(sha, bytes, 'image/jpeg', supervisor)).status).toBe(200);

    expect(filesOnDisk().length).toBe(filesBefore + 1);
    expect(filesOnDisk()).toContain(sha);
    expect(new Uint8Array(fs.readFileSync(path.join(photoDir(), sha)))).toEqual(bytes);
  });

  test('two uploads of the same new bytes at once: one stores them (201), the other finds them (200)', async () => {
    const bytes = imageBytes(31, 'jpeg', 200_000);
    const sha = sha256Hex(bytes);
    const statuses = (await Promise.all([put(sha, bytes), put(sha, bytes, 'image/jpeg', supervisor)]))
      .map((r) => r.status)
      .sort();
    expect(statuses).toEqual([200, 201]);
    expect(filesOnDisk().filter((f) => f === sha)).toHaveLength(1);
    expect(filesOnDisk().filter((f) => f.startsWith('.'))).toEqual([]);
  });

  test.each([
    ['png', 'image/png'],
    ['webp', 'image/webp'],
  ] as const)('a %s file is stored with its own type and read back with it', async (kind, mime) => {
    const bytes = imageBytes(11, kind);
    const sha = sha256Hex(bytes);
    expect((await put(sha, bytes, mime)).status).toBe(201);
    const res = await request(server.app)
      .get(`/api/photos/${sha}`)
      .set('Authorization', `Bearer ${supervisor}`)
      .buffer(true)
      .parse((r, done) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe(mime);
    expect(res.headers['cache-control']).toMatch(/max-age=31536000/);
    expect(res.headers['cache-control']).toMatch(/private/);
    expect(new Uint8Array(res.body)).toEqual(bytes);
  });

  test('bytes that are not an image are refused with 415 not_an_image, and nothing is stored', async () => {
    const text = new TextEncoder().encode('Just some notes, not a photo at all.');
    const before = { files: filesOnDisk().length, rows: photoRows() };
    const err = expectApiError(await put(sha256Hex(text), text), 415, 'not_an_image');
    expect(err.message).toMatch(/not a JPEG, PNG or WebP/);
    // A PDF labelled as a JPEG is still not an image.
    const pdf = new TextEncoder().encode('%PDF-1.7 fake');
    expectApiError(await put(sha256Hex(pdf), pdf), 415, 'not_an_image');
    expect({ files: filesOnDisk().length, rows: photoRows() }).toEqual(before);
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
    const before = { files: filesOnDisk().length, rows: photoRows() };
    const err = expectApiError(await put(sha256Hex(big), big), 413, 'payload_too_large');
    expect(err.message).toMatch(/8\.0 MB limit/);
    expect({ files: filesOnDisk().length, rows: photoRows() }).toEqual(before);
  });

  test('exactly 8 MB is accepted', async () => {
    const edge = imageBytes(5, 'jpeg', MAX_PHOTO_BYTES);
    expect((await put(sha256Hex(edge), edge)).status).toBe(201);
  });

  test('bytes that do not hash to the address are refused with 400 hash_mismatch', async () => {
    const bytes = imageBytes(21);
    const wrong = sha256Hex(imageBytes(22));
    const before = { files: filesOnDisk().length, rows: photoRows() };
    const err = expectApiError(await put(wrong, bytes), 400, 'hash_mismatch');
    expect(err.issues?.[0].path).toBe('params.sha256');
    expect({ files: filesOnDisk().length, rows: photoRows() }).toEqual(before);
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
    expectApiError(
      await request(server.app).get(`/api/photos/${sha}`).set('Authorization', `Bearer ${operator}`),
      403,
      'forbidden',
    );
  });
});

describe('GET /api/photos/:sha256', () => {
  test('an unknown photo is a JSON 404', async () => {
    const res = await request(server.app)
      .get(`/api/photos/${sha256Hex(imageBytes(999))}`)
      .set('Authorization', `Bearer ${inspector}`);
    expectApiError(res, 404, 'not_found');
  });
});
