/**
 * POST /api/loads/cycle with a free joint, through HTTP. The period is checked against the exact free
 * swing of a rigid pendulum (any dynamics textbook: T = 4·√(I_O/(m·g·r))·K(sin(A/2)), K by the
 * arithmetic–geometric mean; recalled from memory), and a free pin must come back with torque 0.
 */
import request from 'supertest';

import { type TestServer, expectApiError, makeTestServer, signInAs } from './helpers';

let server: TestServer;
let token: string;
const g = 9.80665;

beforeAll(async () => {
  server = await makeTestServer();
  token = await signInAs(server.app, 'inspector@pivotwatch.test');
});
afterAll(() => server.close());

const post = (body: object) =>
  request(server.app).post('/api/loads/cycle').set('Authorization', `Bearer ${token}`).send(body);

function ellipticK(k: number): number {
  let a = 1;
  let b = Math.sqrt(1 - k * k);
  for (let i = 0; i < 40; i++) [a, b] = [(a + b) / 2, Math.sqrt(a * b)];
  return Math.PI / (2 * a);
}

// Invented swing: a 3 t body, centre 6 m below its pin, 9,000 kg·m² about its centre.
const m = 3000;
const r = 6;
const IG = 9000;
const swing = { name: 'swing', massKg: m, cgM: [r, 0], inertiaCgKgM2: IG };

test('a free swing from rest at 120°: the cycle is one period, reported, and the pin torque is 0', async () => {
  const A = (120 * Math.PI) / 180;
  const res = await post({
    gravityMS2: g,
    bodies: [swing],
    profiles: [{ kind: 'free', angleRad: -Math.PI / 2 + A }],
  });
  expect(res.status).toBe(200);
  const T = 4 * Math.sqrt((IG + m * r * r) / (m * g * r)) * ellipticK(Math.sin(A / 2));
  expect(Math.abs(res.body.durationS - T) / T).toBeLessThan(1e-7);
  const joint = res.body.joints[0];
  expect(joint.freePeriodS).toBeCloseTo(T, 6);
  const torques: number[] = joint.torqueNm;
  expect(torques).toHaveLength(360);
  for (const t of torques) expect(Math.abs(t)).toBeLessThan(1e-6);
  expect(res.body.warnings).toContainEqual({
    code: 'free-period',
    level: 'info',
    joint: 0,
    message: `Free swing (swing): period ${Number(T.toPrecision(3))} s found by integration`,
  });
});

test('a free gondola on a driven arm: the arm’s revolution is the cycle, the gondola’s pin carries no torque', async () => {
  const res = await post({
    bodies: [
      { name: 'arm', massKg: 4000, cgM: [3, 0], inertiaCgKgM2: 20_000, tipM: [8, 0] },
      { name: 'gondola', massKg: 1200, cgM: [1.5, 0], inertiaCgKgM2: 600 },
    ],
    profiles: [
      { kind: 'constant', rpm: 6 },
      { kind: 'free', angleRad: -Math.PI / 2 },
    ],
  });
  expect(res.status).toBe(200);
  expect(res.body.durationS).toBe(10);
  for (const t of res.body.joints[1].torqueNm as number[]) expect(Math.abs(t)).toBeLessThan(1e-6);
  expect(Math.max(...(res.body.joints[0].torqueNm as number[]).map(Math.abs))).toBeGreaterThan(1000);
});

test.each([
  [
    'a free pin that carries no inertia',
    'profiles.0',
    { bodies: [{ ...swing, cgM: [0, 0], inertiaCgKgM2: 0 }], profiles: [{ kind: 'free', angleRad: 1 }] },
  ],
  [
    'a free body hanging at rest with no other cycle length',
    'durationS',
    { bodies: [swing], profiles: [{ kind: 'free', angleRad: -Math.PI / 2 }] },
  ],
  [
    'a free swing too fast to integrate over a day-long cycle',
    'durationS',
    {
      bodies: [{ ...swing, cgM: [0.05, 0], inertiaCgKgM2: 0 }],
      profiles: [{ kind: 'free', angleRad: 1 }],
      durationS: 86_400,
    },
  ],
  [
    'a free angle that is not a number',
    'profiles.0.angleRad',
    { bodies: [swing], profiles: [{ kind: 'free', angleRad: 'down' }] },
  ],
  [
    'a free start rate that is not finite',
    'profiles.0.rateRadS',
    { bodies: [swing], profiles: [{ kind: 'free', angleRad: 0, rateRadS: null }] },
  ],
])('rejects %s with 400 naming %s', async (_what, path, body) => {
  const error = expectApiError(await post(body), 400, 'validation_failed');
  expect(error.issues?.map((i) => i.path)).toContain(path);
});
