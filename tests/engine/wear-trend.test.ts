/**
 * Wear trends against a hand computation of ordinary least squares and the prediction interval of a new
 * observation (any regression text, e.g. Montgomery & Runger, Applied Statistics and Probability for
 * Engineers, §11.7; formulas from memory), and Student's t against tabulated quantiles (the t table of the
 * NIST/SEMATECH e-Handbook of Statistical Methods §1.3.6.7.2, the values every statistics text prints).
 */
import {
  boundReaches,
  fitLine,
  incompleteBeta,
  lineReaches,
  lnGamma,
  predictionHalfWidth,
  projectWear,
  studentTQuantile,
} from '@/features/fatigue/wear-trend';

describe('Student’s t quantiles (tabulated, three decimals)', () => {
  it.each([
    [0.975, 1, 12.706],
    [0.975, 2, 4.303],
    [0.975, 3, 3.182],
    [0.975, 4, 2.776],
    [0.975, 5, 2.571],
    [0.975, 10, 2.228],
    [0.975, 20, 2.086],
    [0.975, 30, 2.042],
    [0.975, 120, 1.98],
    [0.95, 10, 1.812],
    [0.995, 5, 4.032],
  ])('t(%f, %i) = %f', (p, dof, table) => {
    expect(studentTQuantile(p, dof)).toBeCloseTo(table, 3);
  });

  it('closed forms: t(0.975, 1) = tan(0.475π) (the Cauchy quantile), t(0.975, 2) = 0.95·√(2/(1 − 0.95²))', () => {
    expect(studentTQuantile(0.975, 1)).toBeCloseTo(Math.tan(0.475 * Math.PI), 9);
    // ν = 2: t = (2p − 1)·√(2 / (1 − (2p − 1)²)) (the two-degree quantile in closed form).
    const q = 0.95;
    expect(studentTQuantile(0.975, 2)).toBeCloseTo(q * Math.sqrt(2 / (1 - q * q)), 9);
  });

  it('ln Γ and I_x(a, b) at known points', () => {
    expect(lnGamma(5)).toBeCloseTo(Math.log(24), 12);
    expect(lnGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 12);
    // I_x(1, b) = 1 − (1 − x)^b, I_x(a, 1) = x^a.
    expect(incompleteBeta(0.3, 1, 4)).toBeCloseTo(1 - 0.7 ** 4, 12);
    expect(incompleteBeta(0.3, 2.5, 1)).toBeCloseTo(0.3 ** 2.5, 12);
  });
});

/*
 * Hand computation. Days x = 0, 30, 60, 90, 120; diameter = 60 mm − w with w (µm) = 0, 10, 25, 32, 50.
 *   x̄ = 60, w̄ = 117/5 = 23.4, Sxx = 3600 + 900 + 0 + 900 + 3600 = 9000,
 *   Sxw = (−60)(−23.4) + (−30)(−13.4) + 0 + 30·8.6 + 60·26.6 = 1404 + 402 + 258 + 1596 = 3660,
 *   slope (w) = 3660/9000 = 0.406667 µm/day → diameter −0.406667 µm/day; intercept w = 23.4 − 0.406667·60 = −1.
 *   Fitted w: −1, 11.2, 23.4, 35.6, 47.8; residuals 1, −1.2, 1.6, −3.6, 2.2; SSE = 1 + 1.44 + 2.56 + 12.96 + 4.84
 *   = 22.8; s² = 22.8/3 = 7.6; s = 2.756810 µm. t(0.975, 3) = 3.182446.
 *   At x = 180: ŵ = −1 + 0.406667·180 = 72.2 µm; half-width = 3.182446·2.756810·√(1 + 1/5 + 120²/9000)
 *   = 3.182446·2.756810·√2.8 = 14.680704 µm.
 *   Limit: minimum diameter 59.900 mm (w = 100 µm). The line: x = (100 + 1)/0.406667 = 248.36 days.
 *   The bound: −1 + 0.406667·x + k·√(1.2 + (x − 60)²/9000) = 100 with k = t·s, squared into a quadratic in
 *   u = x − 60 (solved below by the quadratic formula): x = 207.355 days.
 */
const um = 1e-6;
const w = [0, 10, 25, 32, 50];
const days = [0, 30, 60, 90, 120];
const dates = ['2026-01-05', '2026-02-04', '2026-03-06', '2026-04-05', '2026-05-05'];
const diameter = (wi: number) => 0.06 - wi * um;

describe('least squares and the 95 % prediction interval (hand computation above)', () => {
  const f = fitLine(days.map((x, i) => ({ x, y: w[i] })))!;

  it('slope, intercept, residual standard error', () => {
    expect(f.slope).toBeCloseTo(0.406667, 6);
    expect(f.intercept).toBeCloseTo(-1, 10);
    expect(f.residualSE).toBeCloseTo(Math.sqrt(7.6), 10);
    expect(f.residualSE).toBeCloseTo(2.75681, 5);
    expect(f.t975).toBeCloseTo(3.182446, 6);
  });

  it('the prediction interval at x = 180', () => {
    expect(predictionHalfWidth(f, 180)).toBeCloseTo(14.680704, 5);
  });

  it('where the line and the bound reach the limit', () => {
    expect(lineReaches(f, 100, 'above')).toBeCloseTo(101 / (3660 / 9000), 9);
    // (76.6 − b·u)² = k²·(1.2 + u²/9000): A u² + B u + C = 0.
    const b = 3660 / 9000;
    const k = f.t975! * Math.sqrt(7.6);
    const A = b * b - (k * k) / 9000;
    const B = -2 * 76.6 * b;
    const C = 76.6 * 76.6 - 1.2 * k * k;
    const u = (-B - Math.sqrt(B * B - 4 * A * C)) / (2 * A);
    expect(60 + u).toBeCloseTo(207.3553, 3);
    expect(boundReaches(f, 100, 'above', 120)).toBeCloseTo(60 + u, 6);
  });
});

describe('a wear projection', () => {
  const readings = dates.map((on, i) => ({ on, valueM: diameter(w[i]), cycles: null }));
  const base = {
    quantity: 'pin_diameter' as const,
    readings,
    limitM: 0.0599,
    today: '2026-05-10',
    nextInspectionOn: '2026-09-01',
  };

  it('dates: the line on day 248 (2026-09-10), the bound on day 207 (2026-07-31); flagged before 1 Sep', () => {
    const p = projectWear(base);
    expect(p.slopePerDay).toBeCloseTo((-3660 / 9000) * um, 15);
    expect(p.projectedOn).toBe('2026-09-10');
    expect(p.earliestOn).toBe('2026-07-31');
    expect(p.flagged).toBe(true);
    // 14 days before the cautious date.
    expect(p.suggestedOn).toBe('2026-07-17');
  });

  it('not flagged when the next inspection comes before the cautious date', () => {
    const p = projectWear({ ...base, nextInspectionOn: '2026-07-15' });
    expect(p.flagged).toBe(false);
    expect(p.suggestedOn).toBeNull();
  });

  it('the suggestion is never before today', () => {
    const p = projectWear({ ...base, today: '2026-07-25' });
    expect(p.suggestedOn).toBe('2026-07-25');
  });

  it('against logged cycles: slope per 1000 cycles and the date the log’s rate reaches it', () => {
    // 100 cycles a day from day 0: cycles = 100·x, so the slope per 1000 cycles is 10× the daily one.
    const withCycles = readings.map((r, i) => ({ ...r, cycles: 100 * days[i] }));
    const p = projectWear({
      ...base,
      readings: withCycles,
      dayAtCycles: (c) => `cycles:${Math.round(c)}`,
    });
    expect(p.slopePer1000Cycles).toBeCloseTo((-3660 / 9000) * 10 * um, 15);
    // The line reaches the limit at 248.36 days = 24 836 cycles.
    expect(p.projectedByCyclesOn).toBe('cycles:24836');
  });

  it('clearance rising to its maximum is projected the same way', () => {
    const p = projectWear({
      ...base,
      quantity: 'clearance',
      readings: dates.map((on, i) => ({ on, valueM: 0.0001 + w[i] * um, cycles: null })),
      limitM: 0.0002,
    });
    expect(p.projectedOn).toBe('2026-09-10');
    expect(p.earliestOn).toBe('2026-07-31');
  });

  it('edge cases: one reading, all on one day, slope away from the limit → no dates', () => {
    expect(projectWear({ ...base, readings: readings.slice(0, 1) })).toMatchObject({
      slopePerDay: null,
      projectedOn: null,
      earliestOn: null,
      flagged: false,
    });
    const oneDay = readings.map((r) => ({ ...r, on: '2026-03-01' }));
    expect(projectWear({ ...base, readings: oneDay }).projectedOn).toBeNull();
    const growing = readings.map((r, i) => ({ ...r, valueM: diameter(-w[i]) }));
    expect(projectWear({ ...base, readings: growing })).toMatchObject({
      projectedOn: null,
      earliestOn: null,
    });
  });

  it('a renewed part starts the trend again (our rule: a step back from the limit of over 20 % of the first gap)', () => {
    // A new pin (w = 0 again) on 2026-06-04, worn 10 µm by 2026-07-04: 1/3 µm a day from the renewal, so the
    // 100 µm allowance is used on day 300 = 2027-03-31. The 50 µm step back is far over 20 % of 100 µm.
    const renewed = [
      ...readings,
      { on: '2026-06-04', valueM: diameter(0), cycles: null },
      { on: '2026-07-04', valueM: diameter(10), cycles: null },
    ];
    const p = projectWear({ ...base, readings: renewed, today: '2026-07-10' });
    expect(p.points.map((x) => x.on)).toEqual(['2026-06-04', '2026-07-04']);
    expect(p.slopePerDay).toBeCloseTo((-10 / 30) * um, 15);
    expect(p.projectedOn).toBe('2027-03-31');
    // Scatter of a few µm is no renewal: the hand series (steps of 7–18 µm toward the limit) keeps all five.
    expect(projectWear(base).points).toHaveLength(5);
  });

  it('two readings: the line through both, no interval, the line’s date decides the flag', () => {
    // Through (0, 0) and (120, 50 µm): 5/12 µm/day; reaches 100 µm at day 240 = 2026-09-02.
    const p = projectWear({ ...base, readings: [readings[0], readings[4]], nextInspectionOn: '2026-09-05' });
    expect(p.projectedOn).toBe('2026-09-02');
    expect(p.earliestOn).toBeNull();
    expect(p.flagged).toBe(true);
    expect(p.suggestedOn).toBe('2026-08-19');
  });
});
