/**
 * Design data import and export: a CSV with one row per record (source, analysis settings, body, part,
 * pivot with its pin-check data, NDT plan, seat, motion, rider limit, fatigue settings, fatigue detail) and
 * the JSON form of the DesignData object. Pure TypeScript (no React,
 * no I/O), so the server and the app read and write files the same way. The format is described in
 * features/registry/README.md; the CSV's columns and which field each holds are one table
 * (`design-file/columns.ts`) that export, import and the error report all read.
 *
 * Import is all or nothing: every problem in a file is reported (CSV rows counted as in the file, 1 = the
 * header line), and a file with any problem gives no data. Export then import gives back the same data:
 * numbers are written with JavaScript's shortest round-trip form, text is quoted when it needs to be.
 */
import { designDataSchema, type DesignData } from '@/features/loads/design-schema';
import { designToCsv } from '@/features/registry/design-file/csv-export';
import { parseDesignCsv } from '@/features/registry/design-file/csv-import';
import type { ImportResult } from '@/features/registry/design-file/issues';
import type { DesignFileFormat } from '@/features/registry/schema/design-files';

export {
  DESIGN_CSV_COLUMNS,
  designCsvRecords,
  type DesignCsvColumn,
} from '@/features/registry/design-file/columns';
export {
  importErrorSchema,
  importIssueSchema,
  type ImportIssue,
  type ImportResult,
} from '@/features/registry/design-file/issues';
export { designToCsv, parseDesignCsv };
/** The field-by-field editor's model, in this chunk with the reader and writer it is built on. */
export * as designSheet from '@/features/registry/design-sheet';

/** The design data as JSON text: the DesignData object, indented for reading and diffing. */
export function designToJson(d: DesignData): string {
  return `${JSON.stringify(d, null, 2)}\n`;
}

/** Reads design data from JSON text (the DesignData object). Problems are named by their path in the data. */
export function parseDesignJson(text: string | unknown): ImportResult {
  let value: unknown = text;
  if (typeof text === 'string') {
    try {
      value = JSON.parse(text.replace(/^\uFEFF/, ''));
    } catch (error) {
      const message = error instanceof Error ? error.message : 'invalid JSON';
      return {
        ok: false,
        issues: [{ row: null, column: null, path: '(file)', message: `Not valid JSON: ${message}` }],
      };
    }
  }
  const parsed = designDataSchema.safeParse(value);
  if (parsed.success) return { ok: true, data: parsed.data };
  return {
    ok: false,
    issues: parsed.error.issues.map((i) => ({
      row: null,
      column: null,
      path: i.path.map(String).join('.') || '(file)',
      message: i.message,
    })),
  };
}

export function parseDesignFile(format: DesignFileFormat, content: string | unknown): ImportResult {
  if (format === 'csv') {
    if (typeof content !== 'string')
      return {
        ok: false,
        issues: [{ row: null, column: null, path: 'content', message: 'Send the CSV as text' }],
      };
    return parseDesignCsv(content);
  }
  return parseDesignJson(content);
}

export function designToFile(format: DesignFileFormat, d: DesignData): string {
  return format === 'csv' ? designToCsv(d) : designToJson(d);
}
