/**
 * Free joints: pins with no drive torque. Their motion is not given but follows from the chain's
 * equations of motion, M(q)·q̈ + h(q, q̇) = τ with τ = 0 on the free joints, while every other joint
 * follows its profile. Integrated from the state at t = 0 with Dormand–Prince 5(4) under error control
 * (dopri5.ts; rtol = atol = 1e-9 on angles in rad and rates in rad/s), kept step by step with its dense
 * output so the cycle can be sampled anywhere. At each sample the free accelerations are recomputed from
 * the dynamics, so the solver finds the free joints' torque 0 to round-off.
 *
 * Period (return time) of a free joint:
 *  - released from rest: the time until it is next at rest on the same side, moving off the same way
 *    (its rate crosses zero in the direction it first moved);
 *  - started with a rate: the time until its angle is back at the start (mod 2π) with the rate's sign:
 *    one swing period, or one full turn for a joint going over the top.
 * In a chain whose other joints move, this is the free joint's own return, not a period of the whole.
 */
import type { Chain } from '@/features/loads/engine/chain';
import type { CycleWarning } from '@/features/loads/engine/cycle-types';
import { type DenseSegment, Dopri5, denseState, denseValue } from '@/features/loads/engine/dopri5';
import {
  type FreeAccelerations,
  FreeMotionError,
  freeAccelerations,
  measuredSpanS,
  prescribedMotion,
} from '@/features/loads/engine/free-dynamics';
import { type MotionProfile, sampleProfile } from '@/features/loads/engine/profiles';

export { FreeMotionError } from '@/features/loads/engine/free-dynamics';

export const FREE_MOTION_RTOL = 1e-9;
export const FREE_MOTION_ATOL = 1e-9;
/** How long to integrate looking for a period beyond the cycle (simulated time). */
export const FREE_PERIOD_SEARCH_S = 300;
const MAX_STEPS = 200_000;
/** Below this rate (rad/s) a joint released from rest has not started to move. */
const REST_RATE_RAD_S = 1e-9;
const TWO_PI = 2 * Math.PI;

export type FreeMotionOptions = { searchS?: number; rtol?: number; atol?: number };

export type FreeMotion = {
  /** The free joints, in chain order. */
  free: number[];
  /** Per joint: the period found (s), null where none was found or the joint is not free. */
  periodS: (number | null)[];
  /** Per joint: true when the period is one full turn over the top. */
  turns: boolean[];
  /** The longest period found: the cycle when nothing else gives one. */
  cycleS: number | null;
  /** Simulated time integrated. */
  endS: number;
  steps: number;
  rejected: number;
  evaluations: number;
  /** Fills every joint's angle, rate and acceleration at the given times (sample-major, stride n). */
  sample(times: Float64Array, q: Float64Array, qd: Float64Array, qdd: Float64Array): void;
  /** The period of each free joint as the person sees it, for a cycle of the given length. */
  warnings(durationS: number): CycleWarning[];
};

type Watch = {
  joint: number;
  start: number;
  dir: number;
  fromRest: boolean;
  at: number | null;
  turn: boolean;
};

/**
 * Integrates the free joints from t = 0 to at least `untilS` (the cycle, when known), and on until each
 * free joint's period is found or `searchS` (default 300 s) has passed; never past a measured record.
 * Throws FreeMotionError when a free joint cannot be integrated, or when no cycle length is known and no
 * period is found.
 */
export function integrateFreeMotion(
  chain: Chain,
  profiles: readonly MotionProfile[],
  untilS: number | null,
  options: FreeMotionOptions = {},
): FreeMotion {
  const n = chain.size;
  const free: number[] = [];
  const y0: number[] = [];
  profiles.forEach((p, i) => {
    if (p.kind === 'free') free.push(i);
  });
  if (free.length === 0) throw new Error('integrateFreeMotion needs a free joint');
  const nf = free.length;
  for (const j of free) y0.push((profiles[j] as Extract<MotionProfile, { kind: 'free' }>).angleRad);
  for (const j of free) y0.push((profiles[j] as Extract<MotionProfile, { kind: 'free' }>).rateRadS ?? 0);

  const recordEnd = measuredSpanS(profiles);
  if (untilS !== null && untilS > recordEnd * (1 + 1e-9))
    throw new FreeMotionError(`The cycle is longer than the measured record (${recordEnd} s)`, ['durationS']);
  const searchEnd = Math.min(Math.max(untilS ?? 0, options.searchS ?? FREE_PERIOD_SEARCH_S), recordEnd);
  const mustReach = untilS ?? 0;

  const prescribed = prescribedMotion(profiles);
  const accelerate = freeAccelerations(chain, free);
  const Q = new Float64Array(n);
  const QD = new Float64Array(n);
  const QDD = new Float64Array(n);
  const rhs = (t: number, y: Float64Array, dy: Float64Array) => {
    prescribed(t, Q, QD, QDD);
    for (let k = 0; k < nf; k++) {
      Q[free[k]] = y[k];
      QD[free[k]] = y[nf + k];
    }
    accelerate(Q, QD, QDD);
    for (let k = 0; k < nf; k++) {
      dy[k] = y[nf + k];
      dy[nf + k] = QDD[free[k]];
    }
  };

  const watches: Watch[] = free.map((joint, k) => {
    const rate = y0[nf + k];
    const fromRest = Math.abs(rate) <= REST_RATE_RAD_S;
    return { joint, start: y0[k], dir: fromRest ? 0 : Math.sign(rate), fromRest, at: null, turn: false };
  });
  const stepper = new Dopri5(rhs, 0, y0, {
    rtol: options.rtol ?? FREE_MOTION_RTOL,
    atol: options.atol ?? FREE_MOTION_ATOL,
    hMax: stableStepS(rhs, y0, nf),
  });
  const segments: DenseSegment[] = [];
  const allFound = () => watches.every((w) => w.at !== null);
  try {
    while (stepper.t < searchEnd && (stepper.t < mustReach || !allFound())) {
      if (stepper.steps >= MAX_STEPS) {
        if (stepper.t >= mustReach) break;
        throw new FreeMotionError(
          `The free motion needs more than ${MAX_STEPS.toLocaleString('en')} integration steps before ` +
            `${mustReach} s: shorten the cycle or check the bodies`,
          ['durationS'],
        );
      }
      const seg = stepper.step(searchEnd);
      segments.push(seg);
      watches.forEach((w, k) => watchSegment(w, k, nf, seg));
    }
  } catch (error) {
    if (error instanceof FreeMotionError) throw error;
    throw new FreeMotionError(`The free motion could not be integrated (${(error as Error).message})`, [
      'profiles',
      free[0],
    ]);
  }

  const periodS: (number | null)[] = profiles.map(() => null);
  const turns = profiles.map(() => false);
  for (const w of watches) {
    periodS[w.joint] = w.at;
    turns[w.joint] = w.turn;
  }
  const found = watches.flatMap((w) => (w.at === null ? [] : [w.at]));
  const cycleS = found.length ? Math.max(...found) : null;
  const endS = stepper.t;
  if (untilS === null && cycleS === null) {
    const w = watches[0];
    throw new FreeMotionError(
      `No cycle length: ${chain.names[w.joint]} is free and ${reasonNone(w)} over ` +
        `${fmtS(endS)} s of integration. Give durationS`,
      ['durationS'],
    );
  }
  return {
    free,
    periodS,
    turns,
    cycleS,
    endS,
    steps: stepper.steps,
    rejected: stepper.rejected,
    evaluations: stepper.evaluations,
    sample: denseSampler(profiles, free, segments, endS, accelerate, n),
    warnings: (durationS) => freeWarnings(chain.names, watches, endS, durationS),
  };
}

/**
 * Samples the whole chain: prescribed joints from their profiles, free ones from the dense output, and
 * the free accelerations recomputed from the dynamics there (so the free torque is 0 to round-off).
 */
function denseSampler(
  profiles: readonly MotionProfile[],
  free: readonly number[],
  segments: readonly DenseSegment[],
  endS: number,
  accelerate: FreeAccelerations,
  n: number,
): FreeMotion['sample'] {
  const nf = free.length;
  const starts = new Float64Array(segments.map((s) => s.t0));
  const Q = new Float64Array(n);
  const QD = new Float64Array(n);
  const QDD = new Float64Array(n);
  return (times, q, qd, qdd) => {
    profiles.forEach((p, i) => {
      if (p.kind !== 'free') sampleProfile(p, times, i, n, q, qd, qdd);
    });
    const y = new Float64Array(2 * nf);
    for (let k = 0; k < times.length; k++) {
      let t = times[k];
      if (t > endS) {
        if (t > endS * (1 + 1e-9) + 1e-12) throw new Error(`Free motion sampled at ${t} s, past ${endS} s`);
        t = endS;
      }
      denseState(segments[segmentAt(starts, t)], t, y);
      const o = k * n;
      for (let i = 0; i < n; i++) {
        Q[i] = q[o + i];
        QD[i] = qd[o + i];
        QDD[i] = qdd[o + i];
      }
      for (let f = 0; f < nf; f++) {
        Q[free[f]] = y[f];
        QD[free[f]] = y[nf + f];
      }
      accelerate(Q, QD, QDD);
      for (const j of free) {
        q[o + j] = Q[j];
        qd[o + j] = QD[j];
        qdd[o + j] = QDD[j];
      }
    }
  };
}

/** Each free joint's period as the person reads it, for a cycle of the given length. */
function freeWarnings(
  names: readonly string[],
  watches: readonly Watch[],
  endS: number,
  durationS: number,
): CycleWarning[] {
  return watches.flatMap((w): CycleWarning[] => {
    const name = names[w.joint];
    if (w.at === null)
      return [
        {
          code: 'free-period-none',
          level: 'warning',
          joint: w.joint,
          message: `Free joint (${name}): ${reasonNone(w)} over ${fmtS(endS)} s of integration, so no period is reported`,
        },
      ];
    const list: CycleWarning[] = [
      {
        code: 'free-period',
        level: 'info',
        joint: w.joint,
        message: w.turn
          ? `Free rotation (${name}): one turn takes ${fmtS(w.at)} s, found by integration`
          : `Free swing (${name}): period ${fmtS(w.at)} s found by integration`,
      },
    ];
    if (durationS < w.at * (1 - 1e-6))
      list.push({
        code: 'free-cycle-short',
        level: 'warning',
        joint: w.joint,
        message: `The cycle analysed (${fmtS(durationS)} s) is shorter than the free ${w.turn ? 'turn' : 'swing'} of ${name} (${fmtS(w.at)} s): its peaks may be missed`,
      });
    return list;
  });
}

/**
 * The largest step kept stable near the start: h·ω ≤ 0.5 for the fastest free joint's own frequency
 * ω = √|∂q̈_k/∂q_k| (by a finite difference). Error control alone would let motion smaller than atol,
 * e.g. round-off around a joint hanging at rest, grow under steps too long for it.
 */
function stableStepS(rhs: (t: number, y: Float64Array, dy: Float64Array) => void, y0: number[], nf: number) {
  const y = Float64Array.from(y0);
  const base = new Float64Array(2 * nf);
  const bumped = new Float64Array(2 * nf);
  rhs(0, y, base);
  let stiffest = 0;
  for (let k = 0; k < nf; k++) {
    const delta = 1e-6;
    y[k] += delta;
    rhs(0, y, bumped);
    y[k] -= delta;
    stiffest = Math.max(stiffest, Math.abs(bumped[nf + k] - base[nf + k]) / delta);
  }
  return Math.min(1, 0.5 / Math.sqrt(stiffest || 1e-12));
}

function reasonNone(w: Watch): string {
  return w.fromRest && w.dir === 0 ? 'stays at rest' : 'does not come back to its start';
}

/** Three significant figures, as a period is read. */
function fmtS(seconds: number): string {
  return String(Number(seconds.toPrecision(3)));
}

/** Index of the segment holding t: the last one starting at or before it. */
function segmentAt(starts: Float64Array, t: number): number {
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid] <= t) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** Looks for the joint's return within one accepted step and records the time when it is there. */
function watchSegment(w: Watch, k: number, nf: number, seg: DenseSegment): void {
  if (w.at !== null) return;
  const dim = 2 * nf;
  const a = seg.t0;
  const b = seg.t0 + seg.h;
  const value = (i: number, t: number) => denseValue(seg, t, i, dim);
  if (w.fromRest) {
    const v0 = value(nf + k, a);
    const v1 = value(nf + k, b);
    if (w.dir === 0) {
      // The first clear motion says which way it moves off; its return is the next time it stops
      // and moves off that way again.
      if (Math.abs(v1) > REST_RATE_RAD_S) w.dir = Math.sign(v1);
      return;
    }
    if (w.dir * v0 < 0 && w.dir * v1 >= 0) w.at = root((t) => value(nf + k, t), a, b);
    return;
  }
  const u0 = (value(k, a) - w.start) / TWO_PI;
  const u1 = (value(k, b) - w.start) / TWO_PI;
  const level = w.dir > 0 ? Math.floor(u1) : Math.ceil(u1);
  if (w.dir > 0 ? level > u0 : level < u0) {
    const target = w.start + level * TWO_PI;
    w.at = root((t) => value(k, t) - target, a, b);
    w.turn = level !== 0;
  }
}

/** Bisection for a sign change of f on [a, b] (f(b) may be exactly 0). */
function root(f: (t: number) => number, a: number, b: number): number {
  let lo = a;
  let hi = b;
  const fLo = f(lo);
  for (let it = 0; it < 80 && hi - lo > 1e-15 * Math.max(1, hi); it++) {
    const mid = (lo + hi) / 2;
    const fm = f(mid);
    if (fm === 0) return mid;
    if (Math.sign(fm) === Math.sign(fLo)) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
