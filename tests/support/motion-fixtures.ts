/**
 * Synthetic phone recordings of known motions, for the motion-recording tests. A hanging uniform rod of
 * mass m and length L swinging harmonically, θ = A·sin(ωt + φ): its pin force at the bottom of the swing
 * is m·g + m·(L/2)·(A·ω)² (reaction of a rigid body turning about a fixed axis, at θ = 0 where θ̈ = 0;
 * any dynamics textbook, e.g. Meriam & Kraige, from memory), and a rider at distance d from the pivot,
 * spine toward it, feels Gz = 1 + d·(A·ω)²/g there (centripetal plus weight, specific force).
 */
import type { DesignData } from '@/features/loads/design-schema';
import { emptyTrace, appendSample, type SensorTrace } from '@/features/motion-recording';
import { STANDARD_GRAVITY } from '@/features/motion-recording';

export const SWING = { massKg: 400, lengthM: 4, seatM: 3.5, amplitudeRad: 0.5, periodS: 4 };

export function hangingRodDesign(): DesignData {
  const { massKg, lengthM, seatM, amplitudeRad, periodS } = SWING;
  return {
    source: { document: 'Test swing', revision: 'A' },
    bodies: [{ name: 'Arm' }],
    parts: [{ kind: 'rod', body: 0, name: 'Arm', massKg, fromM: [0, 0], toM: [0, -lengthM] }],
    pivots: [
      {
        joint: 0,
        name: 'Main pivot',
        shear: 'double',
        bearingLengthM: 0.05,
        nominalDiameterM: 0.06,
        minimumDiameterM: 0.058,
        maxClearanceM: 0.0005,
        maxForceN: 20_000,
      },
    ],
    // The spine points from the seat toward the pivot: +y of the arm's frame, 90° from its x-axis.
    seats: [{ body: 0, name: 'Seat 1', positionM: [0, -seatM], spineAngleRad: Math.PI / 2 }],
    motion: [{ joint: 0, kind: 'swing', amplitudeRad, periodS }],
    rider: { gz: { min: -0.2, max: 3 } },
  };
}

/** Seeded uniform noise in [−1, 1] (a linear congruential generator: repeatable without a library). */
export function noise(seed: number): () => number {
  let s = seed >>> 0 || 1;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s / 2 ** 32) * 2 - 1;
  };
}

/**
 * A phone held in a seat at `seatM` (the body's frame; spine along the body's +y, rider drawn facing +x)
 * through a harmonic swing θ = A·sin(2πt/T + φ): screen facing the rider's right, top toward the head, so
 * its z rate is minus the design rate (defaultSign −1), plus a bias and noise, and its x and y read the
 * chest-ward and spine-ward specific force f = a − g in the body's frame:
 *   f_x = −θ̈·p_y − θ̇²·p_x + g·sin θ,  f_y = θ̈·p_x − θ̇²·p_y + g·cos θ  (rigid-body kinematics).
 */
export function seatSwingTrace(opts: {
  amplitudeRad: number;
  periodS: number;
  seatM: [number, number];
  rateHz: number;
  durationS: number;
  phaseRad?: number;
  biasRadS?: number;
  noiseRadS?: number;
  seed?: number;
}): SensorTrace {
  const { amplitudeRad: A, periodS } = opts;
  const [px, py] = opts.seatM;
  const w = (2 * Math.PI) / periodS;
  const rnd = noise(opts.seed ?? 7);
  const trace = emptyTrace();
  const g = STANDARD_GRAVITY;
  for (let k = 0; k / opts.rateHz <= opts.durationS; k++) {
    const t = k / opts.rateHz;
    const arg = w * t + (opts.phaseRad ?? 0);
    const q = A * Math.sin(arg);
    const qd = A * w * Math.cos(arg);
    const qdd = -A * w * w * Math.sin(arg);
    const fx = -qdd * py - qd * qd * px + g * Math.sin(q);
    const fy = qdd * px - qd * qd * py + g * Math.cos(q);
    appendSample(trace, {
      tS: t,
      rate: [0.002 * rnd(), 0.002 * rnd(), -(qd + (opts.biasRadS ?? 0) + (opts.noiseRadS ?? 0) * rnd())],
      force: [fx / g, fy / g, 0],
    });
  }
  return trace;
}

/** The hanging rod's seat (tests/support/motion-fixtures hangingRodDesign) through its design swing. */
export function swingTrace(opts: {
  rateHz: number;
  durationS: number;
  phaseRad?: number;
  biasRadS?: number;
  noiseRadS?: number;
  seed?: number;
}): SensorTrace {
  return seatSwingTrace({
    ...opts,
    amplitudeRad: SWING.amplitudeRad,
    periodS: SWING.periodS,
    seatM: [0, -SWING.seatM],
  });
}
