/** What other features may render or hook into from loads (needs the app's runtime). */
export { CycleResults } from '@/features/loads/cycle-results';
export { CycleWarnings } from '@/features/loads/cycle-warnings';
export { EnvelopeTable } from '@/features/loads/envelope-table';
export { LoadCasesTable, type CasesShown } from '@/features/loads/load-cases-table';
