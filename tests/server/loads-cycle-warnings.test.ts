/**
 * POST /api/loads/cycle with a sensor-like record and only the `measured` fields (timeS + angleRad, all
 * defaults): the answer carries the warnings of the conditioning, and a cut-off above the record's Nyquist
 * frequency is a 400 naming the field. Fixed-axis rotation of a uniform rod (standard textbook result):
 * at constant ω the pin reaction at the bottom is m·g + m·ω²·L/2.
 */
import request from 'supertest';

import { type TestServer, expectApiError, makeTestServer, signInAs } from './helpers';

let server: TestServer;
let token: string;

beforeAll(async () => {
  server = await makeTestServer();
  token = await signInAs(server.app, 'operator@pivotwatch.test');
});
afterAll(() => server.close());

// A 10 rpm wheel arm read by an encoder within one turn at 50 Hz for 12 s, with a little deterministic jitter.
const w = (10 * 2 * Math.PI) / 60;
const timeS = Array.from({ length: 601 }, (_, k) => k / 50);
const angleRad = timeS.map((t, k) => {
  const q = 0.3 + w * t + 0.0008 * Math.sin(12.9898 * k * k);
  return q - 2 * Math.PI * Math.floor(q / (2 * Math.PI));
});
const body = (extra: object = {}) => ({
  bodies: [{ name: 'arm', massKg: 400, cgM: [3, 0], inertiaCgKgM2: 1200 }],
  profiles: [{ kind: 'measured', timeS, angleRad, ...extra }],
});

test('a wrapped encoder record comes back with its warnings and the right peak', async () => {
  const res = await request(server.app)
    .post('/api/loads/cycle')
    .set('Authorization', `Bearer ${token}`)
    .send(body());
  expect(res.status).toBe(200);
  const codes = res.body.warnings.map((x: { code: string }) => x.code);
  expect(codes).toEqual(expect.arrayContaining(['unwrapped', 'smoothing', 'noise']));
  expect(res.body.warnings.every((x: { joint?: number }) => x.joint === 0)).toBe(true);
  expect(res.body.samples).toBe(601);
  const truth = 400 * 9.80665 + 400 * w * w * 3;
  expect(Math.abs(res.body.joints[0].peakForce.value / truth - 1)).toBeLessThan(0.01);
});

test('a cut-off at or above half the sample rate is refused, naming the field', async () => {
  const res = await request(server.app)
    .post('/api/loads/cycle')
    .set('Authorization', `Bearer ${token}`)
    .send(body({ cutoffHz: 30 }));
  expectApiError(res, 400, 'validation_failed');
  expect(res.body.error.issues.map((i: { path: string }) => i.path)).toEqual(['profiles.0.cutoffHz']);
});
