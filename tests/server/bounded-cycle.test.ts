/**
 * Bounded work on `POST /api/loads/cycle`: the size cap answers before any analysis, the analysis runs in a
 * worker thread (the event loop keeps answering meanwhile) and stops at the server's time limit. The
 * worker's answer is checked against the engine run in this process and against the textbook peak of a
 * rod turning at constant speed (pin force mg + mω²L/2 at the bottom; e.g. Meriam & Kraige, Engineering
 * Mechanics: Dynamics, rigid-body plane kinetics — a standard result, recalled from memory).
 */
import type { AddressInfo } from 'node:net';

import request from 'supertest';

import { analyseCycleRequest } from '@/features/loads/schema';
import { HTTP_CYCLE_MAX_POINTS, cycleSizeIssue } from '@/server/compute/cycle';

import { type TestServer, expectApiError, makeTestServer, signInAs } from './helpers';

const g = 9.80665;
const rod = (m: number, L: number, name = 'rod') => ({
  name,
  massKg: m,
  cgM: [L / 2, 0],
  inertiaCgKgM2: (m * L * L) / 12,
  tipM: [L, 0],
});
/** A chain of `n` rods, each turning at its own steady speed. */
const chain = (n: number, samples: number) => ({
  gravityMS2: g,
  bodies: Array.from({ length: n }, (_, i) => rod(100, 2, `arm ${i + 1}`)),
  profiles: Array.from({ length: n }, (_, i) => ({ kind: 'constant', rpm: 5 + i })),
  durationS: 12,
  samples,
});

let server: TestServer;
let token: string;
beforeAll(async () => {
  server = await makeTestServer();
  token = await signInAs(server.app, 'operator@pivotwatch.test');
});
afterAll(() => server.close());

const post = (app: TestServer['app'], body: object, bearer = token) =>
  request(app).post('/api/loads/cycle').set('Authorization', `Bearer ${bearer}`).send(body);

test('more samples than the cap allows for the chain is a 400 naming samples, before any analysis', async () => {
  // The issue's case: 100,000 samples × 10 bodies, ten times the cap.
  const started = Date.now();
  const res = await post(server.app, chain(10, 100_000));
  const error = expectApiError(res, 400, 'validation_failed');
  expect(error.issues?.map((i) => i.path)).toEqual(['samples']);
  expect(error.issues?.[0].message).toMatch(/At most 10,000 samples/);
  // The analysis of a million points takes seconds; the refusal reads three fields.
  expect(Date.now() - started).toBeLessThan(1500);
  // Seats count as rows of output too; exactly at the cap is allowed.
  expect(cycleSizeIssue({ ...chain(4, HTTP_CYCLE_MAX_POINTS / 5), seats: [{}] })).toBeNull();
  expect(cycleSizeIssue({ ...chain(4, HTTP_CYCLE_MAX_POINTS / 5 + 1), seats: [{}] })?.path).toBe('samples');
});

test('the worker answers what the engine gives in-process, and the textbook peak', async () => {
  const body = {
    gravityMS2: g,
    bodies: [rod(100, 2)],
    profiles: [{ kind: 'constant', rpm: 20 }],
    samples: 720,
  };
  const res = await post(server.app, body);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toMatch(/^application\/json/);
  const local = analyseCycleRequest(body);
  if (!local.ok) throw new Error('the reference request must be valid');
  // 720 samples of one body fit the bounded answer whole, so it is every sample.
  expect(res.body).toEqual({ ...JSON.parse(JSON.stringify(local.value)), resolution: 'full' });
  const w = (20 * 2 * Math.PI) / 60;
  const exact = 100 * g + 100 * w * w * 1;
  expect(res.body.joints[0].peakForce.value).toBeGreaterThan(exact * (1 - 1e-5));
  expect(res.body.joints[0].peakForce.value).toBeLessThanOrEqual(exact * (1 + 1e-9));
});

test('validation issues found in the worker are a 400 with their paths', async () => {
  const res = await post(server.app, { bodies: [rod(10, 1)], profiles: [] });
  const error = expectApiError(res, 400, 'validation_failed');
  expect(error.issues?.map((i) => i.path)).toContain('profiles');
});

test('the event loop keeps answering while the largest allowed cycle is analysed', async () => {
  // One listening server and plain fetch for the cheap requests: a round trip of a millisecond or two,
  // so several fit while the cycle is analysed even when it is quick.
  const listener = server.app.listen(0, '127.0.0.1');
  await new Promise((resolve) => listener.once('listening', resolve));
  const { port } = listener.address() as AddressInfo;
  try {
    let done = false;
    const heavy = post(server.app, chain(10, HTTP_CYCLE_MAX_POINTS / 10)).then((res) => {
      done = true;
      return res;
    });
    // Give the request a moment to reach the worker, then keep asking for something cheap until the
    // cycle is answered: one answer in between is the proof (on the main thread there would be none).
    await new Promise((resolve) => setTimeout(resolve, 10));
    let answeredMeanwhile = 0;
    while (!done) {
      const health = await fetch(`http://127.0.0.1:${port}/api/health`);
      expect(health.status).toBe(200);
      await health.arrayBuffer();
      if (!done) answeredMeanwhile += 1;
    }
    const res = await heavy;
    expect(res.status).toBe(200);
    expect(res.body.samples).toBe(HTTP_CYCLE_MAX_POINTS / 10);
    // The answer carries a bounded set of those samples (server/compute/cycle-series.ts).
    expect(res.body.resolution).toBe('bounded');
    expect(res.body.timeS).toHaveLength(res.body.sampleIndex.length);
    expect(answeredMeanwhile).toBeGreaterThan(0);
  } finally {
    await new Promise((resolve) => listener.close(resolve));
  }
});

test('an analysis over the time limit is stopped with a 422, and the next request gets a fresh worker', async () => {
  const strict = await makeTestServer({ env: { COMPUTE_TIME_LIMIT_MS: '1' } });
  try {
    const bearer = await signInAs(strict.app, 'operator@pivotwatch.test');
    const res = await post(strict.app, chain(10, HTTP_CYCLE_MAX_POINTS / 10), bearer);
    const error = expectApiError(res, 422, 'too_much_work');
    expect(error.message).toMatch(/longer than the server allows/);
    // The stopped worker is replaced: a second overrun is refused the same way, not left hanging.
    expectApiError(
      await post(strict.app, chain(10, HTTP_CYCLE_MAX_POINTS / 10), bearer),
      422,
      'too_much_work',
    );
  } finally {
    strict.close();
  }
});
