/**
 * Facts about a measured record before it is filtered: its sample rate and spacing (gaps, uneven times),
 * angle wrapping, clipped and flat-lined runs; and its resampling onto an even grid. Pure functions on
 * plain arrays; the warnings they return are worded for an inspector.
 */
import type { CycleWarning } from '@/features/loads/engine/cycle-types';

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
  const s = Float64Array.from(values).sort();
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Sample rate, gaps and unevenness of increasing times. */
export function analyseSpacing(timeS: ArrayLike<number>): Spacing {
  const n = timeS.length;
  const steps = new Float64Array(n - 1);
  for (let k = 1; k < n; k++) steps[k - 1] = timeS[k] - timeS[k - 1];
  const sorted = Float64Array.from(steps).sort();
  const medianStep = median(sorted);
  const gaps: Spacing['gaps'] = [];
  for (let k = 0; k < steps.length; k++)
    if (steps[k] > GAP_FACTOR * medianStep) gaps.push({ atS: timeS[k] - timeS[0], lengthS: steps[k] });
  const q1 = sorted[Math.floor(0.25 * (sorted.length - 1))];
  const q3 = sorted[Math.ceil(0.75 * (sorted.length - 1))];
  return {
    sampleRateHz: 1 / medianStep,
    medianStepS: medianStep,
    spanS: timeS[n - 1] - timeS[0],
    gaps,
    unevenSpread: (q3 - q1) / medianStep,
  };
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
 * Linear interpolation of the record onto `count` even points from 0 to the record's span (times relative
 * to the first sample). Where the record is even the grid falls on the samples themselves.
 */
export function resampleEven(
  timeS: ArrayLike<number>,
  values: ArrayLike<number>,
  count: number,
): Float64Array {
  const t0 = timeS[0];
  const span = timeS[timeS.length - 1] - t0;
  const out = new Float64Array(count);
  let j = 0;
  for (let k = 0; k < count; k++) {
    const t = k === count - 1 ? span : (k * span) / (count - 1);
    while (j < timeS.length - 2 && timeS[j + 1] - t0 <= t) j++;
    const ta = timeS[j] - t0;
    const tb = timeS[j + 1] - t0;
    const u = tb > ta ? Math.min(1, Math.max(0, (t - ta) / (tb - ta))) : 0;
    out[k] = values[j] + u * (values[j + 1] - values[j]);
  }
  return out;
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
      message: `The ${what} reads exactly the same value throughout: a stuck or disconnected sensor, or a joint that did not move. Check the record.`,
    });
    return warnings;
  }
  const runs = runsOfEqual(values, 3);
  const atExtreme = runs.filter((r) => values[r.start] === hi || values[r.start] === lo);
  const clippedSamples = atExtreme.reduce((sum, r) => sum + r.length, 0);
  if (atExtreme.length > 0 && clippedSamples >= Math.max(5, 0.005 * n)) {
    const first = atExtreme[0];
    warnings.push({
      code: 'clipped',
      level: 'warning',
      message: `The ${what} looks clipped: ${clippedSamples} samples sit at its highest or lowest value (first at ${fmt(timeS[first.start] - timeS[0], 3)} s), as when a sensor reaches the end of its range. The peaks there are cut off; the loads may be under-estimated.`,
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
      message: `The ${what} repeats exactly the same value for ${fmt(to - from, 2)} s (from ${fmt(from, 3)} s)${flat.length > 1 ? ` and in ${flat.length - 1} more place${flat.length > 2 ? 's' : ''}` : ''}: a stuck sensor or a held value. The motion there is not measured.`,
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
