/**
 * A pivot's load ranges in words, shared by the calculator, the phone, the review desk and the PDF report:
 * the force's components along and across the body the pivot carries, in that body's own frame, and the
 * torque. The range of the force's size is not shown: on a turning arm the force reverses while its size
 * barely changes, so that number hides exactly what fatigue counts.
 */
import type { UnitSystem } from '@/lib/units';
import type { JointHistory } from '@/features/loads/engine';
import { formatValue } from '@/features/loads/format';

export type RangesShown = { frame: string; alongN: number; acrossN: number; torqueNm: number };

/** A joint's ranges over a cycle, in the frame of the body it carries (named after that body). */
export function jointRangesOf(joint: Pick<JointHistory, 'name' | 'extremes'>): RangesShown {
  return {
    frame: joint.name,
    alongN: joint.extremes.alongN.range,
    acrossN: joint.extremes.acrossN.range,
    torqueNm: joint.extremes.torqueNm.range,
  };
}

export const FORCE_RANGE_TITLE = 'Force range along / across';
export const TORQUE_RANGE_TITLE = 'Torque range';

export const RANGES_NOTE =
  'Ranges are max − min over the operating cycle of the force along and across the body each pivot ' +
  'carries, in that body’s own frame (named), and of the torque. The force’s size alone would hide a ' +
  'reversal.';

/** "938 kN / 3.12 kN" and, on a line of its own, "(Arm frame)". */
export function forceRangeText(r: RangesShown, system: UnitSystem): string {
  return `${formatValue(r.alongN, 'force', system)} / ${formatValue(r.acrossN, 'force', system)}\n(${r.frame} frame)`;
}

export function torqueRangeText(r: RangesShown, system: UnitSystem): string {
  return formatValue(r.torqueNm, 'moment', system);
}

/** For analyses stored before component ranges were: their magnitude range is not shown as a range. */
export function rangesNotRecorded(engineVersion: string): string {
  return `Not recorded (engine ${engineVersion})`;
}
