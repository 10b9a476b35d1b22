/** The logbook's screen, for the routes (through the rides bundle). */
export { LogbookScreen } from '@/features/logbook/logbook-screen';
