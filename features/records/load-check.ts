/**
 * The load check of an inspection once its motion is known: the operating cycle plus the stops the design
 * data defines (features/loads/load-cases.ts), which model each joint ran, and for a free swing the
 * computed period against the measured one. Pure TypeScript: the phone's preview and the server's stored
 * analysis run this same code.
 */
import type { DesignData, MeasuredInputs } from '@/features/loads/design-schema';
import type {
  CycleInput,
  CycleResult,
  CycleWarning,
  LoadCaseKind,
  MotionProfile,
} from '@/features/loads/engine';
import { type CaseSummary, analyseLoadCases, designStops, withLoadCases } from '@/features/loads';
import { fatigueOfLoadCases } from '@/features/fatigue';
import {
  type JointModel,
  type JointModelKind,
  PERIOD_DIFFERENCE_WARNING,
  type PeriodCheck,
  type StoredFatigueDetail,
  periodCheckText,
} from '@/features/records/analysis-schema';
import type { Reading } from '@/features/records/schema';

/** What an inspection's load check adds to the cycle result. */
export type LoadCheckExtras = {
  models: JointModel[];
  /** The operating cycle first, then each stop the design data defines. */
  loadCases: CaseSummary[];
  governingCase: LoadCaseKind | null;
  periodChecks: PeriodCheck[];
  /** Per fatigue detail of the design data: damage per case and per ride cycle; absent without one. */
  fatigue?: StoredFatigueDetail[];
};
export type InspectionResult = CycleResult & LoadCheckExtras;

const modelOf: Record<MotionProfile['kind'], JointModelKind> = {
  free: 'free_swing',
  swing: 'harmonic_swing',
  constant: 'steady_rotation',
  ramp: 'ramp',
  measured: 'measured_record',
  fixed: 'fixed',
};

/** Which model each joint ran and where its motion came from. */
export function jointModels(
  input: CycleInput,
  measured: MeasuredInputs,
  names: readonly string[],
): JointModel[] {
  return input.profiles.map((p, joint) => {
    const own = measured.profiles?.[joint];
    return {
      joint,
      name: names[joint] ?? `Joint ${joint + 1}`,
      model: modelOf[p.kind],
      source: !own ? 'design' : own.kind === 'measured' ? 'record' : 'readings',
    };
  });
}

function latestPeriod(readings: readonly Reading[], joint: number): Reading | undefined {
  let found: Reading | undefined;
  for (const r of readings) if (r.kind === 'period' && r.joint === joint) found = r;
  return found;
}

/**
 * A free swing's period found by integrating the chain, against a period the inspector measured. The two
 * differ when the bearing drags, the drive still pushes, or the design data is wrong.
 */
export function periodChecks(
  readings: readonly Reading[],
  result: CycleResult,
  models: readonly JointModel[],
): PeriodCheck[] {
  const out: PeriodCheck[] = [];
  for (const model of models) {
    if (model.model !== 'free_swing') continue;
    const measured = latestPeriod(readings, model.joint);
    if (!measured) continue;
    const joint = result.joints[model.joint] as CycleResult['joints'][number] & {
      freePeriodS?: number | null;
    };
    const computed = joint?.freePeriodS ?? null;
    out.push({
      joint: model.joint,
      name: model.name,
      measuredS: measured.valueSI,
      computedS: computed,
      difference: computed === null ? null : (computed - measured.valueSI) / measured.valueSI,
      amplitudeFrom: model.source === 'readings' ? 'readings' : 'design',
    });
  }
  return out;
}

function periodWarning(p: PeriodCheck): CycleWarning {
  const differs = p.difference === null || Math.abs(p.difference) > PERIOD_DIFFERENCE_WARNING;
  const share = `${(PERIOD_DIFFERENCE_WARNING * 100).toFixed(0)} %`;
  return {
    code: 'period_check',
    level: differs ? 'warning' : 'info',
    joint: p.joint,
    message: differs
      ? `Free swing (${p.name}): ${periodCheckText(p)}, more than ${share} apart. A dragging bearing, a drive ` +
        'fault or wrong design data show up here: find out which before relying on this result.'
      : `Free swing (${p.name}): ${periodCheckText(p)}, within ${share}.`,
  };
}

/**
 * Each fatigue detail's damage over the load cases (features/fatigue). A detail that cannot be assessed
 * leaves a warning instead of failing the whole load check.
 */
function fatigueOf(design: DesignData, cases: readonly CaseSummary[]) {
  if (!design.fatigue?.details.length) return { fatigue: undefined, warnings: [] };
  try {
    return { fatigue: fatigueOfLoadCases(design, cases), warnings: [] };
  } catch (err) {
    const warning: CycleWarning = {
      code: 'fatigue_failed',
      level: 'warning',
      message: `Fatigue could not be assessed: ${err instanceof Error ? err.message : String(err)}`,
    };
    return { fatigue: undefined, warnings: [warning] };
  }
}

/** The operating cycle and the design's stops, merged, with the models, period checks and fatigue. */
export function runLoadCheck(
  design: DesignData,
  input: CycleInput,
  measured: MeasuredInputs,
  readings: readonly Reading[],
): InspectionResult {
  const cases = analyseLoadCases(input, designStops(design));
  const result = withLoadCases(cases);
  const models = jointModels(
    input,
    measured,
    result.joints.map((j) => j.name),
  );
  const checks = periodChecks(readings, result, models);
  const fatigue = fatigueOf(design, cases.cases);
  return {
    ...result,
    warnings: [...result.warnings, ...checks.map(periodWarning), ...fatigue.warnings],
    models,
    loadCases: cases.cases,
    governingCase: cases.governing,
    periodChecks: checks,
    ...(fatigue.fatigue ? { fatigue: fatigue.fatigue } : {}),
  };
}
