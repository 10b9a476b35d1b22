/**
 * The ride cycle's answer over HTTP is bounded (server/compute/cycle-series.ts): a bounded set of instants
 * by default, with every series' exact extremes checked against the full-resolution answer of the same
 * request; every sample on request within a cap, refused beyond it with a 400 naming the field.
 */
import request from 'supertest';

import { analyseCycle, valuesPerSample } from '@/features/loads/engine';
import {
  CYCLE_BOUNDED_VALUES,
  CYCLE_FULL_MAX_VALUES,
  cycleAnswer,
  fullResolutionIssue,
} from '@/server/compute/cycle-series';

import { type TestServer, expectApiError, makeTestServer, signInAs } from './helpers';
import { threeBodyCycle } from '@/bench/three-body-chain';

jest.setTimeout(30_000);

let server: TestServer;
let token: string;
beforeAll(async () => {
  server = await makeTestServer();
  token = await signInAs(server.app, 'operator@pivotwatch.test');
});
afterAll(() => server.close());

const post = (body: object, query = '') =>
  request(server.app).post(`/api/loads/cycle${query}`).set('Authorization', `Bearer ${token}`).send(body);

// Invented three-body chain (as bench/loads.ts) with one seat: 3 × 9 + 2 + 1 = 30 numbers per sample.
const threeBody = (samples: number) => ({
  ...threeBodyCycle(samples),
  seats: [{ name: 'row 1', body: 2, positionM: [0, -2], spineAngleRad: 1.2 }],
});

type Json = Record<string, unknown> & { joints: Record<string, unknown>[]; seats: Record<string, unknown>[] };
const seriesOf = (body: Json): number[][] => [
  ...body.joints.flatMap((j) =>
    [
      'angleRad',
      'rateRadS',
      'accelRadS2',
      'forceXN',
      'forceYN',
      'forceAlongN',
      'forceAcrossN',
      'forceMagnitudeN',
      'torqueNm',
    ].map((k) => j[k] as number[]),
  ),
  ...body.seats.flatMap((s) => [s.gx as number[], s.gz as number[]]),
];

test('a 10,000-sample cycle answers bounded, with the exact extremes of the full answer', async () => {
  const bounded = await post(threeBody(10_000));
  const full = await post(threeBody(10_000), '?resolution=full');
  expect(bounded.status).toBe(200);
  expect(full.status).toBe(200);
  expect(full.body.resolution).toBe('full');
  expect(full.body.timeS).toHaveLength(10_000);
  expect(full.body.sampleIndex).toBeUndefined();

  expect(bounded.body.resolution).toBe('bounded');
  expect(bounded.body.samples).toBe(10_000);
  const kept: number[] = bounded.body.sampleIndex;
  expect(bounded.body.timeS).toHaveLength(kept.length);
  // Bounded: the numbers in its series, and its bytes, whatever the samples (the full one is ~5 MB of JSON
  // here: 30 numbers × 10,000 samples; the bounded one stays within CYCLE_BOUNDED_VALUES numbers).
  expect(kept.length * valuesPerSample(3, 1)).toBeLessThanOrEqual(CYCLE_BOUNDED_VALUES);
  expect(bounded.text.length).toBeLessThan(400_000);
  expect(full.text.length).toBeGreaterThan(10 * bounded.text.length);

  const fullSeries = seriesOf(full.body);
  const cutSeries = seriesOf(bounded.body);
  fullSeries.forEach((series, s) => {
    expect(Math.max(...cutSeries[s])).toBe(Math.max(...series));
    expect(Math.min(...cutSeries[s])).toBe(Math.min(...series));
    // Each kept value is the full answer's value at its instant.
    kept.forEach((k, p) => expect(cutSeries[s][p]).toBe(series[k]));
  });
  // Everything but the series is the full analysis's: peaks, extremes, envelope, warnings.
  const { timeS: _t, joints: _j, seats: _s, sampleIndex: _i, resolution: _r, ...restBounded } = bounded.body;
  const { timeS: _t2, joints: _j2, seats: _s2, resolution: _r2, ...restFull } = full.body;
  expect(restBounded).toEqual(restFull);
  bounded.body.joints.forEach((j: Json, i: number) => {
    expect(j.peakForce).toEqual(full.body.joints[i].peakForce);
    expect(j.extremes).toEqual(full.body.joints[i].extremes);
  });
});

test('full resolution beyond the cap is a 400 naming query.resolution, before any analysis', async () => {
  // 10 bodies × 10,000 samples is within the analysis cap (HTTP_CYCLE_MAX_POINTS) but 910,000 numbers.
  const ten = {
    bodies: Array.from({ length: 10 }, (_, i) => ({
      name: `arm ${i + 1}`,
      massKg: 100,
      cgM: [1, 0],
      inertiaCgKgM2: 100 / 3,
      tipM: [2, 0],
    })),
    profiles: Array.from({ length: 10 }, (_, i) => ({ kind: 'constant', rpm: 5 + i })),
    durationS: 12,
    samples: 10_000,
  };
  const started = Date.now();
  const error = expectApiError(await post(ten, '?resolution=full'), 400, 'validation_failed');
  expect(error.issues?.map((i) => i.path)).toEqual(['query.resolution']);
  expect(error.issues?.[0].message).toMatch(/limited to 500,000 numbers; this cycle has 910,000/);
  expect(Date.now() - started).toBeLessThan(1500);
  // The same request bounded is fine, and small.
  const bounded = await post(ten);
  expect(bounded.status).toBe(200);
  expect(bounded.body.resolution).toBe('bounded');
  expect(bounded.text.length).toBeLessThan(600_000);
});

test('the cap is also checked after the analysis, when the request left the samples to the engine', () => {
  const result = analyseCycle({
    bodies: [{ name: 'rod', massKg: 100, cgM: [1, 0], inertiaCgKgM2: 100 / 3 }],
    profiles: [{ kind: 'constant', rpm: 20 }],
    samples: Math.floor(CYCLE_FULL_MAX_VALUES / valuesPerSample(1, 0)) + 1,
  });
  const answer = cycleAnswer(result, 'full');
  expect(answer.ok).toBe(false);
  if (!answer.ok) expect(answer.issues[0].path).toBe('query.resolution');
  expect(fullResolutionIssue(CYCLE_FULL_MAX_VALUES / 10, 1, 0)).toBeNull();
});

test('an unknown resolution is a 400 naming it', async () => {
  const error = expectApiError(await post(threeBody(360), '?resolution=most'), 400, 'validation_failed');
  expect(error.issues?.map((i) => i.path)).toEqual(['query.resolution']);
});
