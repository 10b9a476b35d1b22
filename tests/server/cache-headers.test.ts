/**
 * What a browser or proxy may keep of an API answer (RFC 9111 §5.2.2: `no-store` forbids storing,
 * `private` forbids shared caches; RFC 9110 §12.5.5: `Vary` makes the cache key include a request header).
 * Every answer varies by the bearer token; JSON and errors are never stored; a photo may be kept by the
 * one browser that fetched it, and never served from cache to another token.
 */
import request from 'supertest';

import { makeTestServer, signInAs, type TestServer } from './helpers';
import { imageBytes, sha256Hex } from './sync-fixtures';

let server: TestServer;
let inspector: string;
beforeAll(async () => {
  server = await makeTestServer();
  inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
});
afterAll(() => server.close());

const varyTokens = (res: request.Response) =>
  String(res.headers.vary ?? '')
    .split(',')
    .map((v) => v.trim().toLowerCase());

function expectNoStore(res: request.Response) {
  expect(res.headers['cache-control']).toBe('no-store');
  expect(varyTokens(res)).toContain('authorization');
}

test('signed-in JSON answers are no-store and vary by Authorization', async () => {
  const res = await request(server.app).get('/api/rides').set('Authorization', `Bearer ${inspector}`);
  expect(res.status).toBe(200);
  expectNoStore(res);
});

test('errors are no-store too: no token, a body the parser refuses, an unknown route', async () => {
  expectNoStore(expectApiErrorResponse(await request(server.app).get('/api/rides'), 401));
  const badJson = await request(server.app)
    .post('/api/auth/sign-in')
    .set('Content-Type', 'application/json')
    .send('{"email":');
  expectNoStore(expectApiErrorResponse(badJson, 400));
  expectNoStore(
    expectApiErrorResponse(
      await request(server.app).get('/api/no-such-thing').set('Authorization', `Bearer ${inspector}`),
      404,
    ),
  );
});

test('a photo is private (kept by one browser only) and varies by Authorization; its 404 is no-store', async () => {
  const bytes = imageBytes(41);
  const sha = sha256Hex(bytes);
  const put = await request(server.app)
    .put(`/api/photos/${sha}`)
    .set('Authorization', `Bearer ${inspector}`)
    .set('Content-Type', 'image/jpeg')
    .send(Buffer.from(bytes));
  expect(put.status).toBe(201);
  expectNoStore(put);

  const res = await request(server.app).get(`/api/photos/${sha}`).set('Authorization', `Bearer ${inspector}`);
  expect(res.status).toBe(200);
  expect(res.headers['cache-control']).toMatch(/^private\b/);
  expect(res.headers['cache-control']).not.toMatch(/\bpublic\b/);
  expect(varyTokens(res)).toContain('authorization');

  const missing = await request(server.app)
    .get(`/api/photos/${'0'.repeat(64)}`)
    .set('Authorization', `Bearer ${inspector}`);
  expectNoStore(expectApiErrorResponse(missing, 404));
});

test('the web app itself is untouched (its own caching rules)', async () => {
  const res = await request(server.app).get('/api/health');
  expectNoStore(res);
  const page = await request(server.app).get('/some/page');
  expect(varyTokens(page)).not.toContain('authorization');
});

function expectApiErrorResponse(res: request.Response, status: number): request.Response {
  expect(res.status).toBe(status);
  expect(res.body.error).toBeDefined();
  return res;
}
