/** The fatigue feature's public API: pure TypeScript (no React, no I/O), used by the server and the app. */

export {
  closedLoop,
  peaksAndValleys,
  rainflow,
  rainflowArrays,
  rainflowRepeating,
  rainflowRepeatingArrays,
} from '@/features/fatigue/rainflow';
export type { RainflowArrays, RainflowCycle } from '@/features/fatigue/rainflow';

export { N_C, N_D, N_L, cyclesToFailure, minerDamage, snCurve } from '@/features/fatigue/sn-curve';
export type { MinerCycle, MinerOptions, MinerResult, SnCurve, SnOptions } from '@/features/fatigue/sn-curve';

export { detailLoadHistory, detailStressFactor, detailStressHistory } from '@/features/fatigue/detail-stress';
export {
  DEFAULT_DAMAGE_LIMIT,
  damageOfCycles,
  damagePerRideCycle,
  detailCaseDamage,
  fatigueOfLoadCases,
  governingFatigueCase,
} from '@/features/fatigue/detail-damage';
export type { DetailCaseFatigue, DetailFatigue, FatigueCase } from '@/features/fatigue/detail-damage';
export {
  FATIGUE_BASIS,
  FATIGUE_CASE_WORDS,
  categoryText,
  cyclesToLimitText,
  formatDamage,
  powerOfTen,
} from '@/features/fatigue/damage-format';
