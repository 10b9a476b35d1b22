/**
 * Fatigue of each design detail over an analysis's load cases. Per case, the detail's stress history
 * (features/fatigue/detail-stress.ts) is counted by rainflow (ASTM E1049-85 §5.4.4) and summed by
 * Palmgren–Miner against the detail's EN 1993-1-9 §7 S-N curve:
 * - the operating cycle repeats block after block, so it is counted as a closed loop (`rainflowRepeating`):
 *   the damage of one run of the analysed cycle;
 * - a stop happens once, so each run is counted as it stands (`rainflow`, residue as half cycles). A stop
 *   case holds many runs (brakes biting at different arm angles); the worst run is taken, since a ride
 *   often stops at the same place (the station) and where is not known.
 * One ride cycle (design data `fatigue`) is `rideCycleS` of operating motion and `stopsPerRideCycle`
 * (default 1) service stops:
 *   D_ride = D_operating × rideCycleS / operating cycle duration + stopsPerRideCycle × D_service_stop.
 * An emergency stop is an event, not part of the ride cycle: its damage is reported per stop only.
 *
 * Pure TypeScript: the server's stored analysis, the phone's preview and the ride's design basis call
 * `fatigueOfLoadCases` on what features/loads/load-cases.ts gives them.
 */
import type { DesignData, FatigueDetail } from '@/features/loads/design-schema';
import type { CycleResult, LoadCaseKind } from '@/features/loads/engine';
import { detailLoadHistory, detailStressFactor } from '@/features/fatigue/detail-stress';
import {
  type RainflowArrays,
  type RainflowCycle,
  rainflowArrays,
  rainflowRepeatingArrays,
} from '@/features/fatigue/rainflow';
import { minerDamage } from '@/features/fatigue/sn-curve';

/** The Miner sum EN 1993-1-9 accepts unless the design says otherwise. */
export const DEFAULT_DAMAGE_LIMIT = 1;

/** A load case as load-cases.ts gives it (`CaseSummary`): its kind and every run analysed. */
export type FatigueCase = { kind: LoadCaseKind; results: readonly CycleResult[] };

export type DetailCaseFatigue = {
  kind: LoadCaseKind;
  /** The largest stress range counted in the case, MPa (before γFf). */
  maxRangeMPa: number;
  /** Miner damage of one run of the case: one operating cycle, one stop. */
  damage: number;
  /** This case's part of the damage per ride cycle (0 for an emergency stop: it is counted per event). */
  perRideCycle: number;
};

/** One detail over an analysis (the shape of features/records/analysis-schema.ts storedFatigueDetailSchema). */
export type DetailFatigue = {
  detail: number;
  joint: number;
  name: string;
  categoryMPa: number;
  shear: boolean;
  stressPerKnMPa: number;
  cases: DetailCaseFatigue[];
  damagePerRideCycle: number;
  damageLimit: number;
};

/**
 * Largest range and Miner damage of counted cycles for one detail, each range times `scale` (the stress
 * per unit of the counted load; 1 when the cycles are already in MPa).
 */
export function damageOfCycles(
  cycles: readonly RainflowCycle[] | RainflowArrays,
  detail: Pick<FatigueDetail, 'categoryMPa' | 'shear' | 'gammaFf' | 'gammaMf'>,
  scale = 1,
): { maxRangeMPa: number; damage: number } {
  const arrays = 'length' in cycles && !Array.isArray(cycles) ? (cycles as RainflowArrays) : null;
  const list = arrays ? null : (cycles as readonly RainflowCycle[]);
  const n = arrays ? arrays.length : (list?.length ?? 0);
  let maxRangeMPa = 0;
  const counted: { rangeMPa: number; count: number }[] = [];
  for (let i = 0; i < n; i++) {
    const rangeMPa = (arrays ? arrays.range[i] : (list as readonly RainflowCycle[])[i].range) * scale;
    if (!(rangeMPa > 0)) continue;
    maxRangeMPa = Math.max(maxRangeMPa, rangeMPa);
    counted.push({ rangeMPa, count: arrays ? arrays.count[i] : (list as readonly RainflowCycle[])[i].count });
  }
  if (counted.length === 0) return { maxRangeMPa, damage: 0 };
  const { damage } = minerDamage(counted, {
    categoryMPa: detail.categoryMPa,
    shear: detail.shear ?? false,
    gammaFf: detail.gammaFf ?? 1,
    gammaMf: detail.gammaMf ?? 1,
  });
  return { maxRangeMPa, damage };
}

/**
 * The counted load a detail follows, in N (N·m), per run and counting: rainflow is linear (ranges scale
 * with the load and do not change with its sign), so details that follow the same component share one
 * count and only their factors differ; a reaction torque counts as the torque itself.
 */
const countedLoads = new WeakMap<CycleResult, Map<string, RainflowArrays>>();

function countedLoad(
  result: CycleResult,
  detail: Pick<FatigueDetail, 'joint' | 'member' | 'component'>,
  repeating: boolean,
): RainflowArrays {
  const member = detail.component === 'torque' ? 'body' : detail.member;
  const key = `${detail.joint}|${member}|${detail.component}|${repeating ? 'r' : 'o'}`;
  let byKey = countedLoads.get(result);
  if (!byKey) {
    byKey = new Map();
    countedLoads.set(result, byKey);
  }
  let counted = byKey.get(key);
  if (!counted) {
    const load = detailLoadHistory(result, { joint: detail.joint, member, component: detail.component });
    counted = repeating ? rainflowRepeatingArrays(load) : rainflowArrays(load);
    byKey.set(key, counted);
  }
  return counted;
}

/** One case for one detail: the operating cycle as a repeating block, a stop once (its worst run). */
export function detailCaseDamage(
  detail: FatigueDetail,
  kind: LoadCaseKind,
  results: readonly CycleResult[],
): { maxRangeMPa: number; damage: number } {
  const perN = detailStressFactor(detail) / 1000;
  let maxRangeMPa = 0;
  let damage = 0;
  for (const result of results) {
    const one = damageOfCycles(countedLoad(result, detail, kind === 'operating'), detail, perN);
    maxRangeMPa = Math.max(maxRangeMPa, one.maxRangeMPa);
    damage = Math.max(damage, one.damage);
  }
  return { maxRangeMPa, damage };
}

/**
 * Damage per ride cycle from the damage of one operating cycle of `operatingS` seconds and of one service
 * stop: D_op × rideCycleS / operatingS + stopsPerRideCycle × D_stop.
 */
export function damagePerRideCycle(
  operatingDamage: number,
  operatingS: number,
  serviceStopDamage: number,
  fatigue: { rideCycleS: number; stopsPerRideCycle?: number },
): number {
  return (
    operatingDamage * (fatigue.rideCycleS / operatingS) + (fatigue.stopsPerRideCycle ?? 1) * serviceStopDamage
  );
}

/**
 * Every fatigue detail of the design over the analysed cases; empty when the design has no fatigue data.
 * `cases` lists the operating cycle (required for the ride cycle) and any stops, as load-cases.ts gives them.
 */
export function fatigueOfLoadCases(
  design: Pick<DesignData, 'fatigue'>,
  cases: readonly FatigueCase[],
): DetailFatigue[] {
  const data = design.fatigue;
  if (!data || data.details.length === 0) return [];
  const operating = cases.find((c) => c.kind === 'operating');
  const operatingS = operating?.results[0]?.durationS;
  if (!operating || !operatingS || !(operatingS > 0))
    throw new Error('Fatigue needs the operating cycle among the load cases');
  const stops = data.stopsPerRideCycle ?? 1;
  return data.details.map((detail, index) => {
    const perCase = cases
      .filter((c) => c.results.length > 0)
      .map((c): DetailCaseFatigue => {
        const { maxRangeMPa, damage } = detailCaseDamage(detail, c.kind, c.results);
        const perRideCycle =
          c.kind === 'operating'
            ? damage * (data.rideCycleS / operatingS)
            : c.kind === 'service_stop'
              ? stops * damage
              : 0;
        return { kind: c.kind, maxRangeMPa, damage, perRideCycle };
      });
    const of = (kind: LoadCaseKind) => perCase.find((c) => c.kind === kind)?.damage ?? 0;
    return {
      detail: index,
      joint: detail.joint,
      name: detail.name,
      categoryMPa: detail.categoryMPa,
      shear: detail.shear ?? false,
      stressPerKnMPa: detailStressFactor(detail),
      cases: perCase,
      damagePerRideCycle: damagePerRideCycle(of('operating'), operatingS, of('service_stop'), data),
      damageLimit: detail.damageLimit ?? DEFAULT_DAMAGE_LIMIT,
    };
  });
}

/**
 * The case that contributes most to a detail's damage per ride cycle; null when nothing does (no damage,
 * or an analysis stored without the split). Emergency stops never govern: they are not in the ride cycle.
 */
export function governingFatigueCase(detail: {
  cases: readonly { kind: LoadCaseKind; perRideCycle?: number }[];
}): LoadCaseKind | null {
  let top: { kind: LoadCaseKind; perRideCycle?: number } | null = null;
  for (const c of detail.cases)
    if ((c.perRideCycle ?? 0) > 0 && (!top || (c.perRideCycle ?? 0) > (top.perRideCycle ?? 0))) top = c;
  return top?.kind ?? null;
}
