/**
 * The report's pivot loads and fatigue tables as rows of text: peak force and torque per pivot with the
 * force's ranges along and across the body it carries (in that body's frame) and the torque's range, and
 * per fatigue detail its ranges per case and damage per ride cycle. Analyses stored before component
 * ranges say "not recorded" rather than the range of the force's size, which hides a reversal.
 */
import type { StoredAnalysis } from '@/db/server/inspections';
import {
  FATIGUE_CASE_WORDS,
  categoryText,
  cyclesToLimitText,
  formatDamage,
  governingFatigueCase,
} from '@/features/fatigue';
import {
  FORCE_RANGE_TITLE,
  TORQUE_RANGE_TITLE,
  forceRangeText,
  formatValue,
  rangesNotRecorded,
  torqueRangeText,
} from '@/features/loads';
import type { UnitSystem } from '@/lib/units';

export type TextTable = { head: string[]; rows: string[][]; widths: (number | string)[] };

const pivot = (a: StoredAnalysis, joint: number) => `P${joint + 1} · ${a.joints[joint]?.name ?? ''}`;

export function pivotLoadsTable(a: StoredAnalysis, system: UnitSystem): TextTable {
  const free = (joint: number) =>
    a.models?.some((m) => m.joint === joint && m.model === 'free_swing') ?? false;
  const rows = a.joints.map((j, i) => [
    pivot(a, i),
    formatValue(j.peakForceN, 'force', system),
    j.ranges ? forceRangeText(j.ranges, system) : rangesNotRecorded(a.engineVersion),
    free(i) ? 'None: free pin' : formatValue(Math.abs(j.peakTorqueNm), 'moment', system),
    free(i)
      ? 'None: free pin'
      : j.ranges
        ? torqueRangeText(j.ranges, system)
        : rangesNotRecorded(a.engineVersion),
  ]);
  return {
    head: ['Pivot', 'Peak force', FORCE_RANGE_TITLE, 'Peak torque', TORQUE_RANGE_TITLE],
    rows,
    widths: ['*', 65, 150, 65, 75],
  };
}

/** Null when the analysis has no fatigue (no fatigue design data, or made before engine 1.2.0). */
export function fatigueTable(a: StoredAnalysis, system: UnitSystem): TextTable | null {
  if (!a.fatigue?.length) return null;
  const rows = a.fatigue.map((d) => {
    const governing = governingFatigueCase(d);
    const emergency = d.cases.find((c) => c.kind === 'emergency_stop');
    return [
      `${pivot(a, d.joint)} · ${d.name}`,
      categoryText(d),
      d.cases
        .map((c) => `${FATIGUE_CASE_WORDS[c.kind]}: ${formatValue(c.maxRangeMPa * 1e6, 'stress', system)}`)
        .join('\n'),
      formatDamage(d.damagePerRideCycle),
      governing ? FATIGUE_CASE_WORDS[governing] : 'None: no damage',
      cyclesToLimitText(d.damagePerRideCycle, d.damageLimit),
      emergency ? formatDamage(emergency.damage) : '—',
    ];
  });
  return {
    head: [
      'Detail',
      'Category',
      'Largest stress range',
      'Damage per ride cycle',
      'Governing case',
      'Ride cycles to limit',
      'Per emergency stop',
    ],
    rows,
    widths: ['*', 58, 110, 62, 58, 58, 55],
  };
}
