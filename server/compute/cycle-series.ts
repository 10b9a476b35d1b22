/**
 * The series a ride cycle's HTTP answer carries. Bounded by default, so an answer's size no longer grows
 * with the samples analysed: a 10,000-sample measured record or a 100,000-point request answers in tens of
 * kilobytes, every series' peaks and troughs kept exactly (features/loads/engine/decimate.ts). Every
 * sample on request (`?resolution=full`) up to a cap on the numbers sent.
 */
import {
  BOUNDED_CYCLE_VALUES,
  ENGINE_ASSUMPTIONS,
  ENGINE_VERSION,
  boundCycle,
  cycleResultToJson,
  valuesPerSample,
  type CycleResult,
} from '@/features/loads/engine';
import type { CycleResolution, CycleSeriesFields } from '@/features/loads/cycle-resolution-schema';
import type { CycleResponse } from '@/features/loads/schema';

/** Numbers in a bounded answer's series (features/loads/engine/decimate.ts says how many that is). */
export const CYCLE_BOUNDED_VALUES = BOUNDED_CYCLE_VALUES;

/**
 * Numbers a full-resolution answer may carry: about 9 MB of JSON, e.g. a 10,000-sample measured record of
 * five bodies and two seats. Beyond it the bounded answer is the one to ask for.
 */
export const CYCLE_FULL_MAX_VALUES = 500_000;

export type CycleAnswer = CycleResponse & CycleSeriesFields;
type Issue = { path: string; message: string };

/** Why a full-resolution answer of this size is refused, or null when it is within the cap. */
export function fullResolutionIssue(samples: number, joints: number, seats: number): Issue | null {
  const values = samples * valuesPerSample(joints, seats);
  if (values <= CYCLE_FULL_MAX_VALUES) return null;
  return {
    path: 'query.resolution',
    message:
      `Full resolution is limited to ${CYCLE_FULL_MAX_VALUES.toLocaleString('en')} numbers; this cycle has ` +
      `${values.toLocaleString('en')} (${samples.toLocaleString('en')} samples × ` +
      `${valuesPerSample(joints, seats)} series). Leave resolution out for the bounded series (every peak ` +
      'kept), or ask for fewer samples',
  };
}

/** The answer for an analysed cycle at the asked resolution; a full one beyond the cap is an issue. */
export function cycleAnswer(
  result: CycleResult,
  resolution: CycleResolution,
): { ok: true; value: CycleAnswer } | { ok: false; issues: Issue[] } {
  if (resolution === 'full') {
    const issue = fullResolutionIssue(result.timeS.length, result.joints.length, result.seats.length);
    if (issue) return { ok: false, issues: [issue] };
  }
  const bounded =
    resolution === 'full' ? { result, sampleIndex: null } : boundCycle(result, CYCLE_BOUNDED_VALUES);
  const head = { engineVersion: ENGINE_VERSION, assumptions: ENGINE_ASSUMPTIONS };
  const json = cycleResultToJson(bounded.result);
  return {
    ok: true,
    value: bounded.sampleIndex
      ? { ...head, ...json, resolution: 'bounded', sampleIndex: bounded.sampleIndex }
      : { ...head, ...json, resolution: 'full' },
  };
}
