/**
 * Bounded series for drawing and sending a ride cycle: a subset of sample indices, shared by every series
 * of the cycle so the arrays stay aligned (time, angles, forces, rider accelerations at the same instants).
 *
 * Which instants are kept: the first and the last; for every series its exact global minimum and maximum;
 * then, for as many equal buckets of the cycle as the bound allows, the instant of each series' minimum and
 * maximum within each bucket (the min/max idea of line-chart downsampling). So no peak or trough is ever
 * rounded or moved: a kept value is a computed sample, at its own instant; what is dropped lies between
 * two kept samples of its bucket. Pure: no React, no I/O; the server and the app run the same code.
 */
import type { CycleResult, JointHistory, SeatHistory } from '@/features/loads/engine/cycle-types';

type Series = ArrayLike<number>;

/** Index of the first minimum and first maximum of `values[from..to)`, NaN skipped; -1 when none. */
function extremeIndices(values: Series, from: number, to: number): [number, number] {
  let lo = -1;
  let hi = -1;
  for (let k = from; k < to; k++) {
    const v = values[k];
    if (v !== v) continue;
    if (lo < 0 || v < values[lo]) lo = k;
    if (hi < 0 || v > values[hi]) hi = k;
  }
  return [lo, hi];
}

function bucketIndices(series: readonly Series[], n: number, buckets: number, into: Set<number>) {
  for (let b = 0; b < buckets; b++) {
    const from = Math.floor((b * n) / buckets);
    const to = Math.floor(((b + 1) * n) / buckets);
    for (const s of series) {
      const [lo, hi] = extremeIndices(s, from, to);
      if (lo >= 0) into.add(lo);
      if (hi >= 0) into.add(hi);
    }
  }
}

/**
 * The sample indices to keep, ascending, for series of `n` samples each: all of them when `n ≤ maxPoints`,
 * else at most `max(maxPoints, 2 + 2 × series)` (the must-keep instants alone: ends and global extremes).
 * The bucket count starts as large as the bound allows and shrinks until the kept instants fit, so the
 * result is as fine as the bound permits (series that turn at the same instants share their indices).
 */
export function pickSampleIndices(series: readonly Series[], n: number, maxPoints: number): number[] {
  if (n <= maxPoints) return Array.from({ length: n }, (_, k) => k);
  const must = new Set<number>([0, n - 1]);
  for (const s of series) {
    const [lo, hi] = extremeIndices(s, 0, n);
    if (lo >= 0) must.add(lo);
    if (hi >= 0) must.add(hi);
  }
  const sorted = (set: Set<number>) => Array.from(set).sort((a, b) => a - b);
  const room = maxPoints - must.size;
  if (room <= 0 || series.length === 0) return sorted(must);
  let buckets = Math.max(1, Math.min(n, Math.floor(room / 2)));
  for (;;) {
    const kept = new Set(must);
    bucketIndices(series, n, buckets, kept);
    if (kept.size <= maxPoints) return sorted(kept);
    if (buckets === 1) return sorted(must);
    // Shrink in proportion to the overshoot, by at least one bucket, so this ends in a few rounds.
    const scaled = Math.floor((buckets * room) / (kept.size - must.size));
    buckets = Math.max(1, Math.min(buckets - 1, scaled));
  }
}

/** The values of `values` at `indices`, as the same kind of array. */
export function pickValues(values: Float64Array, indices: readonly number[]): Float64Array;
export function pickValues(values: readonly number[], indices: readonly number[]): number[];
export function pickValues(
  values: Float64Array | readonly number[],
  indices: readonly number[],
): Float64Array | number[] {
  if (values instanceof Float64Array) return Float64Array.from(indices, (k) => values[k]);
  return indices.map((k) => values[k]);
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
  const indices = pickSampleIndices(cycleSeries(result), n, maxPoints);
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
