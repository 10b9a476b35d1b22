/** What other features and the server may use from loads: runs anywhere (no React Native). */
export {
  formatBesideLimit,
  formatLimit,
  formatRatio,
  formatValue,
  measuredSources,
} from '@/features/loads/format';
