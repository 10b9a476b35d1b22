/**
 * Each person's photo upload quota (server/sync/photo-quota.ts): new photos per rolling hour and new bytes
 * per rolling 24 hours, counted from the stored photos; re-sent bytes are never refused; another person's
 * quota is their own; the refusal is a 429 with Retry-After and stores nothing. Limits are set low here
 * (3 photos an hour, 1 MB a day) so the edges are reached with a few small uploads.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';

import { eq, sql } from 'drizzle-orm';
import request from 'supertest';

import { photos } from '@/db/server/inspections';

import { expectApiError, makeTestServer, signInAs, type TestServer } from './helpers';
import { imageBytes, sha256Hex } from './sync-fixtures';

let server: TestServer;
let inspector: string;
let supervisor: string;
beforeAll(async () => {
  server = await makeTestServer({ env: { PHOTO_UPLOADS_PER_HOUR: '3', PHOTO_MB_PER_DAY: '1' } });
  inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
  supervisor = await signInAs(server.app, 'supervisor@pivotwatch.test');
});
afterAll(() => server.close());

const put = (bytes: Uint8Array, token = inspector, sha = sha256Hex(bytes)) =>
  request(server.app)
    .put(`/api/photos/${sha}`)
    .set('Authorization', `Bearer ${token}`)
    .set('Content-Type', 'image/jpeg')
    .send(Buffer.from(bytes));
const rows = () =>
  server.db
    .select({ n: sql<number>`count(*)` })
    .from(photos)
    .get()?.n ?? 0;
/** Moves every stored photo `hours` into the past, as if that much time had gone by. */
const age = (hours: number) =>
  server.db
    .update(photos)
    .set({ storedAt: sql`strftime('%Y-%m-%dT%H:%M:%fZ', ${photos.storedAt}, ${`-${hours} hours`})` })
    .run();

test('the hour’s count: the fourth new photo is refused with 429 and Retry-After; re-sent bytes are not', async () => {
  const sent = [1, 2, 3].map((k) => imageBytes(k, 'jpeg', 1000 + k));
  for (const bytes of sent) expect((await put(bytes)).status).toBe(201);
  const before = rows();
  const fourth = await put(imageBytes(4, 'jpeg', 1004));
  const error = expectApiError(fourth, 429, 'upload_quota');
  expect(error.message).toMatch(/3 new photos in the last hour/);
  const retryAfter = Number(fourth.headers['retry-after']);
  expect(retryAfter).toBeGreaterThan(3500);
  expect(retryAfter).toBeLessThanOrEqual(3600);
  expect(rows()).toBe(before);
  // A phone re-sending after a lost answer is told the server has them.
  const again = await put(sent[0]);
  expect(again.status).toBe(200);
  expect(again.body.stored).toBe(false);
  // Someone else's quota is their own.
  expect((await put(imageBytes(5, 'jpeg', 1005), supervisor)).status).toBe(201);
  // An hour later the count starts again.
  age(1.01);
  expect((await put(imageBytes(4, 'jpeg', 1004))).status).toBe(201);
});

test('the day’s bytes: a photo that would pass 1 MB in 24 hours is refused and not stored', async () => {
  // Its own server, so the attempts made above do not count here.
  const daily = await makeTestServer({ env: { PHOTO_MB_PER_DAY: '1' } });
  const token = await signInAs(daily.app, 'inspector@pivotwatch.test');
  const send = (bytes: Uint8Array) =>
    request(daily.app)
      .put(`/api/photos/${sha256Hex(bytes)}`)
      .set('Authorization', `Bearer ${token}`)
      .set('Content-Type', 'image/jpeg')
      .send(Buffer.from(bytes));
  try {
    expect((await send(imageBytes(6, 'jpeg', 600 * 1024))).status).toBe(201);
    const next = imageBytes(7, 'jpeg', 500 * 1024);
    const error = expectApiError(await send(next), 429, 'upload_quota');
    expect(error.message).toMatch(/0\.6 MB of new photos in the last 24 hours.*1\.0 MB a day/);
    expect(
      daily.db
        .select()
        .from(photos)
        .where(eq(photos.sha256, sha256Hex(next)))
        .get(),
    ).toBeUndefined();
    // What is left of the budget is still usable.
    expect((await send(imageBytes(8, 'jpeg', 300 * 1024))).status).toBe(201);
    // A day later the budget is whole again.
    daily.db
      .update(photos)
      .set({ storedAt: sql`strftime('%Y-%m-%dT%H:%M:%fZ', ${photos.storedAt}, '-24.01 hours')` })
      .run();
    expect((await send(next)).status).toBe(201);
  } finally {
    daily.close();
  }
});

test('over the quota, an upload is answered 429 before its body is read', async () => {
  // 8 MB declared is past the 1 MB day (the supervisor has sent 1 kB); only the first 64 kB are sent.
  const listener = http.createServer(server.app);
  await new Promise<void>((resolve) => listener.listen(0, '127.0.0.1', resolve));
  try {
    const { port } = listener.address() as AddressInfo;
    const answer = await new Promise<{ status: number; code: string }>((resolve, reject) => {
      const req = http.request({
        host: '127.0.0.1',
        port,
        method: 'PUT',
        path: `/api/photos/${'a'.repeat(64)}`,
        headers: {
          Authorization: `Bearer ${supervisor}`,
          'Content-Type': 'image/jpeg',
          'Content-Length': String(8 * 1024 * 1024),
        },
      });
      req.write(Buffer.alloc(64 * 1024));
      req.on('response', (res) => {
        let body = '';
        res.on('data', (d) => (body += String(d)));
        res.on('end', () => {
          resolve({ status: res.statusCode ?? 0, code: JSON.parse(body).error.code });
          req.destroy();
        });
      });
      req.on('error', (error) => {
        if ((error as NodeJS.ErrnoException).code !== 'ECONNRESET') reject(error);
      });
    });
    expect(answer).toEqual({ status: 429, code: 'upload_quota' });
  } finally {
    listener.closeAllConnections();
    await new Promise((resolve) => listener.close(resolve));
  }
});

test('attempts of any outcome are limited to twice the hour’s count', async () => {
  const other = await makeTestServer({ env: { PHOTO_UPLOADS_PER_HOUR: '2' } });
  try {
    const token = await signInAs(other.app, 'inspector@pivotwatch.test');
    const wrong = '0'.repeat(64);
    const attempt = () =>
      request(other.app)
        .put(`/api/photos/${wrong}`)
        .set('Authorization', `Bearer ${token}`)
        .set('Content-Type', 'image/jpeg')
        .send(Buffer.from(imageBytes(9, 'jpeg', 2000)));
    for (let k = 0; k < 4; k++) expectApiError(await attempt(), 400, 'hash_mismatch');
    expectApiError(await attempt(), 429, 'too_many_uploads');
  } finally {
    other.close();
  }
});
