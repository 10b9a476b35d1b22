/**
 * A fatigue detail's stress history over one analysed cycle: the one force component (or the torque) the
 * detail responds to, in the frame of the member that carries it, times the detail's stress per unit load.
 *
 * Frames follow the engine (features/loads/engine/chain.ts): body i's x-axis is turned by its absolute angle
 * θ_i = q_0 + … + q_i, counter-clockwise positive; the ground's frame is the global one. 'along' is the
 * member's x-axis, 'across' its y-axis.
 * - member 'body': the force on body i by its parent at joint i, in body i's frame — the engine's
 *   `forceAlongN` / `forceAcrossN` — and the torque `torqueNm` on body i.
 * - member 'parent': the reaction on the holding member (Newton's third law: −F, −torque), turned into the
 *   parent's frame by the parent's absolute angle θ_{i−1}. For joint 0 the holder is the ground, whose
 *   frame is the global one: 'along' is global x, 'across' global y (up).
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

/** Each sample's absolute angle of body `body` (θ = sum of the relative joint angles up to it). */
export function absoluteAngles(result: CycleResult, body: number): Float64Array {
  const theta = new Float64Array(result.samples);
  for (let j = 0; j <= body; j++) {
    const q = result.joints[j].angleRad;
    for (let k = 0; k < theta.length; k++) theta[k] += q[k];
  }
  return theta;
}

/**
 * The load the detail follows, N (N·m for a torque), per sample: the component in the carrying member's
 * frame, as the header describes.
 */
export function detailLoadHistory(
  result: CycleResult,
  detail: Pick<FatigueDetail, 'joint' | 'member' | 'component'>,
): Float64Array {
  const joint = result.joints[detail.joint];
  if (!joint) throw new Error(`The analysis has no joint ${detail.joint}`);
  const count = result.samples;
  const out = new Float64Array(count);
  if (detail.member === 'body') {
    const source =
      detail.component === 'torque'
        ? joint.torqueNm
        : detail.component === 'along'
          ? joint.forceAlongN
          : joint.forceAcrossN;
    out.set(source);
    return out;
  }
  // The holding member carries the reaction: −F and −torque.
  if (detail.component === 'torque') {
    for (let k = 0; k < count; k++) out[k] = -joint.torqueNm[k];
    return out;
  }
  const theta = detail.joint === 0 ? null : absoluteAngles(result, detail.joint - 1);
  const along = detail.component === 'along';
  for (let k = 0; k < count; k++) {
    const x = -joint.forceXN[k];
    const y = -joint.forceYN[k];
    const c = theta ? Math.cos(theta[k]) : 1;
    const s = theta ? Math.sin(theta[k]) : 0;
    out[k] = along ? x * c + y * s : -x * s + y * c;
  }
  return out;
}

/** The detail's stress per sample, MPa: the load in kN (kN·m) times the detail's stress factor. */
export function detailStressHistory(result: CycleResult, detail: FatigueDetail): Float64Array {
  const load = detailLoadHistory(result, detail);
  const perN = detailStressFactor(detail) / 1000;
  for (let k = 0; k < load.length; k++) load[k] *= perN;
  return load;
}
