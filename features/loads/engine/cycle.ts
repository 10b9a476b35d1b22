import { createChain, createChainWork, solveInto, STANDARD_GRAVITY_MS2 } from '@/features/loads/engine/chain';
import { evaluateEnvelope } from '@/features/loads/engine/cycle-envelope';
import type {
  CycleInput,
  CycleResult,
  Extremes,
  JointHistory,
  PeakAt,
  Seat,
  SeatHistory,
} from '@/features/loads/engine/cycle-types';
import { DEFAULT_NEAR_MARGIN, worstStatus } from '@/features/loads/engine/envelope';
import { integrateFreeMotion } from '@/features/loads/engine/free-motion';
import { measuredCycleSamples, measuredWarnings } from '@/features/loads/engine/conditioning/measured';
import { defaultCycleDurationS, sampleProfile } from '@/features/loads/engine/profiles';

export const DEFAULT_CYCLE_SAMPLES = 360;

function extremesOf(values: Float64Array): Extremes {
  let min = Infinity;
  let max = -Infinity;
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return { min, max, range: max - min };
}

function indexOfMaxAbs(values: Float64Array): number {
  let best = 0;
  let bestAbs = -1;
  for (let k = 0; k < values.length; k++) {
    const a = Math.abs(values[k]);
    if (a > bestAbs) {
      bestAbs = a;
      best = k;
    }
  }
  return best;
}

/** Whole-cycle analysis: sample every profile, solve each instant, summarise, then evaluate limits. */
export function analyseCycle(input: CycleInput): CycleResult {
  const gravity = input.gravityMS2 ?? STANDARD_GRAVITY_MS2;
  const chain = createChain(input.bodies, gravity);
  const n = chain.size;
  if (input.profiles.length !== n) throw new Error(`profiles needs ${n} entries, one per joint`);
  const given = input.durationS ?? defaultCycleDurationS(input.profiles);
  // Free joints are integrated first: with no other cycle length, the cycle is one free period.
  const freeMotion = input.profiles.some((p) => p.kind === 'free')
    ? integrateFreeMotion(chain, input.profiles, given)
    : null;
  const duration = given ?? freeMotion?.cycleS ?? null;
  if (duration === null || !(duration > 0))
    throw new Error('durationS is needed: no profile has a cycle length');
  // A measured record is sampled as densely as it was recorded (capped), so no peak falls between samples.
  const count = input.samples ?? measuredCycleSamples(input.profiles, duration) ?? DEFAULT_CYCLE_SAMPLES;
  if (!Number.isInteger(count) || count < 2) throw new Error('samples must be an integer ≥ 2');

  const times = new Float64Array(count);
  const step = duration / (count - 1);
  for (let k = 0; k < count; k++) times[k] = k * step;

  const q = new Float64Array(count * n);
  const qd = new Float64Array(count * n);
  const qdd = new Float64Array(count * n);
  if (freeMotion) freeMotion.sample(times, q, qd, qdd);
  else input.profiles.forEach((p, i) => sampleProfile(p, times, i, n, q, qd, qdd));

  const fx = Array.from({ length: n }, () => new Float64Array(count));
  const fy = Array.from({ length: n }, () => new Float64Array(count));
  const along = Array.from({ length: n }, () => new Float64Array(count));
  const across = Array.from({ length: n }, () => new Float64Array(count));
  const mag = Array.from({ length: n }, () => new Float64Array(count));
  const tau = Array.from({ length: n }, () => new Float64Array(count));

  const seats = input.seats ?? [];
  const seatCount = seats.length;
  const { seatBody, seatX, seatY, seatSpineC, seatSpineS, seatTurn } = seatFrames(seats, n);
  const gx = Array.from({ length: seatCount }, () => new Float64Array(count));
  const gz = Array.from({ length: seatCount }, () => new Float64Array(count));
  // Rider accelerations are reported in standard g whatever gravity the analysis uses.
  const g0 = STANDARD_GRAVITY_MS2;
  const gravX = chain.gravityX;
  const gravY = chain.gravityY;

  const work = createChainWork(n);
  for (let k = 0; k < count; k++) {
    solveInto(chain, q, qd, qdd, k * n, work);
    for (let i = 0; i < n; i++) {
      const x = work.forceX[i];
      const y = work.forceY[i];
      const c = work.cos[i];
      const s = work.sin[i];
      fx[i][k] = x;
      fy[i][k] = y;
      along[i][k] = x * c + y * s;
      across[i][k] = -x * s + y * c;
      mag[i][k] = Math.sqrt(x * x + y * y);
      tau[i][k] = work.torque[i];
    }
    for (let j = 0; j < seatCount; j++) {
      const b = seatBody[j];
      const c = work.cos[b];
      const s = work.sin[b];
      const rx = c * seatX[j] - s * seatY[j];
      const ry = s * seatX[j] + c * seatY[j];
      const om2 = work.omega[b] * work.omega[b];
      const al = work.alpha[b];
      // Specific force (a − g⃗)/g0: what the seat pushes on the rider with.
      const sfx = (work.pivotAX[b] - al * ry - om2 * rx - gravX) / g0;
      const sfy = (work.pivotAY[b] + al * rx - om2 * ry - gravY) / g0;
      const zx = c * seatSpineC[j] - s * seatSpineS[j];
      const zy = s * seatSpineC[j] + c * seatSpineS[j];
      const turn = seatTurn[j];
      // Chest axis: the spine turned a quarter turn, clockwise (turn = −1) or counter-clockwise (+1).
      const xx = -turn * zy;
      const xy = turn * zx;
      gx[j][k] = sfx * xx + sfy * xy;
      gz[j][k] = sfx * zx + sfy * zy;
    }
  }

  // A free pin carries no torque by definition. What inverse dynamics returns there is the integration's
  // round-off (kept as the joint's residual, a check on the dynamics); the result reports the 0 itself.
  const freeResidual = new Map<number, number>();
  freeMotion?.free.forEach((i) => {
    let worst = 0;
    for (let k = 0; k < count; k++) worst = Math.max(worst, Math.abs(tau[i][k]));
    freeResidual.set(i, worst);
    tau[i].fill(0);
  });
  const forces = { fx, fy, along, across, mag, tau };
  const joints = Array.from({ length: n }, (_, i) =>
    jointHistory(i, chain.names[i], times, q, qd, qdd, forces),
  );
  freeMotion?.free.forEach((i) => {
    const period = freeMotion.periodS[i];
    joints[i].freePeriodS = period;
    joints[i].freeTorqueResidualNm = freeResidual.get(i) ?? 0;
    // A cycle of one whole free turn spans 2π up to round-off: it turns, it does not swing.
    if (freeMotion.turns[i] && period !== null && duration >= period * (1 - 1e-9))
      joints[i].amplitudeRad = null;
  });

  const seatHistories: SeatHistory[] = seats.map((s, j) => {
    const withTimes = (values: Float64Array) => {
      const e = extremesOf(values);
      return { ...e, minAtS: times[values.indexOf(e.min)], maxAtS: times[values.indexOf(e.max)] };
    };
    return {
      name: s.name,
      body: s.body,
      gx: gx[j],
      gz: gz[j],
      extremes: { gx: withTimes(gx[j]), gz: withTimes(gz[j]) },
    };
  });

  const margin = input.limits?.nearMargin ?? DEFAULT_NEAR_MARGIN;
  const { envelope, pins } = evaluateEnvelope(joints, seatHistories, input.limits, margin);
  return {
    gravityMS2: gravity,
    samples: count,
    durationS: duration,
    timeS: times,
    joints,
    seats: seatHistories,
    pins,
    envelope,
    status: worstStatus(envelope.map((e) => e.status)),
    nearMargin: margin,
    warnings: [...measuredWarnings(input.profiles), ...(freeMotion ? freeMotion.warnings(duration) : [])],
  };
}

type JointForces = Record<'fx' | 'fy' | 'along' | 'across' | 'mag' | 'tau', Float64Array[]>;

/** One joint's history over the cycle from the sampled motion (all joints, per sample) and its forces. */
function jointHistory(
  i: number,
  name: string,
  times: Float64Array,
  q: Float64Array,
  qd: Float64Array,
  qdd: Float64Array,
  { fx, fy, along, across, mag, tau }: JointForces,
): JointHistory {
  const count = times.length;
  const n = q.length / count;
  const angle = new Float64Array(count);
  const rate = new Float64Array(count);
  const acc = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    angle[k] = q[k * n + i];
    rate[k] = qd[k * n + i];
    acc[k] = qdd[k * n + i];
  }
  const where = (index: number, value: number): PeakAt => ({
    value,
    index,
    timeS: times[index],
    angleRad: angle[index],
    armAngleRad: q[index * n],
  });
  const pf = indexOfMaxAbs(mag[i]);
  const pt = indexOfMaxAbs(tau[i]);
  const angleExtremes = extremesOf(angle);
  return {
    name,
    angleRad: angle,
    rateRadS: rate,
    accelRadS2: acc,
    forceXN: fx[i],
    forceYN: fy[i],
    forceAlongN: along[i],
    forceAcrossN: across[i],
    forceMagnitudeN: mag[i],
    torqueNm: tau[i],
    peakForce: {
      ...where(pf, mag[i][pf]),
      forceN: [fx[i][pf], fy[i][pf]],
      forceBodyN: [along[i][pf], across[i][pf]],
    },
    peakTorque: where(pt, tau[i][pt]),
    extremes: {
      magnitudeN: extremesOf(mag[i]),
      xN: extremesOf(fx[i]),
      yN: extremesOf(fy[i]),
      alongN: extremesOf(along[i]),
      acrossN: extremesOf(across[i]),
      torqueNm: extremesOf(tau[i]),
    },
    peakRateRadS: Math.abs(rate[indexOfMaxAbs(rate)]),
    amplitudeRad: angleExtremes.range < 2 * Math.PI ? angleExtremes.range / 2 : null,
  };
}

/** Each seat's place and spine in its body's frame, as arrays the sample loop reads. */
function seatFrames(seats: readonly Seat[], n: number) {
  for (const s of seats) if (s.body < 0 || s.body >= n) throw new Error(`Seat ${s.name} is on no body`);
  return {
    seatBody: Int32Array.from(seats, (s) => s.body),
    seatX: Float64Array.from(seats, (s) => s.positionM[0]),
    seatY: Float64Array.from(seats, (s) => s.positionM[1]),
    // The spine's direction in the body frame, so each sample turns it with the body's own cos/sin.
    seatSpineC: Float64Array.from(seats, (s) => Math.cos(s.spineAngleRad)),
    seatSpineS: Float64Array.from(seats, (s) => Math.sin(s.spineAngleRad)),
    seatTurn: Float64Array.from(seats, (s) => (s.facing === 'ccw' ? 1 : -1)),
  };
}

type Json<T> = T extends Float64Array
  ? number[]
  : T extends (infer U)[]
    ? Json<U>[]
    : T extends object
      ? { [K in keyof T]: Json<T[K]> }
      : T;

export type CycleResultJson = Json<CycleResult>;

/** The cycle result with typed arrays turned into plain arrays, ready for JSON. */
export function cycleResultToJson(result: CycleResult): CycleResultJson {
  const plain = (value: unknown): unknown => {
    if (value instanceof Float64Array) return Array.from(value);
    if (Array.isArray(value)) return value.map(plain);
    if (value !== null && typeof value === 'object')
      return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, plain(v)]));
    return value;
  };
  return plain(result) as CycleResultJson;
}
