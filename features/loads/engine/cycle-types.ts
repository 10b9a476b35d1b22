/** The shapes of a whole-cycle analysis: what goes in (bodies, profiles, seats, limits) and what comes out. */
import type { ChainBody, Vec2 } from '@/features/loads/engine/chain';
import type { EnvelopeStatus, Evaluation } from '@/features/loads/engine/envelope';
import type { PinCheckInput, PinCheckResult } from '@/features/loads/engine/pin-checks';
import type { PinStresses, PinWear, ShearPlanes } from '@/features/loads/engine/pins';
import type { MotionProfile } from '@/features/loads/engine/profiles';
import type { QuantityKind } from '@/lib/units';

/**
 * A rider's seat: a point on a body with the rider's axes. `spineAngleRad` is the direction of the
 * rider's z axis (seat toward head) relative to the body's x-axis. The chest-ward x axis is the spine
 * turned 90° clockwise ('cw', the default: an upright rider facing global +x) or counter-clockwise.
 */
export type Seat = {
  name: string;
  body: number;
  positionM: Vec2;
  spineAngleRad: number;
  facing?: 'cw' | 'ccw';
};

/** A pin's design data and readings. Diameters and clearance in m, stresses and pressures in Pa. */
export type PinInput = {
  shear: ShearPlanes;
  bearingLengthM: number;
  nominalDiameterM: number;
  minimumDiameterM?: number;
  measuredDiameterM?: number;
  maxShearStressPa?: number;
  maxBearingPressurePa?: number;
  measuredClearanceM?: number;
  maxClearanceM?: number;
  /** The pin and plates for the EN 1993-1-8 Table 3.10 checks (features/loads/engine/pin-checks.ts). */
  en1993?: PinCheckInput;
};

export type JointLimits = {
  maxRateRadS?: number;
  maxAmplitudeRad?: number;
  maxForceN?: number;
  maxTorqueNm?: number;
  pin?: PinInput;
};

/** Limits on a rider axis, in g; either side may be open. */
export type AxisLimit = { min?: number; max?: number };

export type CycleLimits = {
  /** Ratio from which a value counts as near its limit. */
  nearMargin?: number;
  /** Per joint, in chain order; shorter than the chain or null where a joint has no limits. */
  joints?: readonly (JointLimits | null | undefined)[];
  /** Applied to every seat. */
  rider?: { gx?: AxisLimit; gz?: AxisLimit };
};

export type CycleInput = {
  bodies: readonly ChainBody[];
  /** One per joint, in chain order. */
  profiles: readonly MotionProfile[];
  gravityMS2?: number;
  /** Defaults to the longest natural cycle among the profiles. */
  durationS?: number;
  /** Evenly spaced over [0, durationS], both ends included. */
  samples?: number;
  seats?: readonly Seat[];
  limits?: CycleLimits;
};

export type Extremes = { min: number; max: number; range: number };

export type PeakAt = { value: number; index: number; timeS: number; angleRad: number; armAngleRad: number };

export type JointHistory = {
  name: string;
  /** This joint's motion, relative to its parent. */
  angleRad: Float64Array;
  rateRadS: Float64Array;
  accelRadS2: Float64Array;
  /** Force on body i by its parent, global frame. */
  forceXN: Float64Array;
  forceYN: Float64Array;
  /** The same force in body i's frame: along its x-axis, across it. */
  forceAlongN: Float64Array;
  forceAcrossN: Float64Array;
  forceMagnitudeN: Float64Array;
  torqueNm: Float64Array;
  /** Largest force magnitude, where it occurs (this joint's angle and the main arm's angle). */
  peakForce: PeakAt & { forceN: [number, number]; forceBodyN: [number, number] };
  /** Largest |torque|; `value` keeps its sign. */
  peakTorque: PeakAt;
  /**
   * Extremes and range (max − min) of the magnitude and of each component. A fatigue detail follows one
   * component in its member's frame (features/fatigue/detail-stress.ts); the magnitude's range hides a
   * reversal (on a turning arm the force reverses while its size barely changes), so it is no load range.
   */
  extremes: {
    magnitudeN: Extremes;
    xN: Extremes;
    yN: Extremes;
    alongN: Extremes;
    acrossN: Extremes;
    torqueNm: Extremes;
  };
  peakRateRadS: number;
  /** Half the angle travelled end to end when the joint oscillates; null when it turns full circles. */
  amplitudeRad: number | null;
  /**
   * A free joint only: its period found by integrating the chain (one swing, or one turn over the top),
   * null when none was found within the search (features/loads/engine/free-motion.ts).
   */
  freePeriodS?: number | null;
  /**
   * Free joints only: the largest |torque| inverse dynamics finds on the free pin over the cycle. Ideally
   * 0; what remains is the integration's round-off, so it checks the free motion. `torqueNm` reports 0.
   */
  freeTorqueResidualNm?: number;
};

export type SeatHistory = {
  name: string;
  body: number;
  /** Rider acceleration in g, gravity included (specific force): chest-ward x, spine-ward z. */
  gx: Float64Array;
  gz: Float64Array;
  extremes: {
    gx: Extremes & { minAtS: number; maxAtS: number };
    gz: Extremes & { minAtS: number; maxAtS: number };
  };
};

/** The load cases a result may merge (features/loads/load-cases.ts): the ride cycle and its stops. */
export type LoadCaseKind = 'operating' | 'service_stop' | 'emergency_stop';

export type EnvelopeItem = Evaluation & {
  /** A stable key, e.g. 'joints.0.force', 'seats.1.gz', 'joints.1.pin.diameter'. */
  id: string;
  label: string;
  quantity: QuantityKind;
  /** The load case this value comes from when cases were merged; absent for a single cycle. */
  loadCase?: LoadCaseKind;
};

export type PinResult = {
  joint: number;
  /** At the joint's peak force over the cycle. */
  stresses: PinStresses;
  wear: PinWear | null;
  /** EN 1993-1-8 Table 3.10 at the same peak, when the pin's data is given. */
  check?: PinCheckResult | null;
};

/**
 * Something the person must know about how far to trust a result: a measured record sampled too slowly,
 * noisy, with gaps, clipped or flat-lined; the smoothing actually used; a free swing's period. Returned
 * with every result and shown beside it. `joint`/`seat` point at what it concerns (0-based) when it
 * concerns one; `level` 'info' reports a setting, 'warning' asks for attention.
 */
export type CycleWarning = {
  code: string;
  level: 'info' | 'warning';
  message: string;
  joint?: number;
  seat?: number;
};

export type CycleResult = {
  gravityMS2: number;
  samples: number;
  durationS: number;
  timeS: Float64Array;
  joints: JointHistory[];
  seats: SeatHistory[];
  pins: PinResult[];
  envelope: EnvelopeItem[];
  status: EnvelopeStatus;
  nearMargin: number;
  warnings: CycleWarning[];
};
