/**
 * The one `import()` of the design file's chunk on the web (features/registry/csv.ts: the reader, the
 * writer and the editor's model): the export's buttons and the editor both come here, so Metro keeps the
 * code in that chunk and out of the shared one every signed-in page loads.
 */
export type CsvModule = typeof import('@/features/registry/csv');

export const loadCsvModule = (): Promise<CsvModule> => import('@/features/registry/csv');
