/** What other features and the server may use from loads: runs anywhere (no React Native). */
export {
  formatBesideLimit,
  formatLimit,
  formatRatio,
  formatValue,
  measuredSources,
  sortWarnings,
  warningSubject,
} from '@/features/loads/format';
export {
  LOAD_CASE_LABEL,
  analyseLoadCases,
  designStops,
  governingText,
  governingItem,
  withLoadCases,
  type CaseSummary,
  type LoadCasesResult,
  type StopSpec,
} from '@/features/loads/load-cases';
export {
  FORCE_RANGE_TITLE,
  RANGES_NOTE,
  TORQUE_RANGE_TITLE,
  forceRangeText,
  jointRangesOf,
  rangesNotRecorded,
  torqueRangeText,
  type RangesShown,
} from '@/features/loads/joint-ranges';
