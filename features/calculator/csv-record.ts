/**
 * A measured motion record as text (pasted, or read from a .csv/.txt file): two columns, time in seconds
 * and either an angle or a rate, in the unit the inspector picks. Pure, so it is tested without a screen.
 *
 * Loggers and spreadsheets write these files in many ways, so the reader is lenient where it cannot be
 * wrong and strict where it could: separators (comma, semicolon, tab or spaces) are told apart per line,
 * a decimal comma is read where the separator is not a comma, lines before the first numeric row are
 * headers and `#` lines are comments; but once the numbers start, a row that is not two finite numbers
 * with a later time is an error naming its line, never skipped, because a silently dropped sample moves
 * the peak the engine finds.
 */
import { toSI } from '@/lib/units';

/** What the second column holds, as the inspector picks it. */
export type RecordColumn = 'angle_deg' | 'rate_rpm' | 'rate_deg_s';

export const recordColumnLabel: Record<RecordColumn, string> = {
  angle_deg: 'Angle (°)',
  rate_rpm: 'Rate (rpm)',
  rate_deg_s: 'Rate (°/s)',
};

/** The engine refuses more than this many samples in one profile (features/loads/schema.ts). */
export const MAX_RECORD_ROWS = 100_000;

export type RecordProblem = { line: number | null; message: string };

export type ParsedRecord =
  | {
      ok: true;
      timeS: number[];
      /** The second column in SI: rad for an angle, rad/s for a rate. */
      values: number[];
      /** Whether `values` are angles or rates. */
      quantity: 'angle' | 'rate';
      headerLines: number;
    }
  | { ok: false; problems: RecordProblem[] };

/** Only the first few bad lines are listed: a wrong file would otherwise bury the message. */
const MAX_PROBLEMS = 5;

function splitFields(line: string): { fields: string[]; decimalComma: boolean } {
  if (line.includes('\t')) return { fields: line.split('\t'), decimalComma: true };
  if (line.includes(';')) return { fields: line.split(';'), decimalComma: true };
  if (line.includes(',')) return { fields: line.split(','), decimalComma: false };
  return { fields: line.trim().split(/\s+/), decimalComma: false };
}

/** A field as a number: NaN when it is not one (empty, words, "1.2.3"), ±Infinity kept to be refused. */
function readNumber(field: string, decimalComma: boolean): number {
  let t = field.trim().replace(/^"(.*)"$/, '$1');
  if (decimalComma) t = t.replace(',', '.');
  if (t === '' || !/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$|^[+-]?inf(inity)?$/i.test(t)) return NaN;
  return /inf/i.test(t) ? (t.startsWith('-') ? -Infinity : Infinity) : Number(t);
}

function toSIValue(v: number, column: RecordColumn): number {
  switch (column) {
    case 'angle_deg':
      return toSI(v, 'angle', 'deg');
    case 'rate_rpm':
      return toSI(v, 'rate', 'rpm');
    case 'rate_deg_s':
      return toSI(v, 'rate', 'deg/s');
  }
}

/** Reads a record's text; `column` says what the second column is and in which unit. */
export function parseRecord(text: string, column: RecordColumn): ParsedRecord {
  const lines = text.split(/\r\n|\r|\n/);
  const timeS: number[] = [];
  const raw: number[] = [];
  const problems: RecordProblem[] = [];
  let headerLines = 0;
  let started = false;
  const refuse = (line: number, message: string) => {
    problems.push({ line, message });
  };

  for (let i = 0; i < lines.length && problems.length < MAX_PROBLEMS; i++) {
    const line = lines[i].trim();
    const n = i + 1;
    if (line === '' || line.startsWith('#')) continue;
    const { fields, decimalComma } = splitFields(line);
    const nums = fields.map((f) => readNumber(f, decimalComma));
    const allNumeric = nums.length >= 2 && nums.every((v) => !Number.isNaN(v));
    if (!started && !allNumeric) {
      headerLines++;
      continue;
    }
    started = true;
    if (fields.length !== 2) {
      refuse(
        n,
        `Line ${n} has ${fields.length === 1 ? 'one value' : `${fields.length} values`}; give two: time, then the ${quantityWord(column)}`,
      );
      continue;
    }
    const [t, v] = nums;
    if (Number.isNaN(t) || Number.isNaN(v)) {
      refuse(n, `Line ${n} is not two numbers: “${clip(line)}”`);
      continue;
    }
    if (!Number.isFinite(t) || !Number.isFinite(v)) {
      refuse(n, `Line ${n} has a value that is not finite`);
      continue;
    }
    if (timeS.length > 0 && !(t > timeS[timeS.length - 1])) {
      refuse(n, `Line ${n}: the time ${t} s does not come after ${timeS[timeS.length - 1]} s`);
      continue;
    }
    if (timeS.length >= MAX_RECORD_ROWS) {
      refuse(n, `More than ${MAX_RECORD_ROWS.toLocaleString('en')} samples: shorten the record`);
      break;
    }
    timeS.push(t);
    raw.push(v);
  }

  if (problems.length > 0) return { ok: false, problems };
  if (timeS.length === 0)
    return {
      ok: false,
      problems: [{ line: null, message: 'No rows of numbers found: give time and value, one sample a line' }],
    };
  const minimum = column === 'angle_deg' ? 5 : 4;
  if (timeS.length < minimum)
    return {
      ok: false,
      problems: [{ line: null, message: `Only ${timeS.length} samples: give at least ${minimum}` }],
    };
  return {
    ok: true,
    timeS,
    values: raw.map((v) => toSIValue(v, column)),
    quantity: column === 'angle_deg' ? 'angle' : 'rate',
    headerLines,
  };
}

function quantityWord(column: RecordColumn): string {
  return column === 'angle_deg' ? 'angle' : 'rate';
}

function clip(line: string): string {
  return line.length > 40 ? `${line.slice(0, 40)}…` : line;
}

/**
 * A short account of a good record for the screen: samples, span and sample rate. The rate is the median
 * interval's, so a gap or a stutter does not make the logger's rate read wrong.
 */
export function describeRecord(record: Extract<ParsedRecord, { ok: true }>): {
  samples: number;
  spanS: number;
  rateHz: number;
} {
  const t = record.timeS;
  const n = t.length;
  const steps = t
    .slice(1)
    .map((v, i) => v - t[i])
    .sort((a, b) => a - b);
  const mid = steps.length >> 1;
  const median = steps.length % 2 ? steps[mid] : (steps[mid - 1] + steps[mid]) / 2;
  return { samples: n, spanS: t[n - 1] - t[0], rateHz: median > 0 ? 1 / median : 0 };
}
