/**
 * Photos are stored without EXIF, and the SHA-256 that names a photo is the hash of the stored bytes
 * (Node's own SHA-256 checks it). The rule: the phone strips EXIF before hashing; the server refuses a
 * JPEG that still carries EXIF, XMP or IPTC (422 photo_metadata) rather than strip it, since stripping
 * would change the bytes under their name. The JPEGs are written by piexifjs and read back by exifr.
 * A record's photo keeps its capture-time source and place, and the inspection's read gives them back.
 */

import { count } from 'drizzle-orm';
import { parse } from 'exifr';
import request from 'supertest';

import { photos } from '@/db/server/inspections';
import { stripJpegMetadata } from '@/lib/jpeg-metadata';
import { storageOf } from '@/server/storage';
import { photoKeyOf } from '@/server/sync/photo-store';
import { jpegWithExif, plainJpeg, withXmp } from '@/tests/support/exif-jpeg';

import { expectApiError, makeTestServer, signInAs, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord, photoRefFor, sha256Hex } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let inspector: string;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
});
afterAll(() => server.close());

const put = (sha: string, bytes: Uint8Array) =>
  request(server.app)
    .put(`/api/photos/${sha}`)
    .set('Authorization', `Bearer ${inspector}`)
    .set('Content-Type', 'image/jpeg')
    .send(Buffer.from(bytes));
const rows = () => server.db.select({ n: count() }).from(photos).get()?.n ?? 0;
const stored = async (sha: string) => storageOf(server.config).get(photoKeyOf(sha));

const camera = () => jpegWithExif({ dateTimeOriginal: '2026:12:03 14:05:09', lat: 51.5034, lon: -0.1276 });

test('a JPEG still carrying EXIF (GPS, maker note) is refused with 422 photo_metadata, and nothing is stored', async () => {
  const bytes = camera();
  expect((await parse(Buffer.from(bytes), { gps: true }))?.latitude).toBeCloseTo(51.5034, 4);
  const sha = sha256Hex(bytes);
  const before = rows();
  const err = expectApiError(await put(sha, bytes), 422, 'photo_metadata');
  expect(err.message).toMatch(/still carries EXIF metadata/);
  expect(rows()).toBe(before);
  expect(await stored(sha)).toBeNull();
  // XMP alone (which may hold GPS too) is refused the same way.
  const xmp = withXmp(plainJpeg(), '<x:xmpmeta xmlns:x="adobe:ns:meta/"/>');
  expect(expectApiError(await put(sha256Hex(xmp), xmp), 422, 'photo_metadata').message).toMatch(/XMP/);
});

test('the stripped copy is stored; its SHA-256 is its name and exifr finds no EXIF in what the server holds', async () => {
  const bytes = stripJpegMetadata(withXmp(camera(), '<x:xmpmeta xmlns:x="adobe:ns:meta/"/>'));
  const sha = sha256Hex(bytes);
  const res = await put(sha, bytes);
  expect(res.status).toBe(201);
  const held = await stored(sha);
  expect(held).not.toBeNull();
  expect(sha256Hex(new Uint8Array(held!))).toBe(sha);
  expect(await parse(held!, { tiff: true, exif: true, gps: true, xmp: true, iptc: true })).toBeUndefined();
  // The named bytes must be the stored ones: the original's hash names nothing here.
  expect(await stored(sha256Hex(camera()))).toBeNull();
});

test('a record’s photo keeps where its time came from and its place; the inspection read gives them back', async () => {
  const comet = demoRide(server.db, 'Twin Comet');
  const withFacts = photoRefFor(stripJpegMetadata(camera()), {
    takenAt: '2026-12-03T14:05:09.000Z',
    takenAtSource: 'exif',
    place: { lat: 51.5034, lon: -0.1276, source: 'exif' },
  });
  const older = photoRefFor(plainJpeg(), { caption: 'From before' });
  const record = makeRecord(comet, { photos: [withFacts, older] });
  const pushed = await api.inspector.push([record]);
  expect(pushed.status).toBe(200);
  const read = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection;
  const byId = new Map(read.photos.map((p: { id: string }) => [p.id, p]));
  expect(byId.get(withFacts.id)).toMatchObject({
    takenAtSource: 'exif',
    place: { lat: 51.5034, lon: -0.1276, source: 'exif' },
  });
  expect(byId.get(older.id)).not.toHaveProperty('place');
  expect(byId.get(older.id)).not.toHaveProperty('takenAtSource');

  // A place out of range is refused with the schema's words, and the record is not stored.
  const bad = makeRecord(comet, {
    photos: [photoRefFor(plainJpeg(), { place: { lat: 123, lon: 0, source: 'device' } })],
  });
  const answer = await api.inspector.push([bad]);
  expect(JSON.stringify(answer.body)).toMatch(/Latitude must be between -90 and 90 degrees/);
  expect((await api.supervisor.get(`/api/inspections/${bad.id}`)).status).toBe(404);
});
