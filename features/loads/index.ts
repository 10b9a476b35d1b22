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
