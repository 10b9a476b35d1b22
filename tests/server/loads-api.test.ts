/**
 * The load routes through HTTP: the issue's API contract, checked with textbook closed-form values
 * (uniform slender rod, e.g. Meriam & Kraige, Engineering Mechanics: Dynamics, rigid-body plane
 * kinetics — standard results, recalled from memory and re-derived in tests/engine/closed-form.test.ts).
 */
import request from 'supertest';

import { type TestServer, expectApiError, makeTestServer, signInAs } from './helpers';

let server: TestServer;
let token: string;
const g = 9.80665;

beforeAll(async () => {
  server = await makeTestServer();
  token = await signInAs(server.app, 'operator@pivotwatch.test');
});
afterAll(() => server.close());

const rod = (m: number, L: number) => ({
  name: 'rod',
  massKg: m,
  cgM: [L / 2, 0],
  inertiaCgKgM2: (m * L * L) / 12,
});

test('needs a session', async () => {
  const res = await request(server.app).post('/api/loads').send({});
  expectApiError(res, 401, 'unauthorized');
});

test('rod released from rest horizontal: α = 3g/(2L), pin reaction mg/4 upward (textbook)', async () => {
  const m = 50;
  const L = 3;
  // Free pin: the angular acceleration must make the pin torque zero; give α = 3g/(2L) clockwise.
  const res = await request(server.app)
    .post('/api/loads')
    .set('Authorization', `Bearer ${token}`)
    .send({
      gravityMS2: g,
      bodies: [rod(m, L)],
      state: { angleRad: [0], rateRadS: [0], accelRadS2: [-(3 * g) / (2 * L)] },
    });
  expect(res.status).toBe(200);
  const joint = res.body.joints[0];
  expect(joint.torqueNm).toBeCloseTo(0, 6);
  expect(joint.forceN[0]).toBeCloseTo(0, 6);
  expect(joint.forceN[1]).toBeCloseTo((m * g) / 4, 6); // 122.6 N
  expect(res.body.bodies[0].cgAccelMS2[1]).toBeCloseTo((-3 * g) / 4, 6);
});

test('rod driven at constant ω: reaction mg + mω²L/2 at the bottom, mg − mω²L/2 at the top (textbook)', async () => {
  const m = 100;
  const L = 2;
  const w = 3;
  const at = async (angle: number) =>
    request(server.app)
      .post('/api/loads')
      .set('Authorization', `Bearer ${token}`)
      .send({
        gravityMS2: g,
        bodies: [rod(m, L)],
        state: { angleRad: [angle], rateRadS: [w], accelRadS2: [0] },
      });
  const bottom = await at(-Math.PI / 2);
  const top = await at(Math.PI / 2);
  expect(bottom.body.joints[0].forceMagnitudeN).toBeCloseTo(m * g + (m * w * w * L) / 2, 6); // ≈ 1881 N
  expect(top.body.joints[0].forceMagnitudeN).toBeCloseTo(Math.abs(m * g - (m * w * w * L) / 2), 6); // ≈ 81 N
  // Along the arm (body x points from the pivot to the tip): the pin pulls the rod inward.
  expect(bottom.body.joints[0].forceBodyN[0]).toBeCloseTo(-(m * g + (m * w * w * L) / 2), 6);
  // Driven at constant speed: torque = mg(L/2)cosθ; zero at top and bottom, full at horizontal.
  const level = await at(0);
  expect(level.body.joints[0].torqueNm).toBeCloseTo(m * g * (L / 2), 6);
});

test('moments about a requested point agree when taken from the forces and from I·α + kinetic moments', async () => {
  const res = await request(server.app)
    .post('/api/loads')
    .set('Authorization', `Bearer ${token}`)
    .send({
      bodies: [
        { name: 'arm', massKg: 2000, cgM: [3, 0.2], inertiaCgKgM2: 9000, tipM: [6, 0] },
        { name: 'gondola', massKg: 800, cgM: [0.1, -1.2], inertiaCgKgM2: 400 },
      ],
      state: { angleRad: [0.4, -0.9], rateRadS: [1.1, 0.3], accelRadS2: [0.5, -0.2] },
      points: [{ name: 'seat', pointM: [2, 1] }],
    });
  expect(res.status).toBe(200);
  for (const b of res.body.moments[0].bodies) {
    expect(Math.abs(b.fromForcesNm - b.fromKineticsNm)).toBeLessThan(
      1e-6 * Math.max(1, Math.abs(b.fromForcesNm)),
    );
  }
});

test.each([
  [
    'a negative mass',
    'bodies.1.massKg',
    {
      bodies: [{ ...rod(10, 1), tipM: [1, 0] }, { ...rod(-1, 1) }],
      state: { angleRad: [0, 0], rateRadS: [0, 0], accelRadS2: [0, 0] },
    },
  ],
  [
    'array lengths that do not match',
    'state.angleRad',
    { bodies: [rod(10, 1)], state: { angleRad: [0, 1], rateRadS: [0], accelRadS2: [0] } },
  ],
  [
    'a body followed by another without tipM',
    'bodies.0.tipM',
    { bodies: [rod(10, 1), rod(10, 1)], state: { angleRad: [0, 0], rateRadS: [0, 0], accelRadS2: [0, 0] } },
  ],
  ['a missing state', 'state', { bodies: [rod(10, 1)] }],
])('rejects %s with 400 naming %s', async (_what, path, body) => {
  const res = await request(server.app).post('/api/loads').set('Authorization', `Bearer ${token}`).send(body);
  expectApiError(res, 400, 'validation_failed');
  expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain(path);
});

test('non-finite numbers are refused (JSON cannot carry them; a string stands in)', async () => {
  const res = await request(server.app)
    .post('/api/loads')
    .set('Authorization', `Bearer ${token}`)
    .send({
      bodies: [{ ...rod(10, 1), massKg: 'Infinity' }],
      state: { angleRad: [0], rateRadS: [0], accelRadS2: [0] },
    });
  expectApiError(res, 400, 'validation_failed');
  expect(res.body.error.issues[0].path).toBe('bodies.0.massKg');
});

test('a whole cycle at constant speed peaks at the bottom with mg + mω²r_G (textbook)', async () => {
  const m = 100;
  const L = 2;
  const rpm = 20;
  const w = (rpm * 2 * Math.PI) / 60;
  const res = await request(server.app)
    .post('/api/loads/cycle')
    .set('Authorization', `Bearer ${token}`)
    .send({ gravityMS2: g, bodies: [rod(m, L)], profiles: [{ kind: 'constant', rpm }], samples: 720 });
  expect(res.status).toBe(200);
  const peak = res.body.joints[0].peakForce;
  // Sampling may fall just beside the exact bottom, so the sampled peak may sit a hair below.
  const exact = m * g + m * w * w * (L / 2);
  expect(peak.value).toBeLessThanOrEqual(exact * (1 + 1e-9));
  expect(peak.value).toBeGreaterThan(exact * (1 - 1e-5));
  expect(res.body.timeS).toHaveLength(720);
  expect(res.body.assumptions.length).toBeGreaterThan(0);
});

test('cycle validation names the field', async () => {
  const res = await request(server.app)
    .post('/api/loads/cycle')
    .set('Authorization', `Bearer ${token}`)
    .send({ bodies: [rod(10, 1)], profiles: [{ kind: 'constant', rpm: 5 }], samples: 1_000_000 });
  expectApiError(res, 400, 'validation_failed');
  expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain('samples');
});
