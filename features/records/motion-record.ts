/**
 * A ride cycle recorded with the phone (features/records/motion-record-schema.ts) as the load check uses
 * it: the joint's recorded rate becomes that joint's `measured` rate profile, and the accelerations felt in
 * a seat become that seat's measured rider accelerations, kept beside the computed ones. Pure: the
 * phone's preview and the server's analysis both run it.
 */
import type { DesignData } from '@/features/loads/design-schema';
import {
  type CycleWarning,
  type MotionProfile,
  RIDER_ACCELERATION_CUTOFF_HZ,
  conditionRiderAccelerations,
} from '@/features/loads/engine';
import { isTurning, type MeasuredRider, type MotionRecord } from '@/features/records/motion-record-schema';

export type { MeasuredRider };

/** The record of a joint, if one was made and it can stand for the joint's motion. */
export function recordOfJoint(
  records: readonly MotionRecord[] | undefined,
  joint: number,
): MotionRecord | undefined {
  return records?.find((r) => r.joint === joint && r.parentRateRadS !== null);
}

/**
 * The `measured` rate profile of a recorded joint. A rate has no absolute angle, so the angle starts
 * where the whole cycles' mean angle comes out at the design's centre of swing (0): a phone cannot say
 * where a swing is centred, and the design's centre is the best statement there is. A turning joint
 * starts at 0; over whole turns its start does not change the envelope.
 */
export function motionProfileOf(
  records: readonly MotionRecord[] | undefined,
  joint: number,
): MotionProfile | null {
  const r = recordOfJoint(records, joint);
  if (!r) return null;
  const t0 = r.timeS[0];
  const timeS = r.timeS.map((t) => t - t0);
  const turning = isTurning(r.rateRadS);
  let startAngleRad = 0;
  if (!turning) {
    // Mean of the trapezoid-integrated angle over the record, weighted by time.
    let angle = 0;
    let area = 0;
    for (let k = 1; k < timeS.length; k++) {
      const h = timeS[k] - timeS[k - 1];
      const next = angle + 0.5 * (r.rateRadS[k] + r.rateRadS[k - 1]) * h;
      area += 0.5 * (angle + next) * h;
      angle = next;
    }
    startAngleRad = -area / (timeS[timeS.length - 1] || 1);
  }
  return { kind: 'measured', timeS, rateRadS: [...r.rateRadS], startAngleRad };
}

const gMin = (v: readonly number[]) => v.reduce((m, x) => (x < m ? x : m), Infinity);
const gMax = (v: readonly number[]) => v.reduce((m, x) => (x > m ? x : m), -Infinity);

/** The extremes of each seat's recorded accelerations (filtered), for seats the design has. */
export function measuredRiderOf(
  design: DesignData,
  records: readonly MotionRecord[] | undefined,
): MeasuredRider[] {
  const out: MeasuredRider[] = [];
  for (const r of records ?? []) {
    if (r.seat === null || !r.gxG || !r.gzG) continue;
    const seat = design.seats[r.seat];
    if (!seat) continue;
    // The ride-measurement low-pass (features/loads/engine/conditioning/rider.ts: 4-pole zero phase, 5 Hz).
    const fx = conditionRiderAccelerations(r.timeS, r.gxG);
    const fz = conditionRiderAccelerations(r.timeS, r.gzG);
    const gx = fx.values;
    const gz = fz.values;
    out.push({
      recordId: r.id,
      seat: r.seat,
      name: seat.name,
      cutoffHz: fx.cutoffHz ?? fz.cutoffHz ?? RIDER_ACCELERATION_CUTOFF_HZ,
      gxMin: gMin(gx),
      gxMax: gMax(gx),
      gzMin: gMin(gz),
      gzMax: gMax(gz),
      limits: design.rider,
    });
  }
  return out;
}

/** What the load check says about the recorded joints: which run the record, and which could not. */
export function motionRecordWarnings(
  design: DesignData,
  records: readonly MotionRecord[] | undefined,
): CycleWarning[] {
  const out: CycleWarning[] = [];
  for (const r of records ?? []) {
    if (r.seat !== null && !design.seats[r.seat])
      out.push({
        code: 'motion_record_seat_unknown',
        level: 'warning',
        joint: r.joint,
        message: `The seat the phone rode in (number ${r.seat + 1}) is not in the ride’s design data: its measured accelerations are not shown.`,
      });
    if (r.joint >= design.bodies.length)
      out.push({
        code: 'motion_record_unused',
        level: 'warning',
        joint: r.joint,
        message:
          'This pivot is not in the ride’s design data: the motion recorded with the phone was not used.',
      });
    else if (r.parentRateRadS === null)
      out.push({
        code: 'motion_record_absolute',
        level: 'warning',
        joint: r.joint,
        message:
          'The phone measured the body’s rate over the ground, and a pivot below it does not ' +
          'turn steadily, so its own rate could not be taken off. The design motion was used for this pivot.',
      });
    else
      out.push({
        code: 'motion_record_used',
        level: 'info',
        joint: r.joint,
        message:
          `Runs the motion recorded with the phone: ${r.cycles} whole cycle${r.cycles === 1 ? '' : 's'} ` +
          `at ${Math.round(r.sampleRateHz)} samples a second (uncalibrated phone sensors).`,
      });
  }
  return out;
}
