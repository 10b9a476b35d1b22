/**
 * Bounded series for drawing and sending a ride cycle: a subset of sample indices, shared by every series
 * of the cycle so the arrays stay aligned (time, angles, forces, rider accelerations at the same instants).
 *
 * Which instants are kept: the first and the last; for every series its exact global minimum and maximum;
 * then, for the series the app draws (each pivot's force, each seat's Gx and Gz), the instant of the
 * minimum and of the maximum within each of as many equal buckets of the cycle as the bound allows (the
 * min/max idea of line-chart downsampling), so every value dropped from a drawn series lies between
 * kept values of its bucket. Nothing is rounded or moved: a kept value is a computed sample at its own
 * instant. Pure: no React, no I/O; the server and the app run the same code.
 */
import type { CycleResult, JointHistory, SeatHistory } from '@/features/loads/engine/cycle-types';

type Series = ArrayLike<number>;

/** Index of the first minimum and first maximum of `values[from..to)`, NaN skipped; -1 when none. */
function extremeIndices(values: Series, from: number, to: number): [number, number] {
  let lo = -1;
  let hi = -1;
  let loValue = 0;
  let hiValue = 0;
  for (let k = from; k < to; k++) {
    const v = values[k];
    if (v !== v) continue;
    if (lo < 0) {
      lo = hi = k;
      loValue = hiValue = v;
    } else if (v < loValue) {
      lo = k;
      loValue = v;
    } else if (v > hiValue) {
      hi = k;
      hiValue = v;
    }
  }
  return [lo, hi];
}

/** Marks kept instants in `marks` (1 = kept) and returns how many are marked now. */
function markBuckets(drawn: readonly Series[], n: number, buckets: number, marks: Uint8Array, count: number) {
  for (let b = 0; b < buckets; b++) {
    const from = Math.floor((b * n) / buckets);
    const to = Math.floor(((b + 1) * n) / buckets);
    for (const s of drawn) {
      const [lo, hi] = extremeIndices(s, from, to);
      if (lo >= 0 && marks[lo] === 0) {
        marks[lo] = 1;
        count++;
      }
      if (hi >= 0 && marks[hi] === 0) {
        marks[hi] = 1;
        count++;
      }
    }
  }
  return count;
}

const markedIndices = (marks: Uint8Array) => {
  const out: number[] = [];
  for (let k = 0; k < marks.length; k++) if (marks[k] === 1) out.push(k);
  return out;
};

/**
 * The sample indices to keep, ascending, for series of `n` samples each: all of them when `n ≤ maxPoints`,
 * else at most `max(maxPoints, 2 + 2 × series)` (the must-keep instants alone: the ends and every series'
 * global extremes). The `drawn` series (a subset, or all) also keep their minimum and maximum in each of
 * as many equal buckets as the bound allows: the bucket count starts where it surely fits (two instants
 * per drawn series per bucket) and grows while what is kept still fits, since drawn series that turn at
 * the same instants share them.
 */
export function pickSampleIndices(
  series: readonly Series[],
  n: number,
  maxPoints: number,
  drawn: readonly Series[] = series,
): number[] {
  if (n <= maxPoints) return Array.from({ length: n }, (_, k) => k);
  const must = new Uint8Array(n);
  must[0] = 1;
  must[n - 1] = 1;
  for (const s of series) {
    const [lo, hi] = extremeIndices(s, 0, n);
    if (lo >= 0) must[lo] = 1;
    if (hi >= 0) must[hi] = 1;
  }
  let mustCount = 0;
  for (let k = 0; k < n; k++) mustCount += must[k];
  const room = maxPoints - mustCount;
  let best = must;
  if (room > 0 && drawn.length > 0) {
    let buckets = Math.min(n, Math.max(1, Math.floor(room / (2 * drawn.length))));
    for (let round = 0; round < 4; round++) {
      const kept = must.slice();
      const count = markBuckets(drawn, n, buckets, kept, mustCount);
      if (count > maxPoints) break;
      best = kept;
      const next = Math.min(n, Math.floor((buckets * room) / Math.max(1, count - mustCount)));
      if (next <= buckets) break;
      // Grow in proportion to the room left, a little short of it, so the next round usually still fits.
      buckets = Math.max(buckets + 1, Math.floor(buckets + (next - buckets) * 0.9));
    }
  }
  return markedIndices(best);
}

/** The values of `values` at `indices`, as the same kind of array. */
export function pickValues(values: Float64Array, indices: readonly number[]): Float64Array;
export function pickValues(values: readonly number[], indices: readonly number[]): number[];
export function pickValues(
  values: Float64Array | readonly number[],
  indices: readonly number[],
): Float64Array | number[] {
  // Plain loops: `Float64Array.from(indices, map)` calls back once per kept instant, several times slower.
  const out =
    values instanceof Float64Array ? new Float64Array(indices.length) : new Array<number>(indices.length);
  for (let i = 0; i < indices.length; i++) out[i] = values[indices[i]];
  return out;
}

const JOINT_SERIES = [
  'angleRad',
  'rateRadS',
  'accelRadS2',
  'forceXN',
  'forceYN',
  'forceAlongN',
  'forceAcrossN',
  'forceMagnitudeN',
  'torqueNm',
] as const satisfies readonly (keyof JointHistory)[];
const SEAT_SERIES = ['gx', 'gz'] as const satisfies readonly (keyof SeatHistory)[];

/**
 * The series the app draws over the cycle: each pivot's force magnitude and each seat's Gx and Gz
 * (features/loads/cycle-results.tsx, features/review/cycle-charts.tsx); they keep every bucket's extremes.
 */
export function drawnCycleSeries(result: Pick<CycleResult, 'joints' | 'seats'>): Float64Array[] {
  return [...result.joints.map((j) => j.forceMagnitudeN), ...result.seats.flatMap((s) => [s.gx, s.gz])];
}

/** Every per-sample series of a cycle result (time excluded: its extremes are its ends). */
export function cycleSeries(result: Pick<CycleResult, 'joints' | 'seats'>): Float64Array[] {
  return [
    ...result.joints.flatMap((j) => JOINT_SERIES.map((key) => j[key])),
    ...result.seats.flatMap((s) => SEAT_SERIES.map((key) => s[key])),
  ];
}

/** How many numbers a cycle's series hold per sample: time, nine per joint, two per seat. */
export const valuesPerSample = (joints: number, seats: number) =>
  1 + JOINT_SERIES.length * joints + SEAT_SERIES.length * seats;

/**
 * Numbers in a bounded cycle's series, for an HTTP answer (server/compute/cycle-series.ts) and for the
 * charts drawn from a cycle computed on the phone: about 220 KB of JSON. For a three-body chain that is
 * ~430 instants, about as many as the widest chart has pixels across; a 360-sample cycle of up to three
 * bodies and two seats (32 numbers a sample) fits whole, so it is drawn and sent as it is.
 */
export const BOUNDED_CYCLE_VALUES = 12_000;

export type BoundedCycle = {
  result: CycleResult;
  /** The full analysis's sample index of every kept instant; null when every sample was kept. */
  sampleIndex: number[] | null;
};

/**
 * The cycle with every series cut to the kept instants (`pickSampleIndices` over all of them), holding at
 * most about `maxValues` numbers in its series. Everything else (peaks with their full-analysis `index`,
 * extremes, envelope, pins, warnings, `samples`) is the full analysis's, untouched.
 */
export function boundCycle(result: CycleResult, maxValues: number): BoundedCycle {
  const perSample = valuesPerSample(result.joints.length, result.seats.length);
  const maxPoints = Math.max(2, Math.floor(maxValues / perSample));
  const n = result.timeS.length;
  const indices = pickSampleIndices(cycleSeries(result), n, maxPoints, drawnCycleSeries(result));
  if (indices.length === n) return { result, sampleIndex: null };
  const pick = (values: Float64Array) => pickValues(values, indices);
  const joints = result.joints.map((j): JointHistory => {
    const cut = { ...j };
    for (const key of JOINT_SERIES) cut[key] = pick(j[key]);
    return cut;
  });
  const seats = result.seats.map((s): SeatHistory => ({ ...s, gx: pick(s.gx), gz: pick(s.gz) }));
  return { result: { ...result, timeS: pick(result.timeS), joints, seats }, sampleIndex: indices };
}
