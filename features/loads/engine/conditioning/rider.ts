/**
 * Low-pass filtering of MEASURED rider accelerations (an accelerometer in a seat or on a gondola) before
 * they are compared with limits or with computed rider accelerations.
 *
 * Practice followed [from memory, verify against ASTM F2137 and EN 13814]: ride acceleration data are
 * low-pass filtered with a 4-pole Butterworth filter at about 5 Hz before evaluation, which keeps the
 * sustained accelerations a rider's body responds to and drops vibration and sensor noise. Realised here as
 * a 2nd-order Butterworth section run forward and backward (zero phase, 4 poles in all), with the design
 * cut-off corrected (Winter) so the whole response is −3 dB at 5 Hz; see `butterworth.ts`. The filter is
 * a comparison convention, not a physical truth: a record filtered otherwise is not comparable with limits
 * set under that practice.
 */
import type { CycleWarning } from '@/features/loads/engine/cycle-types';
import { zeroPhaseLowPass } from '@/features/loads/engine/conditioning/butterworth';
import {
  GAP_FACTOR,
  analyseSpacing,
  heldValueWarnings,
  resampleEven,
  spacingWarnings,
} from '@/features/loads/engine/conditioning/record';

/** [from memory, verify against ASTM F2137 / EN 13814] */
export const RIDER_ACCELERATION_CUTOFF_HZ = 5;
/** Poles of the whole zero-phase response: a 2nd-order section each way. */
export const RIDER_ACCELERATION_POLES = 4;

export type RiderAccelerationOptions = {
  /** Overrides the 5 Hz practice (e.g. to match a ride's own design documents). */
  cutoffHz?: number;
};

export type ConditionedRiderAccelerations = {
  /** The filtered values at the input's own times, in the input's unit (g or m/s²). */
  values: number[];
  /** The cut-off applied, or null when the record was sampled too slowly to filter at it. */
  cutoffHz: number | null;
  sampleRateHz: number;
  /** Clipping, gaps, uneven spacing, too slow a sample rate and the filter used, in words. */
  warnings: CycleWarning[];
};

const fmt = (v: number, digits = 3) => Number(v.toPrecision(digits)).toLocaleString('en');

/**
 * Filters one axis of measured rider accelerations (`values` at `timeS`, times increasing, in s) with the
 * ride-measurement low-pass: a 4-pole zero-phase Butterworth at 5 Hz unless `options.cutoffHz` says
 * otherwise. Uneven times are resampled evenly at the median rate for filtering and the result is read
 * back at the given times. Throws on malformed input (lengths differ, fewer than 4 samples, non-finite
 * values, times not increasing); everything the caller should show is in `warnings`.
 */
export function conditionRiderAccelerations(
  timeS: readonly number[],
  values: readonly number[],
  options: RiderAccelerationOptions = {},
): ConditionedRiderAccelerations {
  const n = timeS.length;
  if (values.length !== n) throw new Error('Rider accelerations need one value per time');
  if (n < 4) throw new Error('Rider accelerations need at least 4 samples');
  for (let k = 0; k < n; k++) {
    if (!Number.isFinite(timeS[k]) || !Number.isFinite(values[k]))
      throw new Error(`Sample ${k} of the rider accelerations is not a finite number`);
    if (k > 0 && !(timeS[k] > timeS[k - 1]))
      throw new Error(`Times of the rider accelerations must increase (sample ${k})`);
  }
  const cutoff = options.cutoffHz ?? RIDER_ACCELERATION_CUTOFF_HZ;
  if (!(cutoff > 0)) throw new Error('cutoffHz must be above 0');
  const spacing = analyseSpacing(timeS);
  const warnings: CycleWarning[] = [
    ...heldValueWarnings(timeS, values, 'acceleration record'),
    ...spacingWarnings(spacing),
  ];
  const count = Math.max(4, Math.min(4 * n, Math.round(spacing.spanS * spacing.sampleRateHz) + 1));
  const rateHz = (count - 1) / spacing.spanS;
  // Below ~2.2 samples per cut-off period the filter would do nothing useful (and cannot be designed at Nyquist).
  if (!(cutoff < 0.45 * rateHz)) {
    warnings.push({
      code: 'low_sample_rate',
      level: 'warning',
      message: `The acceleration record has ${fmt(rateHz)} samples per second, too few to filter at ${fmt(cutoff)} Hz; the values are shown unfiltered and are not comparable with limits. Record at ${fmt(Math.ceil(cutoff * 10))} samples per second or more.`,
    });
    return { values: [...values], cutoffHz: null, sampleRateHz: rateHz, warnings };
  }
  const grid = resampleEven(timeS, values, count, GAP_FACTOR * spacing.medianStepS);
  const { values: filtered } = zeroPhaseLowPass(grid, rateHz, cutoff, RIDER_ACCELERATION_POLES / 2);
  const h = spacing.spanS / (count - 1);
  const t0 = timeS[0];
  const out = timeS.map((t) => {
    const x = (t - t0) / h;
    const i = Math.min(count - 2, Math.max(0, Math.floor(x)));
    const u = x - i;
    return filtered[i] + u * (filtered[i + 1] - filtered[i]);
  });
  warnings.push({
    code: 'smoothing',
    level: 'info',
    message: `Rider accelerations (${fmt(rateHz)} samples per second) were low-pass filtered at ${fmt(cutoff)} Hz with a ${RIDER_ACCELERATION_POLES}-pole Butterworth filter run forward and backward (no time shift), ${options.cutoffHz === undefined ? 'as ride acceleration measurements usually are' : 'as requested'}.`,
  });
  return { values: out, cutoffHz: cutoff, sampleRateHz: rateHz, warnings };
}
