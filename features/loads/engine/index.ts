/** The load engine's public API. Pure TypeScript: no React, no I/O; used by the server and the app. */

export const ENGINE_VERSION = '1.2.0';

export { STANDARD_GRAVITY_MS2, createChain, createChainWork, solveInto } from '@/features/loads/engine/chain';
export type { Chain, ChainBody, ChainWork, JointState, Vec2 } from '@/features/loads/engine/chain';

export { chainEnergy, jointAccelerations, solveInstant, solveLinear } from '@/features/loads/engine/instant';
export type {
  BodyMomentCheck,
  BodyMotion,
  ChainEnergy,
  InstantOptions,
  InstantResult,
  JointLoad,
  MomentCheck,
  MomentPoint,
} from '@/features/loads/engine/instant';

export {
  bodyFromParts,
  centreOfPercussion,
  combineParts,
  inertiaAbout,
  partProperties,
} from '@/features/loads/engine/parts';
export type { MassProperties, Part } from '@/features/loads/engine/parts';

export {
  DEFAULT_WINDOW_POINTS,
  defaultCycleDurationS,
  naturalDurationS,
  sampleProfile,
} from '@/features/loads/engine/profiles';
export type { MotionProfile } from '@/features/loads/engine/profiles';

export { localPolynomialFit } from '@/features/loads/engine/smoothing';
export type { LocalFit } from '@/features/loads/engine/smoothing';

export {
  MEASURED_CYCLE_SAMPLES,
  conditionMeasured,
  measuredCycleSamples,
  measuredSampleRateHz,
} from '@/features/loads/engine/conditioning/measured';
export type { ConditionedMotion, MeasuredProfile } from '@/features/loads/engine/conditioning/measured';
export {
  RIDER_ACCELERATION_CUTOFF_HZ,
  RIDER_ACCELERATION_POLES,
  conditionRiderAccelerations,
} from '@/features/loads/engine/conditioning/rider';
export type {
  ConditionedRiderAccelerations,
  RiderAccelerationOptions,
} from '@/features/loads/engine/conditioning/rider';
export { butterworthSections, zeroPhaseLowPass } from '@/features/loads/engine/conditioning/butterworth';
export { analyseSpacing, unwrapAngles } from '@/features/loads/engine/conditioning/record';

export { DEFAULT_CYCLE_SAMPLES, analyseCycle, cycleResultToJson } from '@/features/loads/engine/cycle';
export {
  BOUNDED_CYCLE_VALUES,
  boundCycle,
  cycleSeries,
  drawnCycleSeries,
  pickSampleIndices,
  pickValues,
  valuesPerSample,
} from '@/features/loads/engine/decimate';
export type { BoundedCycle } from '@/features/loads/engine/decimate';
export {
  FREE_MOTION_ATOL,
  FREE_MOTION_RTOL,
  FREE_PERIOD_SEARCH_S,
  FreeMotionError,
  integrateFreeMotion,
} from '@/features/loads/engine/free-motion';
export type { FreeMotion, FreeMotionOptions } from '@/features/loads/engine/free-motion';
export type { CycleResultJson } from '@/features/loads/engine/cycle';
export type {
  AxisLimit,
  CycleInput,
  CycleLimits,
  CycleResult,
  CycleWarning,
  EnvelopeItem,
  Extremes,
  JointHistory,
  JointLimits,
  LoadCaseKind,
  PeakAt,
  PinInput,
  PinResult,
  Seat,
  SeatHistory,
} from '@/features/loads/engine/cycle-types';

export {
  DEFAULT_NEAR_MARGIN,
  ENVELOPE_STATUS_LABEL,
  LIMIT_EQUAL_TOLERANCE,
  envelopeStatus,
  evaluateExtremes,
  evaluateLimit,
  limitRatio,
  worstStatus,
} from '@/features/loads/engine/envelope';
export type { EnvelopeStatus, Evaluation, Limit } from '@/features/loads/engine/envelope';

export { pinStresses, pinWear } from '@/features/loads/engine/pins';
export {
  PIN_CHECK_DEFAULT_FACTORS,
  checkPin,
  pinBendingMoment,
  pinCheckFactors,
  pinChecksAtPeak,
  pinUtilisations,
} from '@/features/loads/engine/pin-checks';
export type {
  PinCheckFactors,
  PinCheckInput,
  PinCheckResult,
  PinCheckTerm,
  PinUtilisations,
} from '@/features/loads/engine/pin-checks';
export { PIN_CHECK_STANDARD, pinCheckItems } from '@/features/loads/engine/cycle-envelope';
export type { PinGeometry, PinStresses, PinWear, ShearPlanes } from '@/features/loads/engine/pins';

/** The idealisations every result rests on; shown with results, never hidden. */
export const ENGINE_ASSUMPTIONS: readonly string[] = [
  'Rigid bodies in plane motion; no elasticity or vibration.',
  'Ideal pins: no friction, no clearance, no impacts from play.',
  'No wind, no drive or brake transients beyond the given motion profile.',
  'Loads follow the motion profile exactly; measured motion is smoothed before differentiation.',
];
