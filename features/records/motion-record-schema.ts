/**
 * A ride cycle recorded with the phone's motion sensors, as it travels with the inspection: the joint's
 * rate (already turned into the joint's own rate, bias removed, trimmed to whole cycles) and, when the
 * phone rode in a seat, the rider accelerations in the rider's axes. The phone and the server check a
 * record with this one schema, so a record either side accepts is one the load check can use.
 *
 * Units: s, rad/s (+ counter-clockwise as the design data is drawn), g (specific force: a seated rider at
 * rest reads Gz = +1).
 */
import { z } from 'zod';

/** Enough to hold a few minutes of a slow ride at 100 Hz; a record is a few whole cycles, not a day. */
export const MAX_MOTION_SAMPLES = 24_000;
export const MAX_MOTION_RECORDS = 4;
/** Below this the sampled rate misses the motion's fast parts (and the smoothing has nothing to work on). */
export const MIN_SAMPLE_RATE_HZ = 20;
/** Fewer samples per cycle than this cannot describe the cycle's shape. */
export const MIN_SAMPLES_PER_CYCLE = 16;

const num = () =>
  z.number({ error: (i) => (i.input === undefined ? 'Required' : 'Must be a finite number') });
const samples = () => z.array(num()).max(MAX_MOTION_SAMPLES, `At most ${MAX_MOTION_SAMPLES} samples`);

/** The phone's axes: x to the right of the screen, y to its top edge, z out of the screen. */
export const phoneAxes = ['x', 'y', 'z'] as const;
export type PhoneAxis = (typeof phoneAxes)[number];

export const motionRecordSchema = z
  .object({
    id: z.uuid({ error: 'Must be a UUID' }),
    /** The joint whose body the phone was fixed to (0 = the ground pivot). */
    joint: z.int().min(0).max(9),
    /** The design's seat (index into its seats) the phone was carried in, if it was. */
    seat: z.int().min(0).max(199).nullable(),
    /** The gyro axis that was normal to the plane of motion, and +1/−1 for the way the screen faced. */
    axis: z.enum(phoneAxes),
    sign: z.union([z.literal(1), z.literal(-1)]),
    sampleRateHz: num().positive(),
    timeS: samples(),
    /** The joint's rate relative to its parent. */
    rateRadS: samples(),
    /** Rider accelerations (chest-ward x, spine-ward z), present when the phone rode in a seat. */
    gxG: samples().optional(),
    gzG: samples().optional(),
    recordedAt: z.iso.datetime({ offset: true, error: 'Must be an ISO date-time' }),
    /** Whole cycles kept, and where in the raw recording they were cut from. */
    cycles: z.int().min(1, 'Must hold at least one whole cycle'),
    trimmedFrom: z.object({ startS: num().min(0), endS: num().min(0), rawDurationS: num().positive() }),
    /** Mean gyro rate removed over the whole cycles (0 for a turning joint, where it cannot be told). */
    biasRadS: num(),
    /**
     * The parent's steady rate taken off the body's measured rate (0 at the ground joint); null when the
     * parent does not turn steadily, so the record is the body's rate over the ground and cannot stand
     * for the joint's motion (its accelerations still count).
     */
    parentRateRadS: num().nullable(),
  })
  .superRefine((r, ctx) => {
    const n = r.timeS.length;
    const issue = (path: (string | number)[], message: string) =>
      ctx.addIssue({ code: 'custom', path, message });
    if (r.rateRadS.length !== n) issue(['rateRadS'], 'Must have one value per time');
    if (r.gxG && r.gxG.length !== n) issue(['gxG'], 'Must have one value per time');
    if (r.gzG && r.gzG.length !== n) issue(['gzG'], 'Must have one value per time');
    if ((r.gxG === undefined) !== (r.gzG === undefined)) issue(['gzG'], 'Give both rider axes or neither');
    if (r.seat === null && r.gxG) issue(['seat'], 'Rider accelerations need the seat they were taken in');
    if (n < 2 * MIN_SAMPLES_PER_CYCLE) {
      issue(['timeS'], `Too short: at least ${2 * MIN_SAMPLES_PER_CYCLE} samples`);
      return;
    }
    for (let k = 1; k < n; k++)
      if (!(r.timeS[k] > r.timeS[k - 1])) {
        issue(['timeS', k], 'Times must increase');
        return;
      }
    const span = r.timeS[n - 1] - r.timeS[0];
    const rate = (n - 1) / span;
    if (rate < MIN_SAMPLE_RATE_HZ)
      issue(
        ['sampleRateHz'],
        `Sampled too slowly: ${rate.toPrecision(3)} Hz; at least ${MIN_SAMPLE_RATE_HZ} Hz`,
      );
    if (r.rateRadS.length !== n) return;
    const found = countCycles(r.timeS, r.rateRadS);
    if (found < 1) issue(['rateRadS'], 'Too short: the record holds less than one whole cycle of the motion');
    else if (n / found < MIN_SAMPLES_PER_CYCLE)
      issue(
        ['sampleRateHz'],
        `Sampled too slowly for this motion: fewer than ${MIN_SAMPLES_PER_CYCLE} samples a cycle`,
      );
  });
export type MotionRecord = z.infer<typeof motionRecordSchema>;

export const motionRecordsSchema = z
  .array(motionRecordSchema)
  .max(MAX_MOTION_RECORDS, `At most ${MAX_MOTION_RECORDS} motion records`)
  .superRefine((list, ctx) => {
    const seen = new Set<number>();
    list.forEach((r, i) => {
      if (seen.has(r.joint))
        ctx.addIssue({
          code: 'custom',
          path: [i, 'joint'],
          message: 'This joint already has a motion record',
        });
      seen.add(r.joint);
    });
  });

/**
 * Whole cycles in a rate record. A rate that swings crosses zero twice a cycle, once falling and once
 * rising (a record trimmed to whole cycles starts and ends on a rising crossing). A rate that does not
 * cross zero is a turning joint (perhaps starting and ending at rest): its cycles are whole turns of the
 * integrated angle.
 */
export function countCycles(timeS: readonly number[], rateRadS: readonly number[]): number {
  const crossings = zeroCrossings(rateRadS);
  if (crossings.length >= 2) return Math.floor(crossings.length / 2);
  let angle = 0;
  for (let k = 1; k < rateRadS.length; k++)
    angle += 0.5 * (rateRadS[k] + rateRadS[k - 1]) * (timeS[k] - timeS[k - 1]);
  // A few per cent of a turn is sensor noise and trimming to the nearest sample.
  return Math.floor(Math.abs(angle) / (2 * Math.PI) + 0.03);
}

/** A rate that does not swing through zero: the joint turns (or rests) rather than swings. */
export function isTurning(rateRadS: readonly number[]): boolean {
  return zeroCrossings(rateRadS).length < 2;
}

/**
 * Where the rate crosses zero (the sample index of the first sample on the new side), with a hysteresis
 * of a tenth of its RMS so that noise and a gyro's small bias near zero do not count as crossings, nor
 * the noise of a ride standing still before it starts.
 */
export function zeroCrossings(rateRadS: readonly number[]): { index: number; rising: boolean }[] {
  const n = rateRadS.length;
  let rms = 0;
  for (const w of rateRadS) rms += (w * w) / n;
  const h = 0.1 * Math.sqrt(rms);
  const out: { index: number; rising: boolean }[] = [];
  // The side the record starts on is decided by its first sample clear of the hysteresis band.
  let side = 0;
  let pending = -1;
  for (let k = 0; k < n; k++) {
    const v = rateRadS[k];
    const now = v > h ? 1 : v < -h ? -1 : 0;
    if (side === 0) {
      if (now !== 0) side = now;
      continue;
    }
    // The crossing is where the rate first passed zero, not where it left the band.
    if (pending < 0 && (side > 0 ? v < 0 : v >= 0)) pending = k;
    if (pending >= 0 && (side > 0 ? v >= 0 : v < 0)) pending = -1;
    if (now === -side) {
      out.push({ index: pending >= 0 ? pending : k, rising: now > 0 });
      side = now;
      pending = -1;
    }
  }
  // A record trimmed to whole cycles ends on the crossing itself.
  if (pending >= 0) out.push({ index: pending, rising: side < 0 });
  return out;
}

/**
 * One seat's measured rider accelerations (in g, after the low-pass of features/records/motion-record),
 * with the design's rider limits they are read against; stored beside the computed ones.
 */
export type MeasuredRider = {
  recordId: string;
  seat: number;
  name: string;
  cutoffHz: number;
  gxMin: number;
  gxMax: number;
  gzMin: number;
  gzMax: number;
  limits: { gx?: { min?: number; max?: number }; gz?: { min?: number; max?: number } };
};
