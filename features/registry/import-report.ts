import { ApiRequestError } from '@/lib/api-errors';

/** One line of a rejected file's report: where (row and column when the file has them) and what. */
export type ReportLine = { row: number | null; column: string | null; where: string; message: string };

/**
 * The server's report of a rejected design file as lines to show. The API error's `path` says where in
 * the file ("row 4, mass_kg", "row 2", "mass_kg", "(file)", or a JSON path such as "pivots.0.name");
 * rows and columns are read back from it so the report can be shown as a table and sorted by row.
 */
export function importReport(err: unknown): { message: string; lines: ReportLine[] } | null {
  if (!(err instanceof ApiRequestError) || err.code !== 'import_invalid') return null;
  const lines = err.issues.map((issue): ReportLine => {
    const m = /^row (\d+)(?:, (.+))?$/.exec(issue.path);
    if (m) {
      const row = Number(m[1]);
      const column = m[2] ?? null;
      return {
        row,
        column,
        where: column ? `Row ${row}, column ${column}` : `Row ${row}`,
        message: issue.message,
      };
    }
    if (issue.path === '(file)')
      return { row: null, column: null, where: 'Whole file', message: issue.message };
    return { row: null, column: null, where: issue.path, message: issue.message };
  });
  // Rows in file order first, then the problems of the whole file.
  lines.sort((a, b) => (a.row ?? Infinity) - (b.row ?? Infinity));
  return { message: err.message, lines };
}

/** csv or json from the file's name; CSV when the name says nothing. */
export function formatFromName(name: string): 'csv' | 'json' {
  return /\.json$/i.test(name.trim()) ? 'json' : 'csv';
}

/** The export file's name, as the server's export names it: letters, digits and dashes. */
export function exportFileName(rideName: string, version: number, format: 'csv' | 'json'): string {
  const slug =
    rideName
      .normalize('NFKD')
      .replace(/[^A-Za-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .toLowerCase() || 'ride';
  return `${slug}-design-v${version}.${format}`;
}
