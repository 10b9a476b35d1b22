/** What the server and other features may use from the logbook: runs anywhere (no React Native). */
export { logbookToCsv, LOGBOOK_CSV_COLUMNS } from '@/features/logbook/csv';
export { filterWords } from '@/features/logbook/filter-words';
export { matchesText, mergeLogbook, newestFirst, pageOf } from '@/features/logbook/merge';
