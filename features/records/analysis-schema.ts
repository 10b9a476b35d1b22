/**
 * What an inspection's load check says about how it was made, beyond its peaks: the model each joint ran
 * (a free swing, a harmonic swing, steady rotation, a measured record, the design motion), the load cases
 * (the ride cycle and its stops) with their peaks and the case that governs, the comparison of a free
 * swing's computed period with the measured one, and the warnings. The phone's preview and the server's
 * stored analysis (db/server/inspections.ts) carry the same shapes; every field is optional there, since
 * analyses made by engine 1.0.0 have none of them. Pure zod, no React.
 */
import { z } from 'zod';

import type { CycleWarning, LoadCaseKind } from '@/features/loads/engine';

export const jointModelKinds = [
  'free_swing',
  'harmonic_swing',
  'steady_rotation',
  'ramp',
  'measured_record',
  'fixed',
] as const;
export type JointModelKind = (typeof jointModelKinds)[number];

/** Where a joint's motion came from: the inspection's readings, a recorded ride cycle, or the design. */
export const motionSources = ['readings', 'record', 'design'] as const;
export type MotionSource = (typeof motionSources)[number];

export const JOINT_MODEL_WORDS: Record<JointModelKind, string> = {
  free_swing: 'free swing',
  harmonic_swing: 'harmonic swing',
  steady_rotation: 'steady rotation',
  ramp: 'speed ramp',
  measured_record: 'measured record',
  fixed: 'held fixed',
};

export const MOTION_SOURCE_WORDS: Record<MotionSource, string> = {
  readings: 'from the readings',
  record: 'from the recorded cycle',
  design: 'design motion',
};

export const jointModelSchema = z.object({
  joint: z.number().int(),
  name: z.string(),
  model: z.enum(jointModelKinds),
  source: z.enum(motionSources),
});
export type JointModel = z.infer<typeof jointModelSchema>;

/** "free swing, from the readings". */
export function jointModelText(m: Pick<JointModel, 'model' | 'source'>): string {
  return `${JOINT_MODEL_WORDS[m.model]}, ${MOTION_SOURCE_WORDS[m.source]}`;
}

/** Beyond this share a free swing's computed period is flagged against the measured one. */
export const PERIOD_DIFFERENCE_WARNING = 0.05;

/** A free swing's period as computed from the chain against the period the inspector measured. */
export const periodCheckSchema = z.object({
  joint: z.number().int(),
  name: z.string(),
  measuredS: z.number(),
  /** Null when the integration found no period (the swing never came back). */
  computedS: z.number().nullable(),
  /** (computed − measured) / measured; null without a computed period. */
  difference: z.number().nullable(),
  /** Whether the amplitude analysed was measured, or the design's (a period reading alone). */
  amplitudeFrom: z.enum(['readings', 'design']),
});
export type PeriodCheck = z.infer<typeof periodCheckSchema>;

export const loadCaseKinds = [
  'operating',
  'service_stop',
  'emergency_stop',
] as const satisfies readonly LoadCaseKind[];
const envelopeStatusSchema = z.enum(['within', 'near', 'over']);

/** One load case's peaks over all its runs (features/loads/load-cases.ts CaseSummary, without histories). */
/** A seat's rider-acceleration extremes over a cycle, in g, as stored analyses keep them. */
export const seatExtremesSchema = z.object({
  name: z.string(),
  gxMin: z.number(),
  gxMax: z.number(),
  gzMin: z.number(),
  gzMax: z.number(),
});

export const storedLoadCaseSchema = z.object({
  kind: z.enum(loadCaseKinds),
  label: z.string(),
  /** Per joint: the deceleration of the stop (rad/s²), null where the joint keeps its operating motion. */
  decelRadS2: z.array(z.number().nullable()),
  durationS: z.number(),
  runs: z.number().int(),
  joints: z.array(z.object({ name: z.string(), peakForceN: z.number(), peakTorqueNm: z.number() })),
  seats: z.array(seatExtremesSchema),
  status: envelopeStatusSchema.nullable(),
});
export type StoredLoadCase = z.infer<typeof storedLoadCaseSchema>;

export const cycleWarningSchema = z.object({
  code: z.string(),
  level: z.enum(['info', 'warning']),
  message: z.string(),
  joint: z.number().int().optional(),
  seat: z.number().int().optional(),
}) satisfies z.ZodType<CycleWarning, unknown>;

/**
 * The parts of an analysis that say how it was made. All optional: the stored analyses of engine 1.0.0
 * have none, and a reader drops a part it cannot read rather than the whole analysis.
 */
export const analysisModelFields = {
  models: z.array(jointModelSchema).optional().catch(undefined),
  loadCases: z.array(storedLoadCaseSchema).optional().catch(undefined),
  governingCase: z.enum(loadCaseKinds).nullable().optional().catch(undefined),
  periodChecks: z.array(periodCheckSchema).optional().catch(undefined),
  warnings: z.array(cycleWarningSchema).optional().catch(undefined),
};
export type AnalysisModelFields = {
  models?: JointModel[];
  loadCases?: StoredLoadCase[];
  governingCase?: LoadCaseKind | null;
  periodChecks?: PeriodCheck[];
  warnings?: CycleWarning[];
};

/** What to say where an analysis recorded no models: it was made before they were recorded. */
export function modelsNotRecorded(engineVersion: string): string {
  return `Model not recorded (engine ${engineVersion})`;
}

/** A period check in words: "computed 9.62 s, measured 9.50 s (+1.3 %)". */
export function periodCheckText(p: PeriodCheck): string {
  const s = (v: number) => `${v.toPrecision(3)} s`;
  if (p.computedS === null || p.difference === null)
    return `measured ${s(p.measuredS)}; the free swing gave no period to compare`;
  const pct = p.difference * 100;
  return `computed ${s(p.computedS)}, measured ${s(p.measuredS)} (${pct >= 0 ? '+' : '−'}${Math.abs(pct).toFixed(1)} %)`;
}

/** Whether a period check differs by more than the stated share. */
export const periodDiffers = (p: PeriodCheck) =>
  p.difference === null || Math.abs(p.difference) > PERIOD_DIFFERENCE_WARNING;

/**
 * A pivot's force ranges (max − min over the cycle) per component, in the frame of the body the pivot
 * carries (`frame` names it): what a detail that follows one component sees. The size of the force hides
 * a full reversal on a rotating arm, so it is not a range fatigue can use.
 */
export const jointRangesSchema = z.object({
  frame: z.string(),
  alongN: z.number(),
  acrossN: z.number(),
  torqueNm: z.number(),
});
export type JointRanges = z.infer<typeof jointRangesSchema>;

/**
 * One fatigue detail of the design data (`detail` indexes `fatigue.details`) over one analysis: per load
 * case the largest stress range counted and the Miner damage of one run of that case (rainflow per ASTM
 * E1049 §5.4.4, S-N curve per EN 1993-1-9 §7), and the damage of one ride cycle (the operating cycle
 * scaled to the ride cycle time, plus its service stops).
 */
export const storedFatigueDetailSchema = z.object({
  detail: z.number().int(),
  joint: z.number().int(),
  name: z.string(),
  categoryMPa: z.number(),
  shear: z.boolean(),
  /** MPa per kN (per kN·m for a torque), as given or derived from the section. */
  stressPerKnMPa: z.number(),
  cases: z.array(
    z.object({
      kind: z.enum(loadCaseKinds),
      maxRangeMPa: z.number(),
      damage: z.number(),
      /** This case's part of damagePerRideCycle (an emergency stop's is 0: it is counted per event). */
      perRideCycle: z.number().optional(),
    }),
  ),
  damagePerRideCycle: z.number(),
  damageLimit: z.number(),
});
export type StoredFatigueDetail = z.infer<typeof storedFatigueDetailSchema>;

/**
 * A pivot's pin checked per EN 1993-1-8 §3.13 Table 3.10 at the peak force of all load cases (times γF):
 * utilisation ratios (design effect ÷ design resistance; above 1 fails). The serviceability ratios are
 * null unless the pin is replaceable.
 */
export const storedPinCheckSchema = z.object({
  joint: z.number().int(),
  name: z.string(),
  forceN: z.number(),
  diameterM: z.number(),
  shear: z.number(),
  bearing: z.number(),
  bending: z.number(),
  combined: z.number(),
  bearingService: z.number().nullable(),
  bendingService: z.number().nullable(),
});
export type StoredPinCheck = z.infer<typeof storedPinCheckSchema>;

/** The pivot-life parts of an analysis; absent from analyses made before they existed. */
export const analysisLifeFields = {
  fatigue: z.array(storedFatigueDetailSchema).optional().catch(undefined),
  pinChecks: z.array(storedPinCheckSchema).optional().catch(undefined),
};
export type AnalysisLifeFields = {
  fatigue?: StoredFatigueDetail[];
  pinChecks?: StoredPinCheck[];
};
