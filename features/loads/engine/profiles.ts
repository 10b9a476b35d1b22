import { LEGACY_WINDOW_POINTS, conditionMeasured } from '@/features/loads/engine/conditioning/measured';

const RPM_TO_RAD_S = (2 * Math.PI) / 60;

/**
 * How one joint moves over the ride cycle, relative to its parent. Time runs from 0 at the start of the
 * cycle; angles in rad, rates in rpm where the trade reads rpm (a signed rpm: + counter-clockwise).
 */
export type MotionProfile =
  /** Held at a fixed angle relative to the parent (a locked gondola). */
  | { kind: 'fixed'; angleRad: number }
  /** Steady rotation. */
  | { kind: 'constant'; rpm: number; startAngleRad?: number }
  /**
   * Spin-up or spin-down from `fromRpm` to `toRpm` over `rampTimeS`, after `holdBeforeS` at `fromRpm` and
   * followed by `holdAfterS` at `toRpm`. 'linear': constant angular acceleration; 'smooth': the rate
   * follows a half cosine so the acceleration starts and ends at zero.
   */
  | {
      kind: 'ramp';
      fromRpm?: number;
      toRpm: number;
      rampTimeS: number;
      holdBeforeS?: number;
      holdAfterS?: number;
      startAngleRad?: number;
      shape?: 'linear' | 'smooth';
    }
  /** Harmonic swing q = centre + amplitude·sin(2πt/period + phase). */
  | { kind: 'swing'; amplitudeRad: number; periodS: number; centreRad?: number; phaseRad?: number }
  /**
   * Measured samples, time with angle or time with rate. Angles are unwrapped; the record is resampled
   * evenly, low-pass filtered with zero phase (`cutoffHz`, or a cut-off chosen from the record) and only
   * then differentiated (features/loads/engine/conditioning/measured.ts). Times are taken relative to the
   * first sample. A rate record is integrated from `startAngleRad`. `windowPoints` (former callers): when
   * given without `cutoffHz`, a Savitzky–Golay fit over that many samples is used instead of the filter.
   */
  | {
      kind: 'measured';
      timeS: readonly number[];
      angleRad?: readonly number[];
      rateRadS?: readonly number[];
      startAngleRad?: number;
      windowPoints?: number;
      /** Low-pass cut-off in Hz for the smoothing; chosen from the record when absent. */
      cutoffHz?: number;
    }
  /**
   * A free pin: no drive torque. The joint starts at `angleRad` with `rateRadS` (default 0, at rest) at
   * t = 0 and then moves as the chain's equations of motion say, while the other joints follow their
   * profiles. Integrated by the cycle analysis, never sampled on its own.
   */
  | { kind: 'free'; angleRad: number; rateRadS?: number };

/** The Savitzky–Golay window (samples) used for measured records too short to filter (under 8 samples). */
export const DEFAULT_WINDOW_POINTS = LEGACY_WINDOW_POINTS;

/** The length of one natural cycle of a profile, or null when it has none (fixed, stopped). */
export function naturalDurationS(profile: MotionProfile): number | null {
  switch (profile.kind) {
    case 'fixed':
      return null;
    case 'constant':
      return profile.rpm === 0 ? null : 60 / Math.abs(profile.rpm);
    case 'ramp':
      return (profile.holdBeforeS ?? 0) + profile.rampTimeS + (profile.holdAfterS ?? 0);
    case 'swing':
      return profile.periodS;
    case 'measured':
      return profile.timeS[profile.timeS.length - 1] - profile.timeS[0];
    case 'free':
      // Its period comes from integrating the chain (features/loads/engine/free-motion.ts).
      return null;
  }
}

/** The cycle length when none is given: the longest natural cycle among the joints. */
export function defaultCycleDurationS(profiles: readonly MotionProfile[]): number | null {
  let longest: number | null = null;
  for (const p of profiles) {
    const d = naturalDurationS(p);
    if (d !== null && d > 0 && (longest === null || d > longest)) longest = d;
  }
  return longest;
}

/**
 * Samples a profile at the given times into angle, rate and acceleration, writing joint `joint` of a
 * flat array laid out sample-major (`out[k * stride + joint]`), the layout the solver reads.
 */
export function sampleProfile(
  profile: MotionProfile,
  times: Float64Array,
  joint: number,
  stride: number,
  angle: Float64Array,
  rate: Float64Array,
  accel: Float64Array,
): void {
  const count = times.length;
  switch (profile.kind) {
    case 'fixed':
      for (let k = 0; k < count; k++) {
        angle[k * stride + joint] = profile.angleRad;
        rate[k * stride + joint] = 0;
        accel[k * stride + joint] = 0;
      }
      return;
    case 'constant': {
      const w = profile.rpm * RPM_TO_RAD_S;
      const q0 = profile.startAngleRad ?? 0;
      for (let k = 0; k < count; k++) {
        angle[k * stride + joint] = q0 + w * times[k];
        rate[k * stride + joint] = w;
        accel[k * stride + joint] = 0;
      }
      return;
    }
    case 'ramp': {
      const w0 = (profile.fromRpm ?? 0) * RPM_TO_RAD_S;
      const w1 = profile.toRpm * RPM_TO_RAD_S;
      const hold = profile.holdBeforeS ?? 0;
      const tr = profile.rampTimeS;
      const dw = w1 - w0;
      const smooth = profile.shape === 'smooth';
      const q0 = profile.startAngleRad ?? 0;
      // Angle gained over the whole ramp: both shapes average the two rates.
      const rampAngle = ((w0 + w1) / 2) * tr;
      for (let k = 0; k < count; k++) {
        const t = times[k];
        let q: number;
        let w: number;
        let a: number;
        if (t <= hold) {
          q = q0 + w0 * t;
          w = w0;
          a = 0;
        } else if (t < hold + tr) {
          const u = t - hold;
          if (smooth) {
            const phase = (Math.PI * u) / tr;
            q = q0 + w0 * t + (dw / 2) * (u - (tr / Math.PI) * Math.sin(phase));
            w = w0 + (dw / 2) * (1 - Math.cos(phase));
            a = ((dw * Math.PI) / (2 * tr)) * Math.sin(phase);
          } else {
            q = q0 + w0 * t + (0.5 * dw * u * u) / tr;
            w = w0 + (dw * u) / tr;
            a = dw / tr;
          }
        } else {
          q = q0 + w0 * hold + rampAngle + w1 * (t - hold - tr);
          w = w1;
          a = 0;
        }
        angle[k * stride + joint] = q;
        rate[k * stride + joint] = w;
        accel[k * stride + joint] = a;
      }
      return;
    }
    case 'swing': {
      const omega = (2 * Math.PI) / profile.periodS;
      const amp = profile.amplitudeRad;
      const centre = profile.centreRad ?? 0;
      const phase = profile.phaseRad ?? 0;
      for (let k = 0; k < count; k++) {
        const arg = omega * times[k] + phase;
        const s = Math.sin(arg);
        angle[k * stride + joint] = centre + amp * s;
        rate[k * stride + joint] = amp * omega * Math.cos(arg);
        accel[k * stride + joint] = -amp * omega * omega * s;
      }
      return;
    }
    case 'measured':
      sampleMeasured(profile, times, joint, stride, angle, rate, accel);
      return;
    case 'free':
      throw new Error('A free joint is integrated with its chain, not sampled on its own');
  }
}

function sampleMeasured(
  profile: Extract<MotionProfile, { kind: 'measured' }>,
  times: Float64Array,
  joint: number,
  stride: number,
  angle: Float64Array,
  rate: Float64Array,
  accel: Float64Array,
): void {
  // Unwrapped, resampled, low-pass filtered, then differentiated (conditioning/measured.ts); done once
  // per profile object, so the cycle's warnings come from the same conditioning.
  conditionMeasured(profile).evaluate(times, joint, stride, angle, rate, accel);
}
