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
