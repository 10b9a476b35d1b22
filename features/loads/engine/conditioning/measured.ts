/**
 * Conditioning of a `measured` motion profile (time with angle, or time with rate) before the loads are
 * computed from it:
 *  1. angles are unwrapped (a jump of more than π between neighbours is a turn read modulo 2π);
 *  2. the sample rate is the median interval's; gaps (intervals over 3× the median) and uneven spacing are
 *     reported, and the record is resampled linearly onto an even grid at that rate;
 *  3. a zero-phase low-pass: an 8-pole Butterworth (4th order, run forward and backward; see
 *     `butterworth.ts`) at `cutoffHz`, or at a cut-off chosen from the record's spectrum (`spectrum.ts`);
 *  4. derivatives after smoothing: five-point central differences on the filtered grid (fourth-order
 *     accurate; e.g. Abramowitz & Stegun, Handbook of Mathematical Functions, 25.3.6 and 25.3.24);
 *  5. values at the cycle's times by cubic Hermite interpolation between grid points, each quantity with
 *     its own derivative as slope; a rate record is integrated to angle with the end-corrected trapezoid
 *     rule (exact for cubics).
 * A profile that gives `windowPoints` without `cutoffHz` keeps the former behaviour: a Savitzky–Golay fit
 * over that many samples (`smoothing.ts`), with unwrapping and warnings added.
 */
import type { CycleWarning } from '@/features/loads/engine/cycle-types';
import { zeroPhaseLowPass } from '@/features/loads/engine/conditioning/butterworth';
import {
  GAP_FACTOR,
  analyseSpacing,
  estimateNoise,
  heldValueWarnings,
  resampleEven,
  spacingWarnings,
  unwrapAngles,
} from '@/features/loads/engine/conditioning/record';
import { analyseContent } from '@/features/loads/engine/conditioning/spectrum';
import type { MotionProfile } from '@/features/loads/engine/profiles';
import { localPolynomialFit } from '@/features/loads/engine/smoothing';

/** The Butterworth order run each way: 4, so the zero-phase response falls with 8 poles. */
export const MEASURED_FILTER_ORDER = 4;
/** Fewer samples than this are fitted locally (Savitzky–Golay) instead of filtered. */
export const MIN_FILTER_SAMPLES = 8;
/** The former defaults of the local fit, still used for very short records. */
export const LEGACY_WINDOW_POINTS = { angle: 9, rate: 7 } as const;
/** Default cycle sampling with a measured profile: as dense as the record, within these bounds. */
export const MEASURED_CYCLE_SAMPLES = { min: 360, max: 10_000 } as const;

export type MeasuredProfile = Extract<MotionProfile, { kind: 'measured' }>;

export type ConditionedMotion = {
  method: 'butterworth' | 'savitzky-golay';
  /** The low-pass cut-off used (null for the local fit). */
  cutoffHz: number | null;
  sampleRateHz: number;
  noiseRms: number | null;
  /** Warnings about this record, without a joint number. */
  warnings: CycleWarning[];
  /** Angle, rate and acceleration at `times` (s from the first sample), into `out[k * stride + joint]`. */
  evaluate(
    times: ArrayLike<number>,
    joint: number,
    stride: number,
    angle: Float64Array,
    rate: Float64Array,
    accel: Float64Array,
  ): void;
};

const DEG = 180 / Math.PI;
const fmt = (v: number, digits = 3) => Number(v.toPrecision(digits)).toLocaleString('en');

type CacheEntry = { source: unknown[]; result: ConditionedMotion };
const cache = new WeakMap<object, CacheEntry>();

/** Conditions a measured profile once; the same profile object (unchanged) returns the same result. */
export function conditionMeasured(profile: MeasuredProfile): ConditionedMotion {
  const source = [
    profile.timeS,
    profile.angleRad,
    profile.rateRadS,
    profile.startAngleRad,
    profile.windowPoints,
    profile.cutoffHz,
    profile.timeS.length,
  ];
  const hit = cache.get(profile);
  if (hit && hit.source.every((v, i) => v === source[i])) return hit.result;
  const result = conditionUncached(profile);
  cache.set(profile, { source, result });
  return result;
}

function conditionUncached(profile: MeasuredProfile): ConditionedMotion {
  const isAngle = profile.angleRad !== undefined;
  const raw = profile.angleRad ?? profile.rateRadS;
  if (!raw) throw new Error('A measured profile needs angleRad or rateRadS');
  const timeS = profile.timeS;
  const n = timeS.length;
  if (raw.length !== n) throw new Error('A measured profile needs one value per time');
  const what = isAngle ? 'angle record' : 'rate record';
  const spacing = analyseSpacing(timeS);
  const warnings: CycleWarning[] = [...heldValueWarnings(timeS, raw, what), ...spacingWarnings(spacing)];
  let values: ArrayLike<number> = raw;
  if (isAngle) {
    const unwrapped = unwrapAngles(raw);
    values = unwrapped.values;
    if (unwrapped.jumps > 0)
      warnings.push({
        code: 'unwrapped',
        level: 'info',
        message: `The angle record jumps by a whole turn ${unwrapped.jumps} time${unwrapped.jumps > 1 ? 's' : ''} (an encoder read within one turn); the turns were counted on so the motion runs on smoothly.`,
      });
  }
  const legacyWindow =
    profile.cutoffHz === undefined && profile.windowPoints !== undefined
      ? profile.windowPoints
      : n < MIN_FILTER_SAMPLES
        ? LEGACY_WINDOW_POINTS[isAngle ? 'angle' : 'rate']
        : null;
  if (legacyWindow !== null) {
    const seconds = Math.min(legacyWindow, n) / spacing.sampleRateHz;
    warnings.push({
      code: 'smoothing',
      level: 'info',
      message:
        (n < MIN_FILTER_SAMPLES
          ? `Only ${n} samples: too few to filter, so `
          : 'As requested (a window in samples), ') +
        `the ${what} was smoothed by a Savitzky–Golay fit over ${Math.min(legacyWindow, n)} samples (about ${fmt(seconds)} s at ${fmt(spacing.sampleRateHz)} Hz).`,
    });
    return localFitMotion(profile, values, isAngle, legacyWindow, spacing.sampleRateHz, warnings);
  }
  const gaps = spacing.gaps.length > 0;
  return filteredMotion(profile, values, isAngle, spacing.sampleRateHz, spacing.spanS, gaps, warnings);
}

function filteredMotion(
  profile: MeasuredProfile,
  values: ArrayLike<number>,
  isAngle: boolean,
  medianRateHz: number,
  spanS: number,
  gaps: boolean,
  warnings: CycleWarning[],
): ConditionedMotion {
  const count = gridCount(values.length, spanS, medianRateHz, gaps);
  const h = spanS / (count - 1);
  const rateHz = 1 / h;
  const grid = resampleEven(profile.timeS, values, count, GAP_FACTOR / medianRateHz);
  const noise = estimateNoise(profile.timeS, values);
  const content = analyseContent(grid, rateHz, noise);
  const cutoff = profile.cutoffHz ?? content.cutoffHz;
  if (!(cutoff > 0 && cutoff < rateHz / 2))
    throw new Error(`cutoffHz must be above 0 and below half the sample rate (${fmt(rateHz / 2)} Hz)`);
  const { values: y, pad } = zeroPhaseLowPass(
    grid,
    rateHz,
    cutoff,
    MEASURED_FILTER_ORDER,
    4,
    content.noiseRms,
  );
  // Derivatives of the filtered record by five-point central differences, on the padded grid.
  const d1 = stencil(y, pad, count, h, 1);
  const d2 = stencil(y, pad, count, h, 2);
  const d3 = stencilOf(d2, pad, count, h);
  const base = y.subarray(pad, pad + count);
  let q: Float64Array;
  let w: Float64Array;
  let a: Float64Array;
  let j: Float64Array;
  if (isAngle) {
    [q, w, a, j] = [base, d1.subarray(pad, pad + count), d2.subarray(pad, pad + count), d3];
  } else {
    [w, a, j] = [base, d1.subarray(pad, pad + count), d2.subarray(pad, pad + count)];
    q = new Float64Array(count);
    q[0] = profile.startAngleRad ?? 0;
    // Trapezoid with the end-slope correction (fourth order), from the smoothed rate and its derivative.
    for (let k = 1; k < count; k++)
      q[k] = q[k - 1] + (h / 2) * (w[k - 1] + w[k]) + ((h * h) / 12) * (a[k - 1] - a[k]);
  }
  describeFilter(warnings, isAngle, rateHz, cutoff, profile.cutoffHz !== undefined, content, values);
  return {
    method: 'butterworth',
    cutoffHz: cutoff,
    sampleRateHz: rateHz,
    noiseRms: content.noiseRms,
    warnings,
    evaluate(times, joint, stride, angle, rate, accel) {
      for (let k = 0; k < times.length; k++) {
        const t = times[k];
        let i = Math.floor(t / h);
        if (i > count - 2) i = count - 2;
        if (i < 0) i = 0;
        const u = t / h - i;
        angle[k * stride + joint] = hermite(q, w, i, u, h);
        rate[k * stride + joint] = hermite(w, a, i, u, h);
        accel[k * stride + joint] = hermite(a, j, i, u, h);
      }
    },
  };
}

/**
 * Points of the even grid a record is filtered on. Without gaps it keeps one point per sample (at the mean
 * interval), so interpolation barely touches the noise; with gaps it runs at the median interval and
 * fills them (never more than 4 points per sample).
 */
function gridCount(n: number, spanS: number, medianRateHz: number, gaps: boolean): number {
  return gaps ? Math.max(MIN_FILTER_SAMPLES, Math.min(4 * n, Math.round(spanS * medianRateHz) + 1)) : n;
}

/**
 * The sample rate a record is filtered at (Hz): a requested cut-off must lie below half of it. Times must
 * increase (at least 2 samples).
 */
export function measuredSampleRateHz(timeS: readonly number[]): number {
  const spacing = analyseSpacing(timeS);
  return (
    (gridCount(timeS.length, spacing.spanS, spacing.sampleRateHz, spacing.gaps.length > 0) - 1) /
    spacing.spanS
  );
}

/** Cubic Hermite between grid points i and i+1 at fraction u, with slopes `slope` (per second). */
function hermite(v: Float64Array, slope: Float64Array, i: number, u: number, h: number): number {
  const u2 = u * u;
  const u3 = u2 * u;
  return (
    (2 * u3 - 3 * u2 + 1) * v[i] +
    (u3 - 2 * u2 + u) * h * slope[i] +
    (-2 * u3 + 3 * u2) * v[i + 1] +
    (u3 - u2) * h * slope[i + 1]
  );
}

/** First or second derivative by the five-point stencil, over the padded array (2 samples in from its ends). */
function stencil(y: Float64Array, pad: number, count: number, h: number, order: 1 | 2): Float64Array {
  const out = new Float64Array(y.length);
  const from = Math.max(2, pad - 2);
  const to = Math.min(y.length - 2, pad + count + 2);
  for (let k = from; k < to; k++)
    out[k] =
      order === 1
        ? (y[k - 2] - 8 * y[k - 1] + 8 * y[k + 1] - y[k + 2]) / (12 * h)
        : (-y[k - 2] + 16 * y[k - 1] - 30 * y[k] + 16 * y[k + 1] - y[k + 2]) / (12 * h * h);
  return out;
}

/** First derivative (five-point) of a padded derivative array, returned for the record's own samples. */
function stencilOf(y: Float64Array, pad: number, count: number, h: number): Float64Array {
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const c = pad + k;
    out[k] =
      c >= 2 && c + 2 < y.length
        ? (y[c - 2] - 8 * y[c - 1] + 8 * y[c + 1] - y[c + 2]) / (12 * h)
        : (y[Math.min(c + 1, y.length - 1)] - y[Math.max(c - 1, 0)]) / (2 * h);
  }
  return out;
}

function describeFilter(
  warnings: CycleWarning[],
  isAngle: boolean,
  rateHz: number,
  cutoff: number,
  given: boolean,
  content: ReturnType<typeof analyseContent>,
  values: ArrayLike<number>,
) {
  warnings.push({
    code: 'smoothing',
    level: 'info',
    message: `The ${isAngle ? 'angle' : 'rate'} record (${fmt(rateHz)} samples per second) was smoothed by a zero-phase low-pass at ${fmt(cutoff)} Hz (${given ? 'as requested' : 'chosen from the record'}; 8-pole Butterworth run forward and backward) before the rate and acceleration were worked out.`,
  });
  let lo = Infinity;
  let hi = -Infinity;
  for (let k = 0; k < values.length; k++) {
    lo = Math.min(lo, values[k]);
    hi = Math.max(hi, values[k]);
  }
  const scale = isAngle ? hi - lo : Math.max(Math.abs(hi), Math.abs(lo));
  const noisy = content.noiseRms > 0.05 * scale;
  const unit = isAngle ? '°' : '°/s';
  warnings.push({
    code: 'noise',
    level: noisy ? 'warning' : 'info',
    message: `Noise on the ${isAngle ? 'angle' : 'rate'} record: about ${fmt(content.noiseRms * DEG, 2)} ${unit} RMS, judged from the part of its spectrum where the ride does not move${noisy ? '; that is large against the motion itself, so the peak loads are uncertain' : ''}.`,
  });
  if (content.limitedByRate && content.contentHz !== null)
    warnings.push({
      code: 'low_sample_rate',
      level: 'warning',
      message: `${fmt(rateHz)} samples per second is too few for this motion: it has content up to about ${fmt(content.contentHz)} Hz. Record at ${fmt(Math.ceil(content.contentHz * 7.5))} samples per second or more; peak rates and accelerations may be under-estimated.`,
    });
  if (given && content.contentHz !== null && cutoff < content.contentHz)
    warnings.push({
      code: 'cutoff_below_motion',
      level: 'warning',
      message: `The requested cut-off (${fmt(cutoff)} Hz) is below the motion's own content (up to about ${fmt(content.contentHz)} Hz): part of the real motion is smoothed away and the peak loads may be under-estimated.`,
    });
}

/** The former method: a local Savitzky–Golay fit at each cycle time (short records, or `windowPoints`). */
function localFitMotion(
  profile: MeasuredProfile,
  values: ArrayLike<number>,
  isAngle: boolean,
  window: number,
  sampleRateHz: number,
  warnings: CycleWarning[],
): ConditionedMotion {
  const t0 = profile.timeS[0];
  const rel = profile.timeS.map((t) => t - t0);
  const scratch = new Float64Array(40);
  return {
    method: 'savitzky-golay',
    cutoffHz: null,
    sampleRateHz,
    noiseRms: null,
    warnings,
    evaluate(times, joint, stride, angle, rate, accel) {
      if (isAngle) {
        for (let k = 0; k < times.length; k++) {
          const fit = localPolynomialFit(rel, values, times[k], window, 3, scratch);
          angle[k * stride + joint] = fit.value;
          rate[k * stride + joint] = fit.first;
          accel[k * stride + joint] = fit.second;
        }
        return;
      }
      // Cycle time 0 is the first sample, where the angle is startAngleRad.
      let q = profile.startAngleRad ?? 0;
      let prevT = 0;
      let prevW = 0;
      let prevA = 0;
      for (let k = 0; k < times.length; k++) {
        const fit = localPolynomialFit(rel, values, times[k], window, 2, scratch);
        if (k > 0) {
          const h = times[k] - prevT;
          q += (h / 2) * (prevW + fit.value) + ((h * h) / 12) * (prevA - fit.first);
        }
        angle[k * stride + joint] = q;
        rate[k * stride + joint] = fit.value;
        accel[k * stride + joint] = fit.first;
        prevT = times[k];
        prevW = fit.value;
        prevA = fit.first;
      }
    },
  };
}

/**
 * The default number of cycle samples when a profile is measured: as dense as the densest record over the
 * cycle (so no peak falls between samples), at least `MEASURED_CYCLE_SAMPLES.min`, at most `.max`.
 */
export function measuredCycleSamples(profiles: readonly MotionProfile[], durationS: number): number | null {
  let best: number | null = null;
  for (const m of profiles) {
    if (m.kind !== 'measured') continue;
    const span = m.timeS[m.timeS.length - 1] - m.timeS[0];
    const perSecond = (m.timeS.length - 1) / span;
    const want = Math.round(durationS * perSecond) + 1;
    best = Math.max(best ?? 0, want);
  }
  return best === null
    ? null
    : Math.min(MEASURED_CYCLE_SAMPLES.max, Math.max(MEASURED_CYCLE_SAMPLES.min, best));
}

/** Every measured joint's warnings (the conditioning is cached, so this re-runs nothing), with its joint. */
export function measuredWarnings(profiles: readonly MotionProfile[]): CycleWarning[] {
  return profiles.flatMap((p, joint) =>
    p.kind === 'measured' ? conditionMeasured(p).warnings.map((w) => ({ ...w, joint })) : [],
  );
}
