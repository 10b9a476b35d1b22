/**
 * The running log as a CSV file: a header naming the columns (`day`, then any of `cycles`, `hours`, `note`,
 * in any order), then one row per day. Read whole: every problem is reported with its file row (1 = the
 * header) and column, and a file with any problem gives no entries, so an import is all or nothing.
 */
import { runningLogEntrySchema, type RunningLogEntry } from '@/features/pivot-life/schema';
import { csvCell, readCsv } from '@/features/registry';
import { addDays, isRealIsoDay } from '@/lib/dates';

export const RUNNING_LOG_CSV_COLUMNS = ['day', 'cycles', 'hours', 'note'] as const;
type Column = (typeof RUNNING_LOG_CSV_COLUMNS)[number];

/** At most ten years of days in one file. */
export const RUNNING_LOG_CSV_MAX_ROWS = 3660;

export type RunningLogIssue = { path: string; message: string };
export type RunningLogCsvResult =
  { ok: true; entries: RunningLogEntry[] } | { ok: false; issues: RunningLogIssue[] };

/**
 * Problems with a day beyond its shape: a date that does not exist, or one not yet run (a day ahead of the
 * server's is allowed, for operators east of UTC).
 */
export function dayProblem(day: string, today: string): string | null {
  if (!isRealIsoDay(day)) return 'Not a real date';
  if (day > addDays(today, 1)) return 'A day not yet run';
  return null;
}

const issue = (row: number, field: string, message: string): RunningLogIssue => ({
  path: `rows.${row}.${field}`,
  message: `Row ${row}, ${field}: ${message}`,
});

function numberCell(text: string): number | undefined | 'bad' {
  const t = text.trim();
  if (t === '') return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : 'bad';
}

function headerOf(cells: string[]): { columns: Map<Column, number>; issues: RunningLogIssue[] } {
  const columns = new Map<Column, number>();
  const issues: RunningLogIssue[] = [];
  cells.forEach((raw, k) => {
    const name = raw
      .trim()
      .replace(/^\uFEFF/, '')
      .toLowerCase();
    if (!(RUNNING_LOG_CSV_COLUMNS as readonly string[]).includes(name))
      issues.push(
        issue(1, name || `column ${k + 1}`, `Unknown column; use ${RUNNING_LOG_CSV_COLUMNS.join(',')}`),
      );
    else if (columns.has(name as Column)) issues.push(issue(1, name, 'Column given twice'));
    else columns.set(name as Column, k);
  });
  if (!columns.has('day')) issues.push(issue(1, 'day', 'The header must name a day column'));
  if (!columns.has('cycles') && !columns.has('hours'))
    issues.push(issue(1, 'cycles', 'The header must name a cycles or an hours column'));
  return { columns, issues };
}

export function parseRunningLogCsv(text: string, today: string): RunningLogCsvResult {
  const read = readCsv(text);
  if (read.error) return { ok: false, issues: [issue(read.error.row, 'file', read.error.message)] };
  const [head, ...rows] = read.records;
  if (!head)
    return { ok: false, issues: [issue(1, 'day', 'The file is empty: give a header day,cycles,hours,note')] };
  const { columns, issues } = headerOf(head.cells);
  if (issues.length) return { ok: false, issues };
  if (rows.length === 0) return { ok: false, issues: [issue(2, 'day', 'No days in the file')] };
  if (rows.length > RUNNING_LOG_CSV_MAX_ROWS)
    return {
      ok: false,
      issues: [
        issue(
          rows[RUNNING_LOG_CSV_MAX_ROWS].row,
          'file',
          `At most ${RUNNING_LOG_CSV_MAX_ROWS} days per file`,
        ),
      ],
    };

  const entries: RunningLogEntry[] = [];
  const seen = new Map<string, number>();
  for (const { row, cells } of rows) {
    const cell = (c: Column) => (columns.has(c) ? (cells[columns.get(c)!] ?? '') : '');
    if (cells.length > head.cells.length) {
      issues.push(
        issue(
          row,
          'file',
          `${cells.length} cells for ${head.cells.length} columns: quote a note holding a comma`,
        ),
      );
      continue;
    }
    const cycles = numberCell(cell('cycles'));
    const hours = numberCell(cell('hours'));
    const rowIssues: RunningLogIssue[] = [];
    if (cycles === 'bad') rowIssues.push(issue(row, 'cycles', 'Must be a whole number'));
    if (hours === 'bad') rowIssues.push(issue(row, 'hours', 'Must be a number'));
    const note = cell('note').trim();
    const candidate = {
      day: cell('day').trim(),
      cycles: cycles === 'bad' ? undefined : cycles,
      hours: hours === 'bad' ? undefined : hours,
      note: note === '' ? undefined : note,
    };
    const parsed = runningLogEntrySchema.safeParse(candidate);
    if (!parsed.success && rowIssues.length === 0)
      for (const i of parsed.error.issues) rowIssues.push(issue(row, String(i.path[0] ?? 'day'), i.message));
    if (parsed.success) {
      const problem = dayProblem(parsed.data.day, today);
      const earlier = seen.get(parsed.data.day);
      if (problem) rowIssues.push(issue(row, 'day', problem));
      else if (earlier !== undefined) rowIssues.push(issue(row, 'day', `The same day as row ${earlier}`));
      seen.set(parsed.data.day, row);
      if (rowIssues.length === 0) entries.push(parsed.data);
    }
    issues.push(...rowIssues);
  }
  return issues.length ? { ok: false, issues } : { ok: true, entries };
}

/** The log as a CSV file in the same columns, for a round trip (oldest first). */
export function runningLogToCsv(entries: readonly RunningLogEntry[]): string {
  const lines = [RUNNING_LOG_CSV_COLUMNS.join(',')];
  for (const e of [...entries].sort((a, b) => (a.day < b.day ? -1 : 1)))
    lines.push(
      [
        e.day,
        e.cycles === undefined ? '' : String(e.cycles),
        e.hours === undefined ? '' : String(e.hours),
        csvCell(e.note ?? ''),
      ].join(','),
    );
  return `${lines.join('\n')}\n`;
}
