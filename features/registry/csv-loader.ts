/**
 * The design file's reader and writer and the editor's model (features/registry/csv.ts). A phone's bundle
 * is on the device, so it is imported as it is; the web loads it as a chunk of its own
 * (csv-loader.web.ts).
 */
import * as csv from '@/features/registry/csv';

export type CsvModule = typeof csv;

export const loadCsvModule = (): Promise<CsvModule> => Promise.resolve(csv);
