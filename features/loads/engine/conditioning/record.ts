/**
 * Facts about a measured record before it is filtered: its sample rate and spacing (gaps, uneven times),
 * angle wrapping, clipped and flat-lined runs; and its resampling onto an even grid. Pure functions on
 * plain arrays; the warnings they return are worded for an inspector.
 */
import type { CycleWarning } from '@/features/loads/engine/cycle-types';
import { localPolynomialFit } from '@/features/loads/engine/smoothing';

/** An interval longer than this many times the median one is a gap. */
export const GAP_FACTOR = 3;

export type Spacing = {
  /** From the median interval: robust to a few gaps or duplicated stamps. */
  sampleRateHz: number;
  medianStepS: number;
  spanS: number;
  gaps: { atS: number; lengthS: number }[];
  /** Spread of the intervals (interquartile range / median) when it is large enough to mention. */
  unevenSpread: number;
};

export function median(values: ArrayLike<number>): number {
  const s = Float64Array.from(values);
  const m = s.length >> 1;
  return s.length % 2 ? select(s, m) : (select(s, m - 1) + select(s, m)) / 2;
}

/**
 * The k-th smallest value (0-based) of `a`, which it reorders: Hoare's quickselect, linear on average —
 * sorting thousands of intervals for a median cost more than the filtering itself.
 */
export function select(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (hi > lo) {
    const pivot = a[(lo + hi) >> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

/** Sample rate, gaps and unevenness of increasing times. */
export function analyseSpacing(timeS: ArrayLike<number>): Spacing {
  const n = timeS.length;
  const steps = new Float64Array(n - 1);
  for (let k = 1; k < n; k++) steps[k - 1] = timeS[k] - timeS[k - 1];
  const medianStep = median(steps);
  const gaps: Spacing['gaps'] = [];
  for (let k = 0; k < steps.length; k++)
    if (steps[k] > GAP_FACTOR * medianStep) gaps.push({ atS: timeS[k] - timeS[0], lengthS: steps[k] });
  const q1 = select(steps, Math.floor(0.25 * (steps.length - 1)));
  const q3 = select(steps, Math.ceil(0.75 * (steps.length - 1)));
  return {
    sampleRateHz: 1 / medianStep,
    medianStepS: medianStep,
    spanS: timeS[n - 1] - timeS[0],
    gaps,
    unevenSpread: (q3 - q1) / medianStep,
  };
}

/**
 * RMS of the white noise on a record, from how far each sample lies off the cubic through its four
 * neighbours (Lagrange interpolation at the actual times, so uneven records are fine). Each residual is
 * scaled by √(1 + Σ lⱼ²) — its standard deviation in units of the noise's — and the noise is the larger of
 * the median absolute residual ×1.4826 (robust to kinks and spikes; Hampel's MAD scale for a normal law)
 * and half the residuals' RMS (which still sees a quantised reading whose residuals are mostly zero).
 */
export function estimateNoise(
  timeS: ArrayLike<number>,
  values: ArrayLike<number>,
  robustOnly = false,
): number {
  const n = values.length;
  if (n < 5) return 0;
  const scaled = new Float64Array(n - 4);
  let sumSq = 0;
  const idx = [0, 0, 0, 0];
  for (let k = 2; k < n - 2; k++) {
    const t = timeS[k];
    idx[0] = k - 2;
    idx[1] = k - 1;
    idx[2] = k + 1;
    idx[3] = k + 2;
    let predicted = 0;
    let weights = 0;
    for (let a = 0; a < 4; a++) {
      const j = idx[a];
      let l = 1;
      for (let b = 0; b < 4; b++) if (b !== a) l *= (t - timeS[idx[b]]) / (timeS[j] - timeS[idx[b]]);
      predicted += l * values[j];
      weights += l * l;
    }
    const e = (values[k] - predicted) / Math.sqrt(1 + weights);
    scaled[k - 2] = Math.abs(e);
    sumSq += e * e;
  }
  const robust = 1.4826 * median(scaled);
  return robustOnly ? robust : Math.max(robust, 0.5 * Math.sqrt(sumSq / scaled.length));
}

/** Removes jumps of more than π between neighbours (an encoder read modulo a turn); counts the fixes. */
export function unwrapAngles(angles: ArrayLike<number>): { values: Float64Array; jumps: number } {
  const out = Float64Array.from(angles);
  let shift = 0;
  let jumps = 0;
  for (let k = 1; k < out.length; k++) {
    const d = angles[k] - angles[k - 1];
    if (Math.abs(d) > Math.PI) {
      shift -= 2 * Math.PI * Math.round(d / (2 * Math.PI));
      jumps++;
    }
    out[k] = angles[k] + shift;
  }
  return { values: out, jumps };
}

/**
 * Interpolation of the record onto `count` even points from 0 to the record's span (times relative to the
 * first sample): linear between neighbouring samples (where the record is even the grid falls on the
 * samples themselves), but across a gap (an interval over `gapS`) a cubic Hermite whose end slopes come
 * from a quadratic fitted to the samples on each side alone, so the filled stretch joins the motion
 * smoothly instead of with two kinks the differentiation would turn into spikes.
 */
export function resampleEven(
  timeS: ArrayLike<number>,
  values: ArrayLike<number>,
  count: number,
  gapS = Infinity,
): Float64Array {
  const t0 = timeS[0];
  const n = timeS.length;
  const span = timeS[n - 1] - t0;
  const out = new Float64Array(count);
  let j = 0;
  let slopesFor = -1;
  let sa = 0;
  let sb = 0;
  for (let k = 0; k < count; k++) {
    const t = k === count - 1 ? span : (k * span) / (count - 1);
    while (j < n - 2 && timeS[j + 1] - t0 <= t) j++;
    const ta = timeS[j] - t0;
    const tb = timeS[j + 1] - t0;
    const h = tb - ta;
    const u = h > 0 ? Math.min(1, Math.max(0, (t - ta) / h)) : 0;
    if (h > gapS) {
      if (slopesFor !== j) {
        sa = sideSlope(timeS, values, Math.max(0, j - 8), j + 1, timeS[j]);
        sb = sideSlope(timeS, values, j + 1, Math.min(n, j + 10), timeS[j + 1]);
        slopesFor = j;
      }
      const u2 = u * u;
      const u3 = u2 * u;
      out[k] =
        (2 * u3 - 3 * u2 + 1) * values[j] +
        (u3 - 2 * u2 + u) * h * sa +
        (-2 * u3 + 3 * u2) * values[j + 1] +
        (u3 - u2) * h * sb;
    } else out[k] = values[j] + u * (values[j + 1] - values[j]);
  }
  return out;
}

/** Slope at time t of a quadratic (a line with 2 samples) fitted to samples [from, to). */
function sideSlope(timeS: ArrayLike<number>, values: ArrayLike<number>, from: number, to: number, t: number) {
  const m = to - from;
  if (m < 2) return 0;
  const times = new Float64Array(m);
  const vals = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    times[i] = timeS[from + i] - t;
    vals[i] = values[from + i];
  }
  return localPolynomialFit(times, vals, 0, m, Math.min(2, m - 1)).first;
}

type Run = { start: number; length: number };

function runsOfEqual(values: ArrayLike<number>, minLength: number): Run[] {
  const runs: Run[] = [];
  let start = 0;
  for (let k = 1; k <= values.length; k++) {
    if (k < values.length && values[k] === values[start]) continue;
    if (k - start >= minLength) runs.push({ start, length: k - start });
    start = k;
  }
  return runs;
}

const fmt = (v: number, digits = 2) => Number(v.toPrecision(digits)).toLocaleString('en');

/**
 * Clipped runs (several samples held at the record's highest or lowest value: a sensor at the end of its
 * range) and flat-lined runs (the same value repeated for half a second or more elsewhere: a stuck or
 * disconnected sensor, or a held value).
 */
export function heldValueWarnings(
  timeS: ArrayLike<number>,
  values: ArrayLike<number>,
  what: string,
): CycleWarning[] {
  const n = values.length;
  let lo = Infinity;
  let hi = -Infinity;
  for (let k = 0; k < n; k++) {
    lo = Math.min(lo, values[k]);
    hi = Math.max(hi, values[k]);
  }
  const warnings: CycleWarning[] = [];
  if (hi === lo) {
    warnings.push({
      code: 'flat_record',
      level: 'warning',
      message: `The ${what} reads exactly the same value throughout, without any noise: a stuck or disconnected sensor, a typed-in constant, or a joint that truly held still (or, for a rate, turned perfectly steadily). Check the record.`,
    });
    return warnings;
  }
  const runs = runsOfEqual(values, 3);
  // Exactly repeated values stand out only on a record that is noisy elsewhere: a noise-free (computed
  // or typed) record may hold a value exactly and rightly.
  if (runs.length === 0 || !(estimateNoise(timeS, values, true) > 1e-9 * (hi - lo))) return warnings;
  const atExtreme = runs.filter((r) => values[r.start] === hi || values[r.start] === lo);
  const clippedSamples = atExtreme.reduce((sum, r) => sum + r.length, 0);
  if (atExtreme.length > 0 && clippedSamples >= Math.max(5, 0.005 * n)) {
    const first = atExtreme[0];
    warnings.push({
      code: 'clipped',
      level: 'warning',
      message: `The ${what} may be clipped: ${clippedSamples} samples sit exactly at its highest or lowest value (first at ${fmt(timeS[first.start] - timeS[0], 3)} s), as when a sensor reaches the end of its range and cuts the peaks off, so the loads may be under-estimated. If the ride really held that value exactly, this does not apply.`,
    });
  }
  const flat = runs.filter(
    (r) => !atExtreme.includes(r) && r.length >= 5 && timeS[r.start + r.length - 1] - timeS[r.start] >= 0.5,
  );
  if (flat.length > 0) {
    const longest = flat.reduce((a, b) => (b.length > a.length ? b : a));
    const from = timeS[longest.start] - timeS[0];
    const to = timeS[longest.start + longest.length - 1] - timeS[0];
    warnings.push({
      code: 'flat_lined',
      level: 'warning',
      message: `The ${what} repeats exactly the same value for ${fmt(to - from, 2)} s (from ${fmt(from, 3)} s)${flat.length > 1 ? ` and in ${flat.length - 1} more place${flat.length > 2 ? 's' : ''}` : ''}: a stuck sensor or a held value, so the motion there may not be measured. A real sensor's noise rarely repeats a value exactly.`,
    });
  }
  return warnings;
}

/** Gaps and uneven spacing, in words. */
export function spacingWarnings(spacing: Spacing): CycleWarning[] {
  const warnings: CycleWarning[] = [];
  if (spacing.gaps.length > 0) {
    const longest = spacing.gaps.reduce((a, b) => (b.lengthS > a.lengthS ? b : a));
    warnings.push({
      code: 'gaps',
      level: 'warning',
      message: `The record has ${spacing.gaps.length} gap${spacing.gaps.length > 1 ? 's' : ''} (intervals over ${GAP_FACTOR}× the usual ${fmt(spacing.medianStepS * 1000, 3)} ms); the longest is ${fmt(longest.lengthS, 3)} s at ${fmt(longest.atS, 3)} s. The motion inside a gap is interpolated, so loads there are uncertain.`,
    });
  }
  if (spacing.unevenSpread > 0.1) {
    warnings.push({
      code: 'uneven_spacing',
      level: 'info',
      message: `The sample times are uneven (the middle half of the intervals spreads over ${fmt(spacing.unevenSpread * 100, 2)} % of the usual interval); the record was resampled evenly at ${fmt(spacing.sampleRateHz, 3)} Hz before filtering.`,
    });
  }
  return warnings;
}
