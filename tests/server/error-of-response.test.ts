/**
 * The app's byte-level requests (PDF download, evidence photo upload) read a failed answer with
 * `errorOfResponse`. The reference is the server itself: a real error answer from the test server, as the
 * Fetch API's `Response` hands it to the browser, must come out as the same code, message and issues.
 */
import request from 'supertest';

import { ApiRequestError, errorOfResponse } from '@/lib/api-errors';

import { makeTestServer, type TestServer } from './helpers';

let server: TestServer;
beforeAll(async () => {
  server = await makeTestServer();
});
afterAll(() => server.close());

test("a real validation error keeps the server's code, message and field issues", async () => {
  const answer = await request(server.app)
    .post('/api/auth/sign-in')
    .send({ email: 42, password: ['x'] });
  expect(answer.status).toBe(400);
  const err = await errorOfResponse(new Response(answer.text, { status: answer.status }), 'fallback');
  expect(err).toBeInstanceOf(ApiRequestError);
  expect(err.status).toBe(400);
  expect(err.code).toBe(answer.body.error.code);
  expect(err.message).toBe(answer.body.error.message);
  expect(err.issues.map((i) => i.path)).toEqual(expect.arrayContaining(['email', 'password']));
});

test('an answer without issues gets an empty list, as the JSON client gives', async () => {
  const body = JSON.stringify({ error: { code: 'not_found', message: 'No such notice.' } });
  const err = await errorOfResponse(new Response(body, { status: 404 }), 'fallback');
  expect([err.status, err.code, err.message, err.issues]).toEqual([404, 'not_found', 'No such notice.', []]);
});

test("a body that is not the API's (a proxy's HTML page, an empty body) falls back under http_error", async () => {
  const html = await errorOfResponse(
    new Response('<html>Bad gateway</html>', { status: 502 }),
    'No PDF (502).',
  );
  expect([html.status, html.code, html.message]).toEqual([502, 'http_error', 'No PDF (502).']);
  const empty = await errorOfResponse(new Response(null, { status: 500 }), 'Upload failed (500).');
  expect([empty.status, empty.code, empty.message]).toEqual([500, 'http_error', 'Upload failed (500).']);
});
