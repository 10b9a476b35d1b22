import * as fc from 'fast-check';

import {
  type RainflowCycle,
  closedLoop,
  peaksAndValleys,
  rainflow,
  rainflowRepeating,
} from '@/features/fatigue';

/**
 * Rainflow counting against ASTM E1049-85 (reapproved 2017) §5.4.4: its worked example, an independent
 * reference written straight from the standard's numbered steps (step numbering [mem]; lists and splices, nothing shared with
 * the typed-array engine), and properties any rainflow count has.
 */

/** ASTM E1049 §5.4.4 step by step, on plain arrays: the cross-check for the engine. */
function referenceRainflow(series: number[]): RainflowCycle[] {
  // Peaks and valleys: drop repeats, then every interior point that is not a reversal.
  const dedup = series.filter((v, i) => i === 0 || v !== series[i - 1]);
  const pv = dedup.filter(
    (v, i) => i === 0 || i === dedup.length - 1 || (v - dedup[i - 1]) * (dedup[i + 1] - v) < 0,
  );
  const out: RainflowCycle[] = [];
  const points: number[] = []; // not yet discarded; points[0] is the starting point S
  const cycle = (a: number, b: number, count: number) =>
    out.push({ range: Math.abs(a - b), mean: (a + b) / 2, count });
  for (const p of pv) {
    points.push(p); // step 1: read the next peak or valley
    for (;;) {
      if (points.length < 3) break; // step 2
      const n = points.length;
      const x = Math.abs(points[n - 1] - points[n - 2]);
      const y = Math.abs(points[n - 2] - points[n - 3]);
      if (x < y) break; // step 3
      if (n - 3 === 0) {
        cycle(points[0], points[1], 0.5); // step 5: Y contains S
        points.splice(0, 1);
      } else {
        cycle(points[n - 3], points[n - 2], 1); // step 4
        points.splice(n - 3, 2);
      }
    }
  }
  for (let i = 0; i + 1 < points.length; i++) cycle(points[i], points[i + 1], 0.5); // step 6
  return out;
}

/** Counts summed per range (and mean), as the standard's tables report them. */
function histogram(cycles: RainflowCycle[], byMean = false): Map<string, number> {
  const h = new Map<string, number>();
  for (const c of cycles) {
    const key = byMean ? `${c.range}@${c.mean}` : `${c.range}`;
    h.set(key, (h.get(key) ?? 0) + c.count);
  }
  return h;
}

const totalCount = (cycles: RainflowCycle[]) => cycles.reduce((s, c) => s + c.count, 0);

describe('ASTM E1049-85 (2017) §5.4.4 worked example: −2, 1, −3, 5, −1, 3, −4, 4, −2', () => {
  const example = [-2, 1, -3, 5, -1, 3, -4, 4, -2];

  test('ranges 3 ×0.5, 4 ×1.5, 6 ×0.5, 8 ×1.0, 9 ×0.5, total 4.0 (the standard’s table)', () => {
    const h = histogram(rainflow(example));
    expect(Object.fromEntries(h)).toEqual({ '3': 0.5, '4': 1.5, '6': 0.5, '8': 1, '9': 0.5 });
    expect(totalCount(rainflow(example))).toBe(4);
  });

  /*
   * Means and order by hand, following the standard's steps (S = starting point, X = latest range,
   * Y = the range before it):
   *   −2, 1, −3      X = 4 ≥ Y = 3, Y holds S → ½ cycle  −2…1  (range 3, mean −0.5); S := 1
   *   1, −3, 5       X = 8 ≥ Y = 4, Y holds S → ½ cycle  1…−3  (range 4, mean −1);   S := −3
   *   −3, 5, −1      X = 6 < Y = 8;  then −3, 5, −1, 3: X = 4 < Y = 6
   *   …, −1, 3, −4   X = 7 ≥ Y = 4, Y without S → 1 cycle −1…3 (range 4, mean 1); left −3, 5, −4
   *   −3, 5, −4      X = 9 ≥ Y = 8, Y holds S → ½ cycle  −3…5  (range 8, mean 1);    S := 5
   *   5, −4, 4, −2   X = 8 < Y = 9, then X = 6 < Y = 8; end of data
   *   residue        ½ 5…−4 (9, 0.5), ½ −4…4 (8, 0), ½ 4…−2 (6, 1)
   */
  test('per-cycle ranges, means and counts in extraction order, then the residue (hand-worked above)', () => {
    expect(rainflow(example)).toEqual([
      { range: 3, mean: -0.5, count: 0.5 },
      { range: 4, mean: -1, count: 0.5 },
      { range: 4, mean: 1, count: 1 },
      { range: 8, mean: 1, count: 0.5 },
      { range: 9, mean: 0.5, count: 0.5 },
      { range: 8, mean: 0, count: 0.5 },
      { range: 6, mean: 1, count: 0.5 },
    ]);
  });

  /*
   * Repeating the example block: its loop from the largest absolute extreme (5) is
   * 5, −1, 3, −4, 4, −2, 1, −3, 5 (the −2 ending one block and the −2 … starting the next is a run:
   * −2 then −2 merge). Three-point rule, every Y a full cycle:
   *   5, −1, 3, −4       X = 7 ≥ Y = 4 → −1…3  (4, mean 1);     left 5, −4
   *   5, −4, 4, −2, 1, −3 X = 4 ≥ Y = 3 → −2…1 (3, mean −0.5);  left 5, −4, 4, −3
   *   5, −4, 4, −3, 5    X = 8 ≥ Y = 7 → 4…−3  (7, mean 0.5);   then X = 9 ≥ Y = 9 → 5…−4 (9, mean 0.5)
   */
  test('rainflowRepeating: closed cycles per block, hand-worked above', () => {
    expect(rainflowRepeating(example)).toEqual([
      { range: 4, mean: 1, count: 1 },
      { range: 3, mean: -0.5, count: 1 },
      { range: 7, mean: 0.5, count: 1 },
      { range: 9, mean: 0.5, count: 1 },
    ]);
    expect(Array.from(closedLoop(example))).toEqual([5, -1, 3, -4, 4, -2, 1, -3, 5]);
  });

  test('the reference implementation agrees with the standard’s example too', () => {
    expect(referenceRainflow(example)).toEqual(rainflow(example));
  });
});

describe('series without reversals and other edges', () => {
  test('a constant series has no cycles; two distinct points are half a cycle', () => {
    expect(rainflow([3, 3, 3, 3])).toEqual([]);
    expect(rainflow([3, 3])).toEqual([]);
    expect(rainflow([0, 5])).toEqual([{ range: 5, mean: 2.5, count: 0.5 }]);
    expect(rainflowRepeating([7, 7, 7])).toEqual([]);
    // A block of two values repeated is one closed cycle per block.
    expect(rainflowRepeating([0, 5])).toEqual([{ range: 5, mean: 2.5, count: 1 }]);
  });

  test('monotonic runs and equal neighbours reduce to their turning points (ASTM E1049 §5.4.4, peak-valley reduction)', () => {
    expect(Array.from(peaksAndValleys([0, 1, 2, 2, 3, 1, 1, -1, 4]))).toEqual([0, 3, -1, 4]);
    expect(rainflow([0, 1, 2, 3])).toEqual([{ range: 3, mean: 1.5, count: 0.5 }]);
  });

  test('typed arrays are accepted; a non-finite value is refused', () => {
    expect(rainflow(Float64Array.from([-2, 1, -3, 5, -1, 3, -4, 4, -2]))).toHaveLength(7);
    expect(() => rainflow([1, Number.NaN, 2])).toThrow(RangeError);
    expect(() => rainflow([1, Infinity])).toThrow(RangeError);
  });

  test('a long history comes back in one piece (1,000,000 points, as the API allows)', () => {
    const n = 1_000_000;
    const series = new Float64Array(n);
    for (let i = 0; i < n; i++) series[i] = Math.sin(i * 0.37) * 100 + Math.sin(i * 0.011) * 40;
    const cycles = rainflow(series);
    expect(cycles.reduce((s, c) => s + 2 * c.count, 0)).toBe(peaksAndValleys(series).length - 1);
  });
});

describe('properties (fast-check)', () => {
  // Integers keep every comparison and sum exact, so equalities need no tolerance.
  const seriesArb = fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 0, maxLength: 60 });

  test('the engine equals the step-by-step reference (ASTM E1049 §5.4.4) on any series', () => {
    fc.assert(fc.property(seriesArb, (s) => expect(rainflow(s)).toEqual(referenceRainflow(s))));
  });

  test('the counted half cycles account for every reversal: Σ 2·count = peaks and valleys − 1', () => {
    fc.assert(
      fc.property(seriesArb, (s) => {
        const cycles = rainflow(s);
        expect(cycles.every((c) => c.count === 0.5 || c.count === 1)).toBe(true);
        const pv = peaksAndValleys(s).length;
        expect(cycles.reduce((sum, c) => sum + 2 * c.count, 0)).toBe(Math.max(pv - 1, 0));
      }),
    );
  });

  test('shifting the series by a constant changes the means only', () => {
    fc.assert(
      fc.property(seriesArb, fc.integer({ min: -1000, max: 1000 }), (s, c) => {
        const base = rainflow(s);
        const shifted = rainflow(s.map((v) => v + c));
        expect(shifted).toEqual(base.map((x) => ({ range: x.range, mean: x.mean + c, count: x.count })));
      }),
    );
  });

  test('scaling by k > 0 scales ranges and means, counts unchanged', () => {
    fc.assert(
      fc.property(seriesArb, fc.integer({ min: 1, max: 64 }), (s, k) => {
        const base = rainflow(s);
        const scaled = rainflow(s.map((v) => v * k));
        expect(scaled).toEqual(base.map((x) => ({ range: x.range * k, mean: x.mean * k, count: x.count })));
      }),
    );
  });

  test('rainflowRepeating: full cycles only, accounting for every reversal of the closed loop', () => {
    fc.assert(
      fc.property(seriesArb, (s) => {
        const cycles = rainflowRepeating(s);
        expect(cycles.every((c) => c.count === 1)).toBe(true);
        const loop = closedLoop(s).length;
        expect(cycles.length).toBe(loop >= 2 ? (loop - 1) / 2 : 0);
      }),
    );
  });

  /*
   * A repeated block, counted once closed: counting n + 1 blocks with the standard's procedure gives
   * exactly one block's closed cycles more than counting n blocks (what one more block adds once the
   * residue has settled), and n blocks differ from n × the per-block count only by a residue that does
   * not grow with n.
   */
  test('a repeated block counts the same per block as rainflowRepeating, up to the residue', () => {
    const blockArb = fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 2, maxLength: 25 });
    fc.assert(
      fc.property(blockArb, fc.integer({ min: 2, max: 6 }), (block, n) => {
        const repeat = (times: number) => Array.from({ length: times }, () => block).flat();
        const perBlock = histogram(rainflowRepeating(block), true);
        const a = histogram(rainflow(repeat(n)), true);
        const b = histogram(rainflow(repeat(n + 1)), true);
        const keys = new Set([...a.keys(), ...b.keys(), ...perBlock.keys()]);
        for (const key of keys) expect((b.get(key) ?? 0) - (a.get(key) ?? 0)).toBe(perBlock.get(key) ?? 0);
        const residue = Math.abs(totalCount(rainflow(repeat(n))) - n * totalCount(rainflowRepeating(block)));
        expect(residue).toBeLessThanOrEqual(peaksAndValleys(block).length);
      }),
    );
  });
});
