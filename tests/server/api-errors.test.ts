import express from 'express';
import request from 'supertest';

import { z } from 'zod';

import { errorHandler } from '@/server/http/errors';
import { validate } from '@/server/http/validate';
import { createLogger } from '@/server/logger';

import { expectApiError, makeTestServer, type TestServer } from './helpers';

let server: TestServer;
beforeAll(async () => {
  server = await makeTestServer();
});
afterAll(() => server.close());

test('GET /api/health answers 200 {ok:true}', async () => {
  const res = await request(server.app).get('/api/health');
  expect(res.status).toBe(200);
  expect(res.body).toEqual({ ok: true });
});

test('security headers: our CSP, no cross-origin-embedder-policy', async () => {
  const res = await request(server.app).get('/api/health');
  const csp = res.headers['content-security-policy'];
  expect(csp).toContain("default-src 'self'");
  expect(csp).toContain("script-src 'self' 'wasm-unsafe-eval'");
  expect(csp).toContain("worker-src 'self' blob:");
  expect(csp).toContain("connect-src 'self'");
  expect(csp).not.toContain('upgrade-insecure-requests');
  expect(res.headers['cross-origin-embedder-policy']).toBeUndefined();
  expect(res.headers['x-content-type-options']).toBe('nosniff');
  expect(res.headers['x-powered-by']).toBeUndefined();
});

test('malformed JSON → 400 bad_json', async () => {
  const res = await request(server.app)
    .post('/api/auth/sign-in')
    .set('Content-Type', 'application/json')
    .send('{"email": "admin@pivotwatch.test", "password": ');
  expectApiError(res, 400, 'bad_json');
});

test('wrong types → 400 validation_failed with issues naming each field', async () => {
  const res = await request(server.app)
    .post('/api/auth/sign-in')
    .send({ email: 42, password: ['x'] });
  const error = expectApiError(res, 400, 'validation_failed');
  const paths = error.issues?.map((i) => i.path);
  expect(paths).toEqual(expect.arrayContaining(['email', 'password']));
});

test('a missing body is a validation error, not a crash', async () => {
  const res = await request(server.app).post('/api/auth/sign-in');
  const error = expectApiError(res, 400, 'validation_failed');
  expect(error.issues?.length).toBeGreaterThan(0);
});

test('an invalid e-mail is named in the issues with a readable message', async () => {
  const res = await request(server.app)
    .post('/api/auth/sign-in')
    .send({ email: 'not-an-address', password: 'x' });
  const error = expectApiError(res, 400, 'validation_failed');
  expect(error.issues).toEqual([{ path: 'email', message: 'Enter a valid e-mail address' }]);
});

test('a body over 2 MB → 413 JSON', async () => {
  const res = await request(server.app)
    .post('/api/auth/sign-in')
    .set('Content-Type', 'application/json')
    .send(JSON.stringify({ email: 'a@b.test', password: 'x'.repeat(2.5 * 1024 * 1024) }));
  expectApiError(res, 413, 'payload_too_large');
});

test.each(['get', 'post', 'put', 'delete'] as const)(
  'unknown /api path (%s) → 404 JSON, never the app',
  async (method) => {
    const res = await request(server.app)[method]('/api/no-such-thing/here');
    const error = expectApiError(res, 404, 'not_found');
    expect(error.message).toContain('/api/no-such-thing/here');
    expect(res.text).not.toMatch(/<html/i);
  },
);

test('unexpected errors → 500 with a generic message, logged server-side, no stack', async () => {
  const logged: unknown[] = [];
  const logger = createLogger({ logLevel: 'error' });
  jest.spyOn(logger, 'error').mockImplementation((obj: unknown) => {
    logged.push(obj);
  });
  const app = express();
  app.get('/boom', () => {
    throw new Error('database file is corrupt at /secret/path');
  });
  app.use(errorHandler(logger));

  const res = await request(app).get('/boom');
  expect(res.status).toBe(500);
  expect(res.body.error.code).toBe('internal_error');
  expect(res.text).not.toContain('corrupt');
  expect(res.text).not.toContain('/secret/path');
  expect(logged).toHaveLength(1);
});

describe('validate()', () => {
  const input = validate({
    query: z.object({ limit: z.coerce.number().int().max(100).default(20) }),
    params: z.object({ rideId: z.uuid() }),
  });
  const app = express();
  app.get('/rides/:rideId/readings', input, (_req, res) => {
    res.json({ limit: input.query(res), rideId: input.params(res).rideId });
  });
  app.use(errorHandler(createLogger({ logLevel: 'silent' })));
  const rideId = '7a540d16-57dc-49c9-8bae-74cc4b719746';

  test('hands the parsed (coerced, defaulted) values to the handler', async () => {
    const res = await request(app).get(`/rides/${rideId}/readings?limit=50`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ limit: { limit: 50 }, rideId });
    expect((await request(app).get(`/rides/${rideId}/readings`)).body.limit).toEqual({ limit: 20 });
  });

  test('reports every bad query and route param, prefixed by where it came from', async () => {
    const res = await request(app).get('/rides/not-a-uuid/readings?limit=500');
    const error = expectApiError(res, 400, 'validation_failed');
    expect(error.issues?.map((i) => i.path).sort()).toEqual(['params.rideId', 'query.limit']);
  });
});
