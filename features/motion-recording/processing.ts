/**
 * From what the phone's sensors gave during a recording to the record the inspection keeps: the gyro
 * axis normal to the plane of motion, the body's rate turned into the joint's own rate, cut to whole
 * cycles, the gyro's bias taken off, and the seat's accelerations in the rider's axes. Pure.
 *
 * Conventions (see features/motion-recording/README.md): the phone's axes are x to the right of the
 * screen, y to its top edge, z out of the screen; rates are right-handed about them in rad/s; the
 * accelerometer reads specific force in g (a phone lying face up reads z = +1).
 */
import type { DesignData } from '@/features/loads/design-schema';
import type { Reading } from '@/features/records/schema';
import {
  MAX_MOTION_SAMPLES,
  type MotionRecord,
  type PhoneAxis,
  motionRecordSchema,
  phoneAxes,
  zeroCrossings,
} from '@/features/records/motion-record-schema';

/** The recording as it came, column by column; times in s from the start. */
export type SensorTrace = {
  timeS: number[];
  rate: Record<PhoneAxis, number[]>;
  /** Specific force in g; empty when the phone gave none. */
  force: Record<PhoneAxis, number[]>;
};

export function emptyTrace(): SensorTrace {
  return { timeS: [], rate: { x: [], y: [], z: [] }, force: { x: [], y: [], z: [] } };
}

/** One sensor reading: when, the rate about each axis (rad/s) and the specific force (g), if any. */
export type SensorSample = {
  tS: number;
  rate: [number, number, number];
  force: [number, number, number] | null;
};

/**
 * Appends a reading; a reading not after the last one (browsers repeat timestamps) or with a value that
 * is not a finite number is left out, so the trace is always a valid record's raw material.
 */
export function appendSample(trace: SensorTrace, s: SensorSample): boolean {
  const n = trace.timeS.length;
  if (!Number.isFinite(s.tS) || (n > 0 && !(s.tS > trace.timeS[n - 1]))) return false;
  if (!s.rate.every(Number.isFinite)) return false;
  const force = s.force && s.force.every(Number.isFinite) ? s.force : null;
  // Accelerations are kept for every reading or for none, so the columns stay the same length.
  if (n > 0 && (force === null) !== (trace.force.x.length === 0)) return false;
  trace.timeS.push(s.tS);
  phoneAxes.forEach((a, i) => trace.rate[a].push(s.rate[i]));
  if (force) phoneAxes.forEach((a, i) => trace.force[a].push(force[i]));
  return true;
}

/** The axis with the largest RMS rate: the one normal to the plane of motion, for a phone held as told. */
export function chooseAxis(trace: SensorTrace): PhoneAxis {
  let best: PhoneAxis = 'z';
  let bestRms = -1;
  for (const a of phoneAxes) {
    const w = trace.rate[a];
    const rms = Math.sqrt(w.reduce((s, v) => s + v * v, 0) / Math.max(1, w.length));
    if (rms > bestRms) {
      best = a;
      bestRms = rms;
    }
  }
  return best;
}

/**
 * Which way the phone's rate counts against the design's (+ counter-clockwise as drawn). On an arm the
 * screen faces the side the design is drawn from, so the two agree. In a seat the screen faces the
 * rider's right: for a rider drawn facing the drawing's +x ('cw', the default) that is away from the
 * drawing, so the sign flips; for a rider drawn facing −x ('ccw') it is toward it.
 */
export function defaultSign(design: DesignData | null, seat: number | null): 1 | -1 {
  if (seat === null) return 1;
  return design?.seats[seat]?.facing === 'ccw' ? 1 : -1;
}

/**
 * The steady rate (rad/s) of everything below `joint`, which the phone's gyro also feels: the sum of the
 * parent joints' design speeds (or their latest speed readings). Null when a parent swings or moves
 * otherwise: a phone on the body alone cannot tell the two motions apart.
 */
export function parentRateOf(
  design: DesignData,
  joint: number,
  readings: readonly Reading[] = [],
): number | null {
  let sum = 0;
  for (let i = 0; i < joint; i++) {
    const m = design.motion.find((x) => x.joint === i);
    if (!m || m.kind === 'fixed') continue;
    if (m.kind !== 'constant') return null;
    const speed = readings.filter((r) => r.kind === 'speed' && r.joint === i).at(-1);
    const rpm = m.rpm ?? 0;
    sum += speed ? Math.sign(rpm || 1) * Math.abs(speed.valueSI) : (rpm * 2 * Math.PI) / 60;
  }
  return sum;
}

/**
 * Which joint's motion a phone on `body` records. It feels the body's rate over the ground, the sum of
 * the rates of joints 0…body. A joint held fixed adds nothing, so on a fixed body (a gondola locked to its
 * arm) the record stands for the nearest joint below that moves; the steady rates below that joint are
 * taken off (parentRateOf), or, when one of them swings, the record cannot stand for a joint at all.
 */
export function attributeJoint(
  design: DesignData,
  body: number,
  readings: readonly Reading[] = [],
): { joint: number; parentRateRadS: number | null } {
  let joint = body;
  const fixed = (i: number) => {
    const m = design.motion.find((x) => x.joint === i);
    return !m || m.kind === 'fixed';
  };
  while (joint > 0 && fixed(joint)) joint--;
  return { joint, parentRateRadS: parentRateOf(design, joint, readings) };
}

export type TrimChoice = {
  joint: number;
  seat: number | null;
  axis: PhoneAxis;
  sign: 1 | -1;
  /** From parentRateOf: null when the parent's rate cannot be taken off. */
  parentRateRadS: number | null;
  /** Which of the whole cycles found to keep (0-based, inclusive); all of them when absent. */
  keep?: { first: number; last: number };
};

export type Trimmed =
  | {
      ok: true;
      record: MotionRecord;
      cyclesFound: number;
      turning: boolean;
      keep: { first: number; last: number };
    }
  | { ok: false; message: string };

const round = (v: number, step: number) => Math.round(v / step) * step;

/** Cycle boundaries (sample indices) of a rate: rising zero crossings of a swing, whole turns otherwise. */
function boundariesOf(timeS: readonly number[], rate: readonly number[]): { turning: boolean; at: number[] } {
  const rising = zeroCrossings(rate)
    .filter((c) => c.rising)
    .map((c) => c.index);
  if (rising.length >= 2) return { turning: false, at: rising };
  const at = [0];
  let angle = 0;
  for (let k = 1; k < rate.length; k++) {
    angle += 0.5 * (rate[k] + rate[k - 1]) * (timeS[k] - timeS[k - 1]);
    if (Math.abs(angle) >= 2 * Math.PI * at.length) at.push(k);
  }
  return { turning: true, at };
}

const meanOver = (v: readonly number[], from: number, to: number) => {
  let s = 0;
  for (let k = from; k < to; k++) s += v[k];
  return s / Math.max(1, to - from);
};

/**
 * Cuts the recording to whole cycles and makes the record. A swing's cycles run between rising zero
 * crossings, found twice: once on the raw rate and once after the bias measured over the first cut is
 * taken off, so that the bias cannot move the cut. A turning joint's cycles are whole turns; its bias
 * cannot be told from its speed and is left in (a fraction of a degree a second on typical phones, from
 * memory).
 */
export function trimToCycles(
  trace: SensorTrace,
  choice: TrimChoice,
  recordedAt: string,
  id: string,
): Trimmed {
  const n = trace.timeS.length;
  if (n < 4) return { ok: false, message: 'Nothing was recorded: no motion readings came from the phone.' };
  const parent = choice.parentRateRadS ?? 0;
  const body = trace.rate[choice.axis].map((w) => choice.sign * w - parent);
  let found = boundariesOf(trace.timeS, body);
  let bias = 0;
  if (!found.turning) {
    bias = meanOver(body, found.at[0], found.at[found.at.length - 1]);
    const again = boundariesOf(
      trace.timeS,
      body.map((w) => w - bias),
    );
    if (!again.turning) {
      found = again;
      bias = meanOver(body, found.at[0], found.at[found.at.length - 1]);
    }
  }
  const cyclesFound = found.at.length - 1;
  if (cyclesFound < 1)
    return {
      ok: false,
      message:
        'Less than one whole cycle was recorded. Record again for at least one full swing or turn (two or three are better).',
    };
  const first = Math.max(0, Math.min(choice.keep?.first ?? 0, cyclesFound - 1));
  const last = Math.max(first, Math.min(choice.keep?.last ?? cyclesFound - 1, cyclesFound - 1));
  const from = found.at[first];
  const to = found.at[last + 1];
  if (to - from + 1 > MAX_MOTION_SAMPLES)
    return {
      ok: false,
      message: `The cycles kept hold more than ${MAX_MOTION_SAMPLES} samples: keep fewer cycles.`,
    };
  const t0 = trace.timeS[from];
  const idx = Array.from({ length: to - from + 1 }, (_, k) => from + k);
  const timeS = idx.map((k) => round(trace.timeS[k] - t0, 1e-5));
  const span = timeS[timeS.length - 1];
  const withForce = choice.seat !== null && choice.axis === 'z' && trace.force.x.length === n;
  const raw = {
    id,
    joint: choice.joint,
    seat: choice.seat,
    axis: choice.axis,
    sign: choice.sign,
    sampleRateHz: (timeS.length - 1) / span,
    timeS,
    rateRadS: idx.map((k) => round(body[k] - bias, 1e-6)),
    // In a seat the screen faces the rider's right with its top toward the head: the phone's x is then
    // the rider's chest-ward x and its y the spine-ward z (features/motion-recording/README.md).
    ...(withForce
      ? {
          gxG: idx.map((k) => round(trace.force.x[k], 1e-5)),
          gzG: idx.map((k) => round(trace.force.y[k], 1e-5)),
        }
      : {}),
    recordedAt,
    cycles: last - first + 1,
    trimmedFrom: { startS: trace.timeS[from], endS: trace.timeS[to], rawDurationS: trace.timeS[n - 1] },
    biasRadS: bias,
    parentRateRadS: choice.parentRateRadS,
  };
  const parsed = motionRecordSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, message: parsed.error.issues.map((i) => i.message).join(' · ') };
  return { ok: true, record: parsed.data, cyclesFound, turning: found.turning, keep: { first, last } };
}
