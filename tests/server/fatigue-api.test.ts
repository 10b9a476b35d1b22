/**
 * The fatigue routes through HTTP: the issue's exact contract, checked against ASTM E1049-85 (2017)
 * §5.4.4's worked example and EN 1993-1-9 §7 curves with Miner sums worked by hand (the engine's own
 * tests, tests/engine/rainflow.test.ts and sn-curve.test.ts, go further). Staff only; every bad body is
 * a 400 naming its field and changes nothing.
 */
import { sql } from 'drizzle-orm';
import request from 'supertest';

import { damageResponseSchema, rainflowResponseSchema } from '@/features/fatigue/schema';

import { type TestServer, expectApiError, makeTestServer, signInAs } from './helpers';

let server: TestServer;
const tokens: Record<string, string> = {};

beforeAll(async () => {
  server = await makeTestServer();
  for (const role of ['admin', 'supervisor', 'inspector', 'operator']) {
    tokens[role] = await signInAs(server.app, `${role}@pivotwatch.test`);
  }
});
afterAll(() => server.close());

const post = (path: string, body: unknown, role = 'inspector') =>
  request(server.app)
    .post(`/api/fatigue/${path}`)
    .set('Authorization', `Bearer ${tokens[role]}`)
    .send(body as object);

/** Row counts of every table: what "changes nothing" means for a route that stores nothing. */
function tableCounts(): Record<string, number> {
  const tables = server.db.all<{ name: string }>(
    sql`SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'`,
  );
  return Object.fromEntries(
    tables.map(({ name }) => [
      name,
      server.db.get<{ n: number }>(sql`SELECT count(*) AS n FROM ${sql.identifier(name)}`).n,
    ]),
  );
}

const astmExample = [-2, 1, -3, 5, -1, 3, -4, 4, -2];

describe('POST /api/fatigue/rainflow', () => {
  test('ASTM E1049 §5.4.4 worked example: 3 ×0.5, 4 ×1.5, 6 ×0.5, 8 ×1, 9 ×0.5, one entry per cycle', async () => {
    const res = await post('rainflow', { series: astmExample });
    expect(res.status).toBe(200);
    expect(rainflowResponseSchema.strict().safeParse(res.body).success).toBe(true);
    // Extraction order then the residue; means worked by hand in tests/engine/rainflow.test.ts.
    expect(res.body).toEqual({
      cycles: [
        { range: 3, mean: -0.5, count: 0.5 },
        { range: 4, mean: -1, count: 0.5 },
        { range: 4, mean: 1, count: 1 },
        { range: 8, mean: 1, count: 0.5 },
        { range: 9, mean: 0.5, count: 0.5 },
        { range: 8, mean: 0, count: 0.5 },
        { range: 6, mean: 1, count: 0.5 },
      ],
    });
  });

  test('two points are half a cycle; a constant series has none (any unit)', async () => {
    expect((await post('rainflow', { series: [10, 4] })).body).toEqual({
      cycles: [{ range: 6, mean: 7, count: 0.5 }],
    });
    expect((await post('rainflow', { series: [3, 3, 3] })).body).toEqual({ cycles: [] });
  });

  test('every staff role may count; an operator may not; no token is a 401', async () => {
    for (const role of ['admin', 'supervisor', 'inspector']) {
      expect((await post('rainflow', { series: astmExample }, role)).status).toBe(200);
    }
    expectApiError(await post('rainflow', { series: astmExample }, 'operator'), 403, 'forbidden');
    const anonymous = await request(server.app).post('/api/fatigue/rainflow').send({ series: astmExample });
    expectApiError(anonymous, 401, 'unauthorized');
  });

  test('a 1,000,000-point series of full-precision values (about 19 MB of JSON) is accepted', async () => {
    const n = 1_000_000;
    // A deterministic, irregular history: values with 15–17 significant digits, as a logger would write.
    const series = Array.from(
      { length: n },
      (_, i) => Math.sin(i * 0.731) * 180.123 + Math.cos(i * 0.017) * 60,
    );
    const body = JSON.stringify({ series });
    expect(body.length).toBeGreaterThan(17_000_000);
    const res = await request(server.app)
      .post('/api/fatigue/rainflow')
      .set('Authorization', `Bearer ${tokens.supervisor}`)
      .set('Content-Type', 'application/json')
      .send(body);
    expect(res.status).toBe(200);
    const cycles: { count: number }[] = res.body.cycles;
    expect(cycles.length).toBeGreaterThan(100_000);
    // Every reversal accounted for: Σ 2·count = peaks and valleys − 1 (ASTM E1049 §5.4.4).
    let reversals = 1;
    for (let i = 1; i + 1 < n; i++)
      if ((series[i] - series[i - 1]) * (series[i + 1] - series[i]) < 0) reversals++;
    expect(cycles.reduce((s, c) => s + 2 * c.count, 0)).toBe(reversals);
  }, 120_000);

  test('1,000,001 values are refused, naming the series', async () => {
    const body = JSON.stringify({ series: new Array(1_000_001).fill(0) });
    const res = await request(server.app)
      .post('/api/fatigue/rainflow')
      .set('Authorization', `Bearer ${tokens.inspector}`)
      .set('Content-Type', 'application/json')
      .send(body);
    const error = expectApiError(res, 400, 'validation_failed');
    expect(error.issues).toEqual([{ path: 'series', message: expect.stringMatching(/1,000,001/) }]);
  }, 60_000);

  test.each([
    ['no series', 'series', {}],
    ['series null', 'series', { series: null }],
    ['series a string', 'series', { series: '1,2,3' }],
    ['series an object', 'series', { series: { 0: 1, 1: 2 } }],
    ['an empty series', 'series', { series: [] }],
    ['one value', 'series', { series: [5] }],
    ['a null value', 'series.1', { series: [1, null, 2] }],
    ['a string value', 'series.2', { series: [1, 2, '3'] }],
    ['a nested array', 'series.0', { series: [[1], 2, 3] }],
    ['a boolean value', 'series.1', { series: [1, true] }],
  ])('%s → 400 naming %s, nothing changes', async (_what, path, body) => {
    const before = tableCounts();
    expect(before.rides).toBeGreaterThan(0); // the seeded demo is there to be left alone
    const error = expectApiError(await post('rainflow', body), 400, 'validation_failed');
    expect(error.issues?.map((i) => i.path)).toContain(path);
    expect(error.issues?.every((i) => i.message.length > 0)).toBe(true);
    expect(tableCounts()).toEqual(before);
  });

  test('NaN or Infinity cannot travel in JSON: such a body is refused as bad JSON', async () => {
    const res = await request(server.app)
      .post('/api/fatigue/rainflow')
      .set('Authorization', `Bearer ${tokens.inspector}`)
      .set('Content-Type', 'application/json')
      .send('{"series":[1,NaN,2]}');
    expectApiError(res, 400, 'bad_json');
  });

  test('a series of many bad values gets a short list of issues', async () => {
    const error = expectApiError(
      await post('rainflow', { series: new Array(10_000).fill(null) }),
      400,
      'validation_failed',
    );
    expect(error.issues!.length).toBeLessThanOrEqual(6);
    expect(error.issues!.every((i) => i.path.startsWith('series'))).toBe(true);
  });
});

describe('POST /api/fatigue/damage', () => {
  test('cycles on category 71 (EN 1993-1-9): 10⁶ × 60 MPa + 5×10⁶ × 40 MPa + 20 MPa below the cut-off', async () => {
    /* Hand-worked in tests/engine/sn-curve.test.ts: 0.30175 + 0.26136 + 0 = 0.56311. */
    const res = await post('damage', {
      cycles: [
        { rangeMPa: 60, count: 1e6 },
        { rangeMPa: 40, count: 5e6 },
        { rangeMPa: 20, count: 1e9 },
      ],
      detailCategoryMPa: 71,
    });
    expect(res.status).toBe(200);
    expect(damageResponseSchema.strict().safeParse(res.body).success).toBe(true);
    expect(Object.keys(res.body.curve).sort()).toEqual([
      'deltaSigmaCMPa',
      'deltaSigmaDMPa',
      'deltaSigmaLMPa',
    ]);
    expect(res.body.damage).toBeCloseTo(0.56311, 4);
    expect(res.body.curve.deltaSigmaCMPa).toBe(71);
    expect(res.body.curve.deltaSigmaDMPa).toBeCloseTo(52.3, 1); // EN 1993-1-9: 0.737 × 71
    expect(res.body.curve.deltaSigmaLMPa).toBeCloseTo(28.7, 1); // 0.549 × 52.3
    expect(res.body.cycles[0].cyclesToFailure / 3.31e6).toBeCloseTo(1, 2); // domain notes: 3.31×10⁶
    expect(res.body.cycles[1].cyclesToFailure / 1.91e7).toBeCloseTo(1, 2); // domain notes: 1.91×10⁷
    expect(res.body.cycles[2]).toEqual({ rangeMPa: 20, count: 1e9, cyclesToFailure: null, damage: 0 });
  });

  test('γ_Ff = 1.2, γ_Mf = 1.35 on category 90, 10⁶ × 50 MPa → D = ½·0.9³ = 0.3645; curve is Δσ_C/γ_Mf', async () => {
    const res = await post('damage', {
      cycles: [{ rangeMPa: 50, count: 1e6 }],
      detailCategoryMPa: 90,
      gammaFf: 1.2,
      gammaMf: 1.35,
    });
    expect(res.status).toBe(200);
    expect(res.body.damage).toBeCloseTo(0.3645, 10);
    expect(res.body.curve.deltaSigmaCMPa).toBeCloseTo(90 / 1.35, 10);
    expect(res.body.cycles[0].rangeMPa).toBe(50);
  });

  test('shear, Δτ_C = 100: 2×10⁶ × 80 MPa → 0.8⁵ = 0.32768; Δτ_L = 0.457 × 100; no Δσ_D', async () => {
    const res = await post('damage', {
      cycles: [
        { rangeMPa: 80, count: 2e6 },
        { rangeMPa: 40, count: 1e9 },
      ],
      detailCategoryMPa: 100,
      shear: true,
    });
    expect(res.status).toBe(200);
    expect(res.body.damage).toBeCloseTo(0.32768, 10);
    expect(res.body.curve.deltaSigmaDMPa).toBeNull();
    expect(res.body.curve.deltaSigmaLMPa).toBeCloseTo(45.73, 2);
    expect(res.body.cycles[1].cyclesToFailure).toBeNull();
  });

  test('a stress history is rainflow-counted first: 0, 60, 0, 60, 0 MPa is four half cycles of 60 MPa', async () => {
    /*
     * ASTM E1049 §5.4.4: 0, 60, 0 → X = Y holding S → ½ (60); 60, 0, 60 → ½; residue 0–60, 60–0 → ½ + ½.
     * Two cycles of 60 MPa on category 71: D = 2 / (2e6·(71/60)³) = 6.0351e-7.
     */
    const res = await post('damage', { series: [0, 60, 0, 60, 0], detailCategoryMPa: 71 });
    expect(res.status).toBe(200);
    expect(res.body.cycles).toHaveLength(4);
    expect(res.body.cycles.map((c: { rangeMPa: number; count: number }) => [c.rangeMPa, c.count])).toEqual([
      [60, 0.5],
      [60, 0.5],
      [60, 0.5],
      [60, 0.5],
    ]);
    expect(res.body.damage).toBeCloseTo(6.0351e-7, 10);
  });

  test('the ASTM example as MPa on category 36 sums its ranges’ counts', async () => {
    // Every range of the example (3 … 9 MPa) is below Δσ_L = 0.549 × 0.737 × 36 = 14.6 MPa: no damage.
    const res = await post('damage', { series: astmExample, detailCategoryMPa: 36 });
    expect(res.status).toBe(200);
    expect(res.body.damage).toBe(0);
    expect(res.body.cycles.reduce((s: number, c: { count: number }) => s + c.count, 0)).toBe(4);
  });

  test('every staff role; operator 403; no token 401', async () => {
    const body = { cycles: [{ rangeMPa: 60, count: 1 }], detailCategoryMPa: 71 };
    for (const role of ['admin', 'supervisor', 'inspector'])
      expect((await post('damage', body, role)).status).toBe(200);
    expectApiError(await post('damage', body, 'operator'), 403, 'forbidden');
    expectApiError(await request(server.app).post('/api/fatigue/damage').send(body), 401, 'unauthorized');
  });

  const ok = { detailCategoryMPa: 71 };
  test.each([
    ['neither series nor cycles', { ...ok }, ['series', 'cycles']],
    [
      'both series and cycles',
      { ...ok, series: [0, 60], cycles: [{ rangeMPa: 60, count: 1 }] },
      ['series', 'cycles'],
    ],
    ['a one-point series', { ...ok, series: [60] }, ['series']],
    ['a null in the series', { ...ok, series: [0, null, 60] }, ['series.1']],
    ['a string in the series', { ...ok, series: [0, '60'] }, ['series.1']],
    ['cycles not an array', { ...ok, cycles: { rangeMPa: 60, count: 1 } }, ['cycles']],
    ['a negative range', { ...ok, cycles: [{ rangeMPa: -60, count: 1 }] }, ['cycles.0.rangeMPa']],
    [
      'a negative count',
      {
        ...ok,
        cycles: [
          { rangeMPa: 60, count: 2 },
          { rangeMPa: 60, count: -1 },
        ],
      },
      ['cycles.1.count'],
    ],
    ['a missing count', { ...ok, cycles: [{ rangeMPa: 60 }] }, ['cycles.0.count']],
    ['a null range', { ...ok, cycles: [{ rangeMPa: null, count: 1 }] }, ['cycles.0.rangeMPa']],
    ['no category', { cycles: [{ rangeMPa: 60, count: 1 }] }, ['detailCategoryMPa']],
    ['category 0', { cycles: [{ rangeMPa: 60, count: 1 }], detailCategoryMPa: 0 }, ['detailCategoryMPa']],
    [
      'a negative category',
      { cycles: [{ rangeMPa: 60, count: 1 }], detailCategoryMPa: -71 },
      ['detailCategoryMPa'],
    ],
    [
      'category as a string',
      { cycles: [{ rangeMPa: 60, count: 1 }], detailCategoryMPa: '71' },
      ['detailCategoryMPa'],
    ],
    ['γ_Ff below 1', { ...ok, cycles: [{ rangeMPa: 60, count: 1 }], gammaFf: 0.9 }, ['gammaFf']],
    ['γ_Mf below 1', { ...ok, cycles: [{ rangeMPa: 60, count: 1 }], gammaMf: 0 }, ['gammaMf']],
    ['γ_Mf null', { ...ok, cycles: [{ rangeMPa: 60, count: 1 }], gammaMf: null }, ['gammaMf']],
    ['a range too large to sum', { ...ok, cycles: [{ rangeMPa: 1e200, count: 1 }] }, ['cycles']],
    ['a value too large for a finite range', { ...ok, series: [0, 1e308, -1e308] }, ['series.1', 'series.2']],
    ['shear not a boolean', { ...ok, cycles: [{ rangeMPa: 60, count: 1 }], shear: 'yes' }, ['shear']],
  ])('%s → 400 naming the field, nothing changes', async (_what, body, paths) => {
    const before = tableCounts();
    const error = expectApiError(await post('damage', body), 400, 'validation_failed');
    const named = error.issues?.map((i) => i.path) ?? [];
    for (const path of paths) expect(named).toContain(path);
    expect(tableCounts()).toEqual(before);
  });
});
