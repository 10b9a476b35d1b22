/**
 * Pin checks per EN 1993-1-8 §3.13.2, Table 3.10 ("Design criteria for pin connections"), at one force:
 *
 * - shear of the pin, per shear plane:      F_v,Ed ≤ F_v,Rd = 0.6·A·f_up / γM2, A = πd²/4
 * - bearing of each plate on the pin:        F_b,Ed ≤ F_b,Rd = 1.5·t·d·f_y / γM0
 * - bending of the pin:                      M_Ed ≤ M_Rd = 1.5·W_el·f_yp / γM0, W_el = πd³/32
 * - shear and bending combined:              (M_Ed/M_Rd)² + (F_v,Ed/F_v,Rd)² ≤ 1
 * - a pin meant to be replaced, also at the serviceability load (no load factor):
 *                                            F_b,Ed,ser ≤ F_b,Rd,ser = 0.6·t·d·f_y / γM6,ser
 *                                            M_Ed,ser ≤ M_Rd,ser = 0.8·W_el·f_yp / γM6,ser
 *
 * f_y in bearing is the lower of the pin's and the plate's yield strengths (the Table's note). The Table is
 * written for a clevis: an inner plate (lug) b thick between two outer plates (cheeks) a thick, gaps c, the
 * pin in double shear, each cheek taking half the force and M_Ed = F·(b + 4c + 2a)/8.
 *
 * Single shear (one plate a, one plate b, a gap c between them) is outside the Table's figure. We use what
 * is common practice (from memory, not from the standard): one shear plane carrying the whole force, each
 * plate bearing the whole force, and the pin bent as a cantilever between the plates' mid-thicknesses,
 * M_Ed = F·(a/2 + c + b/2). The Hertz contact stress check of §3.13.2(2) for replaceable pins needs the hole
 * diameter and is not made here.
 *
 * Utilisations are design effect ÷ design resistance (above 1 fails); the combined one is the Table's left
 * side. Pure TypeScript, no React.
 */
import type { ShearPlanes } from '@/features/loads/engine/pins';

/** The pin's and plates' data (design-schema `pinCheckSchema`), strengths in Pa, thicknesses in m. */
export type PinCheckInput = {
  pinGrade?: string;
  pinFyPa: number;
  pinFuPa: number;
  plateGrade?: string;
  plateFyPa: number;
  /** b: the inner plate (the lug between the cheeks). */
  innerPlateM: number;
  /** a: each outer plate (cheek). */
  outerPlateM: number;
  /** c: the gap between a cheek and the lug. */
  gapM: number;
  replaceable?: boolean;
  gammaM0?: number;
  gammaM2?: number;
  gammaM6ser?: number;
  gammaF?: number;
};

/** EN 1993-1-8 §2.2 Table 2.1 recommended values; γF 1.0 checks the peak as computed. */
export const PIN_CHECK_DEFAULT_FACTORS = {
  gammaM0: 1.0,
  gammaM2: 1.25,
  gammaM6ser: 1.0,
  gammaF: 1.0,
} as const;

export type PinCheckFactors = { gammaM0: number; gammaM2: number; gammaM6ser: number; gammaF: number };

export function pinCheckFactors(
  input: Pick<PinCheckInput, 'gammaM0' | 'gammaM2' | 'gammaM6ser' | 'gammaF'>,
): PinCheckFactors {
  const d = PIN_CHECK_DEFAULT_FACTORS;
  return {
    gammaM0: input.gammaM0 ?? d.gammaM0,
    gammaM2: input.gammaM2 ?? d.gammaM2,
    gammaM6ser: input.gammaM6ser ?? d.gammaM6ser,
    gammaF: input.gammaF ?? d.gammaF,
  };
}

/** One check: what acts, what resists (N or N·m), and their ratio. */
export type PinCheckTerm = { effect: number; resistance: number; utilisation: number };

export type PinCheckResult = {
  /** The force as computed (the serviceability load), N. */
  forceN: number;
  /** The design force, forceN × γF, N. */
  designForceN: number;
  diameterM: number;
  shear: ShearPlanes;
  /** The pin's data checked, so the check can be repeated at another force (the peak over load cases). */
  input: PinCheckInput;
  factors: PinCheckFactors;
  /** Per shear plane. */
  shearCheck: PinCheckTerm;
  /** The plate that governs bearing, with its force and resistance. */
  bearingCheck: PinCheckTerm & { plate: 'inner' | 'outer' };
  bendingCheck: PinCheckTerm;
  /** (M_Ed/M_Rd)² + (F_v,Ed/F_v,Rd)². */
  combined: number;
  /**
   * The design force at which the combined check reaches 1 (both terms grow as F², so at a force F it is
   * designForceN / √combined). Finite at a zero force too. Lets the envelope hold the interaction as a load against a load, like every other item.
   */
  combinedResistanceN: number;
  /** Replaceable pins only (else null), at forceN. */
  bearingServiceCheck: (PinCheckTerm & { plate: 'inner' | 'outer' }) | null;
  bendingServiceCheck: PinCheckTerm | null;
};

/** A check's utilisation per newton of design force (every Table 3.10 effect is linear in F). */
const perNewton = (resistance: number, effectPerN: number) => effectPerN / resistance;

const term = (effect: number, resistance: number): PinCheckTerm => ({
  effect,
  resistance,
  utilisation: effect / resistance,
});

/** The plate using most of its bearing resistance (inner first on a tie). */
function worstPlate(inner: PinCheckTerm, outer: PinCheckTerm) {
  return outer.utilisation > inner.utilisation
    ? { ...outer, plate: 'outer' as const }
    : { ...inner, plate: 'inner' as const };
}

/** The bending moment in the pin: the Table's clevis moment, or the single-shear lever arm (see above). */
export function pinBendingMoment(forceN: number, shear: ShearPlanes, p: PinCheckInput): number {
  const { innerPlateM: b, outerPlateM: a, gapM: c } = p;
  return shear === 'double' ? (forceN * (b + 4 * c + 2 * a)) / 8 : forceN * (a / 2 + c + b / 2);
}

/** Force on each plate in bearing: the lug takes F; each cheek F/2 in a clevis, F in single shear. */
function plateForces(forceN: number, shear: ShearPlanes) {
  return { inner: forceN, outer: shear === 'double' ? forceN / 2 : forceN };
}

/**
 * The Table 3.10 checks of one pin at `forceN` (the peak force as computed; γF is applied here) with the
 * diameter `diameterM` (the measured one when known: a worn pin is weaker).
 */
export function checkPin(
  forceN: number,
  diameterM: number,
  shear: ShearPlanes,
  input: PinCheckInput,
): PinCheckResult {
  if (!(diameterM > 0)) throw new Error('The pin diameter must be greater than 0');
  const factors = pinCheckFactors(input);
  const d = diameterM;
  const area = (Math.PI * d * d) / 4;
  const wEl = (Math.PI * d * d * d) / 32;
  const fyBearing = Math.min(input.pinFyPa, input.plateFyPa);
  const planes = shear === 'double' ? 2 : 1;
  const F = Math.abs(forceN) * factors.gammaF;

  const shearCheck = term(F / planes, (0.6 * area * input.pinFuPa) / factors.gammaM2);
  const bearingAt = (load: number, gamma: number, coefficient: number) => {
    const f = plateForces(load, shear);
    return worstPlate(
      term(f.inner, (coefficient * input.innerPlateM * d * fyBearing) / gamma),
      term(f.outer, (coefficient * input.outerPlateM * d * fyBearing) / gamma),
    );
  };
  const bearingCheck = bearingAt(F, factors.gammaM0, 1.5);
  const bendingCheck = term(pinBendingMoment(F, shear, input), (1.5 * wEl * input.pinFyPa) / factors.gammaM0);
  const combined = bendingCheck.utilisation ** 2 + shearCheck.utilisation ** 2;

  const service = input.replaceable === true;
  const Fser = Math.abs(forceN);
  return {
    forceN: Fser,
    designForceN: F,
    diameterM: d,
    shear,
    input,
    factors,
    shearCheck,
    bearingCheck,
    bendingCheck,
    combined,
    combinedResistanceN:
      1 /
      Math.hypot(
        perNewton(bendingCheck.resistance, pinBendingMoment(1, shear, input)),
        perNewton(shearCheck.resistance, 1 / planes),
      ),
    bearingServiceCheck: service ? bearingAt(Fser, factors.gammaM6ser, 0.6) : null,
    bendingServiceCheck: service
      ? term(pinBendingMoment(Fser, shear, input), (0.8 * wEl * input.pinFyPa) / factors.gammaM6ser)
      : null,
  };
}

/** The stored/shown summary of a check: utilisation ratios only. */
export type PinUtilisations = {
  forceN: number;
  diameterM: number;
  shear: number;
  bearing: number;
  bending: number;
  combined: number;
  bearingService: number | null;
  bendingService: number | null;
};

export function pinUtilisations(r: PinCheckResult): PinUtilisations {
  return {
    forceN: r.designForceN,
    diameterM: r.diameterM,
    shear: r.shearCheck.utilisation,
    bearing: r.bearingCheck.utilisation,
    bending: r.bendingCheck.utilisation,
    combined: r.combined,
    bearingService: r.bearingServiceCheck?.utilisation ?? null,
    bendingService: r.bendingServiceCheck?.utilisation ?? null,
  };
}

/**
 * Each joint's pin check at its peak force over every load case (`loadCases[].joints[i].peakForceN`, the
 * operating cycle's own peak when there are no cases), with the pin data and diameter the cycle's
 * envelope used, named after its pivot when `pivots` names it (else the joint's body). Structural types,
 * so a merged result (features/loads/load-cases.ts) fits as it is.
 */
export function pinChecksAtPeak(
  result: {
    joints: readonly { name: string; peakForce: { value: number } }[];
    pins: readonly { joint: number; check?: PinCheckResult | null }[];
    loadCases?: readonly { joints: readonly { peakForceN: number }[] }[];
  },
  pivots: readonly { joint: number; name: string }[] = [],
): (PinUtilisations & { joint: number; name: string })[] {
  const out: (PinUtilisations & { joint: number; name: string })[] = [];
  for (const pin of result.pins) {
    const check = pin.check;
    const joint = result.joints[pin.joint];
    if (!check || !joint) continue;
    let peak = Math.abs(joint.peakForce.value);
    for (const c of result.loadCases ?? [])
      peak = Math.max(peak, Math.abs(c.joints[pin.joint]?.peakForceN ?? 0));
    const again = checkPin(peak, check.diameterM, check.shear, check.input);
    const name = pivots.find((p) => p.joint === pin.joint)?.name ?? joint.name;
    out.push({ joint: pin.joint, name, ...pinUtilisations(again) });
  }
  return out;
}
