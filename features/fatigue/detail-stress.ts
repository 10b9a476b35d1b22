/**
 * A fatigue detail's stress history over one analysed cycle: the one force component (or the torque) the
 * detail responds to, in the frame of the member that carries it, times the detail's stress per unit load.
 *
 * Frames follow the engine (features/loads/engine/chain.ts): body i's x-axis is turned by its absolute angle
 * θ_i = q_0 + … + q_i, counter-clockwise positive; the ground's frame is the global one. 'along' is the
 * member's x-axis, 'across' its y-axis.
 * - member 'body': the force on body i by its parent at joint i, in body i's frame — the engine's
 *   `forceAlongN` / `forceAcrossN` — and the torque `torqueNm` on body i.
 * - member 'parent': the reaction on the holding member (Newton's third law: −F, −torque) in the parent's
 *   frame, turned by the parent's absolute angle θ_{i−1} = θ_i − q_i. For joint 0 the holder is the ground,
 *   whose frame is the global one: 'along' is global x, 'across' global y (up).
 * The sign of a stress is a convention only; ranges, which fatigue counts, do not depend on it.
 *
 * Pure TypeScript: the server's analysis, the design basis and the app run this same code.
 */
import type { FatigueDetail } from '@/features/loads/design-schema';
import type { CycleResult } from '@/features/loads/engine';

/**
 * MPa per kN (per kN·m for a torque): as given, or from the section as 1 / (area × shear planes). One kN
 * on one mm² is 1000 N/mm² = 1000 MPa.
 */
export function detailStressFactor(
  detail: Pick<FatigueDetail, 'stressPerKnMPa' | 'sectionAreaMm2' | 'shearPlanes'>,
): number {
  if (detail.stressPerKnMPa !== undefined) return detail.stressPerKnMPa;
  if (detail.sectionAreaMm2 === undefined || !(detail.sectionAreaMm2 > 0))
    throw new Error('A fatigue detail needs its stress per kN or its section area');
  return 1000 / (detail.sectionAreaMm2 * (detail.shearPlanes ?? 1));
}

/**
 * The reaction on the holding member in its own frame, per sample: −F turned from body i's frame back by
 * the joint's relative angle q_i (θ_{i−1} = θ_i − q_i), which needs no sum of angles up the chain; for
 * joint 0 it is −F in global axes. Both components are kept per result, since a pivot's details often
 * follow both.
 */
const parentFrames = new WeakMap<CycleResult, Map<number, { along: Float64Array; across: Float64Array }>>();

function parentFrame(result: CycleResult, joint: number): { along: Float64Array; across: Float64Array } {
  let byJoint = parentFrames.get(result);
  if (!byJoint) {
    byJoint = new Map();
    parentFrames.set(result, byJoint);
  }
  const held = byJoint.get(joint);
  if (held) return held;
  const j = result.joints[joint];
  const count = result.samples;
  const along = new Float64Array(count);
  const across = new Float64Array(count);
  if (joint === 0) {
    for (let k = 0; k < count; k++) {
      along[k] = -j.forceXN[k];
      across[k] = -j.forceYN[k];
    }
  } else {
    const a = j.forceAlongN;
    const b = j.forceAcrossN;
    const q = j.angleRad;
    for (let k = 0; k < count; k++) {
      const c = Math.cos(q[k]);
      const s = Math.sin(q[k]);
      along[k] = -(a[k] * c - b[k] * s);
      across[k] = -(a[k] * s + b[k] * c);
    }
  }
  const frame = { along, across };
  byJoint.set(joint, frame);
  return frame;
}

/**
 * The load the detail follows, N (N·m for a torque), per sample: the component in the carrying member's
 * frame, as the header describes. Read only: the arrays may be shared between details.
 */
export function detailLoadHistory(
  result: CycleResult,
  detail: Pick<FatigueDetail, 'joint' | 'member' | 'component'>,
): Float64Array {
  const joint = result.joints[detail.joint];
  if (!joint) throw new Error(`The analysis has no joint ${detail.joint}`);
  if (detail.member === 'body')
    return detail.component === 'torque'
      ? joint.torqueNm
      : detail.component === 'along'
        ? joint.forceAlongN
        : joint.forceAcrossN;
  if (detail.component === 'torque') {
    // The holding member carries the reaction torque.
    const out = new Float64Array(result.samples);
    for (let k = 0; k < out.length; k++) out[k] = -joint.torqueNm[k];
    return out;
  }
  const frame = parentFrame(result, detail.joint);
  return detail.component === 'along' ? frame.along : frame.across;
}

/** The detail's stress per sample, MPa: the load in kN (kN·m) times the detail's stress factor. */
export function detailStressHistory(result: CycleResult, detail: FatigueDetail): Float64Array {
  const load = detailLoadHistory(result, detail);
  const perN = detailStressFactor(detail) / 1000;
  const out = new Float64Array(load.length);
  for (let k = 0; k < load.length; k++) out[k] = load[k] * perN;
  return out;
}
