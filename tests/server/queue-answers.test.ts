/**
 * The review queue's remembered answers (server/http/json-answers.ts behind GET /api/review/queue): the
 * bytes sent are the JSON a fresh read gives, in the content coding asked for, with an ETag that answers
 * 304; and nothing remembered outlives a change to the queue or to the person asking.
 *
 * Outside references: the compressed bodies are decoded with Node's zlib (gzip is RFC 1952, brotli RFC
 * 7932), conditional requests follow RFC 9110 §13.1.2 (If-None-Match, weak comparison of entity tags,
 * §8.8.3.2) and §15.4.5 (304 carries no content).
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import zlib from 'node:zlib';

import Database from 'better-sqlite3';
import { eq, sql } from 'drizzle-orm';

import { users } from '@/db/server/schema';
import { apiErrorSchema } from '@/lib/api-errors';
import { queueQuerySchema, queueResponseSchema } from '@/features/review/schema';
import { endSessions } from '@/server/auth/sessions';
import { databaseFileName } from '@/server/db';
import { readQueueJson } from '@/server/queue/queue';
import { queueToday, refreshQueue } from '@/server/queue/queue-refresh';

import { makeTestServer, signInAs, userIdOf, type TestServer } from './helpers';

let server: TestServer;
let listening: http.Server;
let port: number;
let token: string;

beforeAll(async () => {
  server = await makeTestServer();
  token = await signInAs(server.app, 'supervisor@pivotwatch.test');
  // The demo queue is a few items, under the size worth compressing: after the day's rebuild, copies of
  // its rows (new keys) make pages of several kilobytes, as on a real desk. Written by another connection,
  // as only a refresh may write the queue in this process (what the server remembers follows both).
  readQueueJson(server.db, queueQuerySchema.parse({}), queueToday());
  const other = new Database(path.join(server.dataDir, databaseFileName));
  try {
    const columns = (other.pragma('table_info(review_queue)') as { name: string }[]).map(
      (c) => `"${c.name}"`,
    );
    const copied = columns.map((c) => (c === '"key"' ? `"key" || '~' || ?` : c)).join(', ');
    const copy = other.prepare(
      `INSERT INTO review_queue (${columns.join(', ')}) SELECT ${copied} FROM review_queue WHERE "key" NOT LIKE '%~%'`,
    );
    for (let n = 1; n <= 20; n++) copy.run(n);
  } finally {
    other.close();
  }
  listening = await new Promise<http.Server>((resolve) => {
    const s = server.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  port = (listening.address() as AddressInfo).port;
});

afterAll(async () => {
  await new Promise((resolve) => listening.close(resolve));
  server.close();
});

type Raw = { status: number; headers: http.IncomingHttpHeaders; body: Buffer };

/** A request over a real socket, the body exactly as sent (no client decoding it on the way). */
function get(url: string, headers: Record<string, string> = {}, method = 'GET'): Promise<Raw> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        path: url,
        method,
        headers: { authorization: `Bearer ${token}`, ...headers },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () =>
          resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }),
        );
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    req.end();
  });
}

const queueUrl = '/api/review/queue?pageSize=50';
/** The page as a fresh read of the database gives it, for comparison with what was sent. */
const freshJson = (search: string) =>
  readQueueJson(
    server.db,
    queueQuerySchema.parse(Object.fromEntries(new URLSearchParams(search))),
    queueToday(),
  );

describe('the bytes sent', () => {
  test('without Accept-Encoding: the JSON itself, its length and a weak ETag', async () => {
    const res = await get(queueUrl);
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(Number(res.headers['content-length'])).toBe(res.body.length);
    expect(res.headers.etag).toMatch(/^W\/"[0-9a-f]+-[\w-]+"$/);
    expect(res.body.toString('utf8')).toBe(freshJson('pageSize=50'));
    const page = queueResponseSchema.parse(JSON.parse(res.body.toString('utf8')));
    // The demo scenario keeps something in the queue, or nothing here would be worth compressing.
    expect(page.items.length).toBeGreaterThan(0);
    expect(res.body.length).toBeGreaterThan(1024);
  });

  test.each([
    ['br', 'br', (b: Buffer) => zlib.brotliDecompressSync(b)],
    ['gzip', 'gzip', (b: Buffer) => zlib.gunzipSync(b)],
    ['gzip, deflate, br', 'br', (b: Buffer) => zlib.brotliDecompressSync(b)],
    ['gzip;q=1, br;q=0.5', 'gzip', (b: Buffer) => zlib.gunzipSync(b)],
  ])('Accept-Encoding %s → %s, decoding to the same JSON, smaller', async (accept, coding, decode) => {
    const plain = await get(queueUrl);
    const res = await get(queueUrl, { 'accept-encoding': accept });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe(coding);
    expect(Number(res.headers['content-length'])).toBe(res.body.length);
    expect(res.body.length).toBeLessThan(plain.body.length / 2);
    expect(decode(res.body).equals(plain.body)).toBe(true);
    // One representation's tag for all codings: a weak validator (RFC 9110 §8.8.1).
    expect(res.headers.etag).toBe(plain.headers.etag);
    expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    expect(res.headers.vary).toMatch(/Authorization/i);
    expect(res.headers['cache-control']).toBe('no-store');
  });

  test('identity only, or a small page: sent as it is', async () => {
    const res = await get(queueUrl, { 'accept-encoding': 'identity' });
    expect(res.headers['content-encoding']).toBeUndefined();
    const small = await get('/api/review/queue?q=no-such-ride-anywhere', { 'accept-encoding': 'br' });
    expect(small.status).toBe(200);
    expect(small.headers['content-encoding']).toBeUndefined();
    expect(JSON.parse(small.body.toString('utf8')).total).toBe(0);
  });

  test('HEAD: the same headers, no body', async () => {
    const full = await get(queueUrl, { 'accept-encoding': 'gzip' });
    const head = await get(queueUrl, { 'accept-encoding': 'gzip' }, 'HEAD');
    expect(head.status).toBe(200);
    expect(head.body.length).toBe(0);
    expect(head.headers.etag).toBe(full.headers.etag);
    expect(head.headers['content-length']).toBe(full.headers['content-length']);
  });
});

describe('If-None-Match (RFC 9110 §13.1.2)', () => {
  test('the current tag, strong or weak form, a list or *: 304 with no content', async () => {
    const { headers } = await get(queueUrl);
    const etag = String(headers.etag);
    for (const tag of [etag, etag.replace(/^W\//, ''), `"other", ${etag}`, '*']) {
      const res = await get(queueUrl, { 'if-none-match': tag, 'accept-encoding': 'br' });
      expect(res.status).toBe(304);
      expect(res.body.length).toBe(0);
      expect(res.headers.etag).toBe(etag);
    }
  });

  test('another tag, or Cache-Control: no-cache: the whole page', async () => {
    const { headers } = await get(queueUrl);
    expect((await get(queueUrl, { 'if-none-match': 'W/"0-stale"' })).status).toBe(200);
    const forced = await get(queueUrl, {
      'if-none-match': String(headers.etag),
      'cache-control': 'no-cache',
    });
    expect(forced.status).toBe(200);
    expect(forced.body.length).toBeGreaterThan(0);
  });
});

describe('nothing remembered outlives a change', () => {
  const search = 'pageSize=50';
  const total = async () =>
    JSON.parse((await get(`/api/review/queue?${search}`)).body.toString('utf8')).total;

  test('a commit by another connection, then a refresh in this process: each seen by the next request', async () => {
    const first = await get(`/api/review/queue?${search}`, { 'accept-encoding': 'br' });
    const before = await total();
    const rideId = queueResponseSchema.parse(JSON.parse(freshJson(search))).items[0].rideId;
    const other = new Database(path.join(server.dataDir, databaseFileName));
    let removed: number;
    try {
      removed = other.prepare('DELETE FROM review_queue WHERE ride_id = ?').run(rideId).changes;
    } finally {
      other.close();
    }
    expect(removed).toBeGreaterThan(0);
    expect(await total()).toBe(before - removed);
    const changed = await get(`/api/review/queue?${search}`, { 'accept-encoding': 'br' });
    expect(changed.headers.etag).not.toBe(first.headers.etag);
    const sent =
      changed.headers['content-encoding'] === 'br' ? zlib.brotliDecompressSync(changed.body) : changed.body;
    expect(sent.toString('utf8')).toBe(freshJson(search));
    // The old tag no longer answers 304.
    const old = await get(`/api/review/queue?${search}`, { 'if-none-match': String(first.headers.etag) });
    expect(old.status).toBe(200);

    // The ride's own rows come back (its copies do not: they were never the ride's).
    refreshQueue(server.db, queueToday(), [rideId]);
    const refreshed = await total();
    expect(refreshed).toBeGreaterThan(before - removed);
    expect((await get(`/api/review/queue?${search}`)).body.toString('utf8')).toBe(freshJson(search));
  });

  test('a role change, disabling and a sign-out are refused on the next request, answer or not', async () => {
    const id = userIdOf(server.db, 'supervisor@pivotwatch.test');
    expect((await get(queueUrl)).status).toBe(200);

    server.db.update(users).set({ role: 'inspector' }).where(eq(users.id, id)).run();
    expectJsonError(await get(queueUrl), 403, 'forbidden');
    server.db.update(users).set({ role: 'supervisor' }).where(eq(users.id, id)).run();
    expect((await get(queueUrl)).status).toBe(200);

    server.db
      .update(users)
      .set({ disabledAt: sql`CURRENT_TIMESTAMP` })
      .where(eq(users.id, id))
      .run();
    expectJsonError(await get(queueUrl), 401, 'unauthorized');
    server.db.update(users).set({ disabledAt: null }).where(eq(users.id, id)).run();
    expect((await get(queueUrl)).status).toBe(200);

    endSessions(server.db, id, new Date(Date.now() + 1));
    expectJsonError(await get(queueUrl), 401, 'session_ended');
    token = await signInAs(server.app, 'supervisor@pivotwatch.test');
    expect((await get(queueUrl)).status).toBe(200);
  });

  test('bad input is still refused while pages are remembered', async () => {
    expect((await get(queueUrl)).status).toBe(200);
    expectJsonError(await get('/api/review/queue?sort=sideways'), 400, 'validation_failed');
    expectJsonError(await get('/api/review/queue?from=2026-03-10&to=2026-03-01'), 400, 'validation_failed');
  });
});

/** The API's one error shape on a raw response: status, JSON, `{ error: { code, message } }`. */
function expectJsonError(res: Raw, status: number, code: string) {
  expect(res.status).toBe(status);
  expect(res.headers['content-type']).toMatch(/^application\/json/);
  const parsed = apiErrorSchema.parse(JSON.parse(res.body.toString('utf8')));
  expect(parsed.error.code).toBe(code);
  expect(parsed.error.message.length).toBeGreaterThan(0);
}
