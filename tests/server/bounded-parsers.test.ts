/**
 * The JSON parsers by size: 2 MB everywhere; the sync push (16 MB) and the fatigue routes (32 MB) parse
 * their large bodies only after the token and role are checked, so an anonymous 10 MB body is refused
 * without being read.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';

import request from 'supertest';

import { type TestServer, expectApiError, makeTestServer, signInAs } from './helpers';

let server: TestServer;
let listener: http.Server;
let port: number;
beforeAll(async () => {
  server = await makeTestServer();
  listener = http.createServer(server.app);
  await new Promise<void>((resolve) => listener.listen(0, '127.0.0.1', resolve));
  port = (listener.address() as AddressInfo).port;
});
afterAll(async () => {
  listener.closeAllConnections();
  await new Promise((resolve) => listener.close(resolve));
  server.close();
});

/**
 * Declares a body of `declared` bytes, sends only the first 64 kB and waits for the answer. An answer
 * arriving while most of the body is still unsent proves the server did not wait to read it.
 */
function answerToPartialBody(path: string, declared: number, token?: string) {
  return new Promise<{ status: number; body: string; sent: number }>((resolve, reject) => {
    const req = http.request({
      host: '127.0.0.1',
      port,
      method: 'POST',
      path,
      headers: {
        'Content-Type': 'application/json',
        'Content-Length': String(declared),
        ...(token ? { Authorization: `Bearer ${token}` } : {}),
      },
    });
    const chunk = Buffer.alloc(64 * 1024, 0x20);
    req.write(chunk);
    req.on('response', (res) => {
      let body = '';
      res.on('data', (d) => (body += String(d)));
      res.on('end', () => {
        resolve({ status: res.statusCode ?? 0, body, sent: chunk.length });
        req.destroy();
      });
    });
    req.on('error', (error) => {
      if ((error as NodeJS.ErrnoException).code !== 'ECONNRESET') reject(error);
    });
  });
}

const tenMegabytes = 10 * 1024 * 1024;

test('a 10 MB sync push without a token gets 401 without the body being read', async () => {
  const res = await answerToPartialBody('/api/sync/push', tenMegabytes);
  expect(res.status).toBe(401);
  expect(JSON.parse(res.body).error.code).toBe('unauthorized');
  expect(res.sent).toBeLessThan(tenMegabytes / 100);
});

test('a 10 MB fatigue body without a token, or from a role the route refuses, is not read either', async () => {
  const anonymous = await answerToPartialBody('/api/fatigue/rainflow', tenMegabytes);
  expect(anonymous.status).toBe(401);
  const operator = await signInAs(server.app, 'operator@pivotwatch.test');
  const refused = await answerToPartialBody('/api/fatigue/rainflow', tenMegabytes, operator);
  expect(refused.status).toBe(403);
  // Every role may push now (operators send their daily checks), so a signed-in push is read and checked.
});

test('signed in, a sync push above 2 MB is parsed (and validated); elsewhere 2 MB is the limit', async () => {
  const inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
  const big = { batchId: 'not-a-uuid', records: [], padding: 'x'.repeat(3 * 1024 * 1024) };
  const push = await request(server.app)
    .post('/api/sync/push')
    .set('Authorization', `Bearer ${inspector}`)
    .send(big);
  // Read and checked as a batch: refused for its fields, not for its size.
  expectApiError(push, 400, 'validation_failed');
  const loads = await request(server.app)
    .post('/api/loads')
    .set('Authorization', `Bearer ${inspector}`)
    .send(big);
  expectApiError(loads, 413, 'payload_too_large');
});

test('signed in, a fatigue series above 2 MB is counted', async () => {
  const inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
  // 400,000 values alternating 0 and 100 MPa: ASTM E1049 rainflow gives full cycles of range 100 and at
  // most two half cycles (§5.4.4: alternating peaks of equal size close a cycle every two reversals).
  const series = Array.from({ length: 400_000 }, (_, i) => (i % 2 === 0 ? 0 : 100));
  const res = await request(server.app)
    .post('/api/fatigue/rainflow')
    .set('Authorization', `Bearer ${inspector}`)
    .send({ series });
  expect(res.status).toBe(200);
  const cycles = res.body.cycles as { range: number; count: number }[];
  expect(cycles.every((c) => c.range === 100)).toBe(true);
  const counted = cycles.reduce((n, c) => n + c.count, 0);
  expect(counted).toBeCloseTo((400_000 - 1) / 2, 6);
});
