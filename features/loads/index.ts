/** What other features may use from loads: everything else in the folder is its own. */
export { CycleResults } from '@/features/loads/cycle-results';
export { EnvelopeTable } from '@/features/loads/envelope-table';
export {
  formatBesideLimit,
  formatLimit,
  formatRatio,
  formatValue,
  measuredSources,
} from '@/features/loads/format';
