/**
 * Design data from CSV text. Every problem is reported with its row (as in the file, 1 = the header line)
 * and column, and a file with any problem gives no data. Which cells a record fills, and how, comes from
 * the column table (`columns.ts`); this module adds the file's structure: the header, which records may
 * appear how often, and putting the schema's problems back on their cells.
 */
import { designDataSchema, partKinds, type DesignPart } from '@/features/loads/design-schema';
import {
  DESIGN_CSV_COLUMNS,
  type DesignCsvColumn,
  type FieldColumn,
  type RecordKind,
  columnOf,
  columnUnitWords,
  columnsOf,
  designCsvRecords,
  fieldsOf,
  recordFields,
} from '@/features/registry/design-file/columns';
import { type RawRecord, readCsv } from '@/features/registry/design-file/csv-text';
import {
  type ImportIssue,
  type ImportResult,
  cellPath,
  sortIssues,
} from '@/features/registry/design-file/issues';

type At = (row: number | null, column: string | null, message: string) => void;

/**
 * Where each field of the data came from in the file, to put a validation problem back on its cell. A
 * pivot's `ndt` holds the rows of its NDT plans, in the order of its list.
 */
type Origin = { row: number; kind?: DesignPart['kind']; ndt?: number[] };
type Origins = {
  source?: number;
  analysis?: number;
  bodies: Origin[];
  parts: Origin[];
  pivots: Origin[];
  seats: Origin[];
  motion: Origin[];
  rider: Partial<Record<'gx' | 'gz', number>>;
  fatigue?: number;
  details: Origin[];
};

type Fields = Record<string, unknown>;
/** The data as read, before the schema checks it. */
type Draft = {
  source?: Fields;
  analysis?: Fields;
  bodies: Fields[];
  parts: Fields[];
  pivots: Fields[];
  seats: Fields[];
  motion: Fields[];
  rider: Partial<Record<'gx' | 'gz', Fields>>;
  /** NDT plans as read, each with its row and the joint its pivot is found by once every row is read. */
  ndt: { row: number; joint: number | undefined; plan: Fields }[];
  fatigue?: Fields;
  details: Fields[];
};

/** The data's lists and the record kind of their rows. */
const listRecords = {
  bodies: 'body',
  parts: 'part',
  pivots: 'pivot',
  seats: 'seat',
  motion: 'motion',
} as const;
type ListName = keyof typeof listRecords;
const isList = (key: PropertyKey | undefined): key is ListName =>
  key === 'bodies' || key === 'parts' || key === 'pivots' || key === 'seats' || key === 'motion';

const numberPattern = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Reads design data from CSV text. Every problem is reported with its row (as in the file, 1 = header) and
 * column; any problem means no data.
 */
export function parseDesignCsv(text: string): ImportResult {
  const issues: ImportIssue[] = [];
  const at: At = (row, column, message) =>
    issues.push({ row, column, path: row === null ? (column ?? '(file)') : cellPath(row, column), message });

  const { records, error } = readCsv(text.replace(/^\uFEFF/, ''));
  if (error) {
    at(error.row, null, error.message);
    return { ok: false, issues };
  }
  if (records.length === 0) {
    at(
      null,
      null,
      'The file is empty: it needs the header and at least the source, body, part, pivot and motion rows',
    );
    return { ok: false, issues };
  }

  const [headerRecord, ...rows] = records;
  const header = readHeader(headerRecord, at);
  if (!header) return { ok: false, issues };

  const origins: Origins = {
    bodies: [],
    parts: [],
    pivots: [],
    seats: [],
    motion: [],
    rider: {},
    details: [],
  };
  const draft: Draft = {
    bodies: [],
    parts: [],
    pivots: [],
    seats: [],
    motion: [],
    rider: {},
    ndt: [],
    details: [],
  };
  for (const { row, cells } of rows) {
    if (cells.length > header.width && cells.slice(header.width).some((c) => c.trim() !== ''))
      at(row, null, `This row has ${cells.length} cells but the header has ${header.width} columns`);
    const r = rowReader(row, cells, header.columnIndex, at);
    const record = r.text('record').toLowerCase();
    if (!(designCsvRecords as readonly string[]).includes(record)) {
      at(
        row,
        'record',
        record === '' ? 'Required' : `Unknown record "${record}"; use one of ${designCsvRecords.join(', ')}`,
      );
      continue;
    }
    takeRecord(record as RecordKind, r, draft, origins, at);
  }
  if (!draft.source)
    at(null, 'record', 'No source row: add one with record "source", the document and its revision');
  placeNdtPlans(draft, origins, at);
  if (draft.details.length > 0 && !draft.fatigue)
    at(
      null,
      'record',
      'Fatigue detail rows need a fatigue row: add one with record "fatigue" and the ride cycle time (ride_cycle_s)',
    );
  const fatigue =
    draft.fatigue || draft.details.length > 0 ? { ...draft.fatigue, details: draft.details } : undefined;

  // Problems found while reading come first; the schema then checks everything it can still see.
  const parsed = designDataSchema.safeParse({
    source: draft.source,
    ...draft.analysis,
    bodies: draft.bodies,
    parts: draft.parts,
    pivots: draft.pivots,
    seats: draft.seats,
    motion: draft.motion,
    rider: draft.rider,
    ...(fatigue ? { fatigue } : {}),
  });
  if (!parsed.success)
    addSchemaIssues(parsed.error.issues, origins, issues, {
      source: draft.source !== undefined,
      fatigue: draft.fatigue !== undefined,
    });
  if (issues.length > 0 || !parsed.success) return { ok: false, issues: sortIssues(issues) };
  return { ok: true, data: parsed.data };
}

/** The header's columns by position; nothing when the header has a problem (each one reported). */
function readHeader(
  headerRecord: RawRecord,
  at: At,
): { width: number; columnIndex: Map<DesignCsvColumn, number> } | null {
  const header = headerRecord.cells.map((h) => h.trim().toLowerCase());
  if (header.length === 1 && header[0].includes(';')) {
    at(
      headerRecord.row,
      null,
      'Columns are separated by semicolons: save the file with commas between columns',
    );
    return null;
  }
  let problems = 0;
  const problem: At = (row, column, message) => {
    problems++;
    at(row, column, message);
  };
  const known = new Set<string>(DESIGN_CSV_COLUMNS);
  const columnIndex = new Map<DesignCsvColumn, number>();
  header.forEach((name, i) => {
    if (name === '') return;
    if (!known.has(name))
      problem(
        headerRecord.row,
        name,
        `Unknown column "${name}"; see the list of columns in the format description`,
      );
    else if (columnIndex.has(name as DesignCsvColumn))
      problem(headerRecord.row, name, `Column "${name}" appears twice`);
    else columnIndex.set(name as DesignCsvColumn, i);
  });
  if (!columnIndex.has('record')) problem(headerRecord.row, 'record', 'The header needs a "record" column');
  return problems > 0 ? null : { width: header.length, columnIndex };
}

/** One row's cells as values, each problem reported on its cell. */
function rowReader(row: number, cells: string[], columnIndex: Map<DesignCsvColumn, number>, at: At) {
  const cell = (c: DesignCsvColumn) => {
    const i = columnIndex.get(c);
    return i === undefined ? '' : (cells[i] ?? '');
  };
  const text = (c: DesignCsvColumn) => cell(c).trim();
  const numberAt = (c: DesignCsvColumn, required: boolean): number | undefined => {
    const raw = text(c);
    if (raw === '') {
      if (required) at(row, c, 'Required');
      return undefined;
    }
    if (!numberPattern.test(raw)) {
      at(
        row,
        c,
        /^[+-]?\d+,\d+$/.test(raw)
          ? `"${raw}" uses a decimal comma: write ${raw.replace(',', '.')}`
          : `"${raw}" is not a number (${columnUnitWords[c] ?? 'SI units'}, point as the decimal mark)`,
      );
      return undefined;
    }
    return Number(raw);
  };
  const indexAt = (c: 'body' | 'joint'): number | undefined => {
    const raw = text(c);
    if (raw === '') {
      at(row, c, 'Required');
      return undefined;
    }
    if (!/^\d+$/.test(raw)) {
      at(row, c, `"${raw}" is not a ${c} number (0, 1, 2…)`);
      return undefined;
    }
    return Number(raw);
  };
  const pair = (x: DesignCsvColumn, y: DesignCsvColumn, required: boolean): [number, number] | undefined => {
    const a = numberAt(x, required);
    const b = numberAt(y, required);
    if (a === undefined && b === undefined) return undefined;
    if (a === undefined || b === undefined) {
      if (!required) at(row, a === undefined ? x : y, `Give both ${x} and ${y}, or neither`);
      return undefined;
    }
    return [a, b];
  };
  /** yes/no (or true/false); empty leaves the field out. */
  const flagAt = (c: DesignCsvColumn): boolean | undefined => {
    const raw = text(c).toLowerCase();
    if (raw === '') return undefined;
    if (raw === 'yes' || raw === 'true') return true;
    if (raw === 'no' || raw === 'false') return false;
    at(row, c, `"${text(c)}" is not yes or no`);
    return undefined;
  };
  const valueOf = (f: FieldColumn): unknown => {
    switch (f.read) {
      case 'text':
        return f.optional && text(f.column) === '' ? undefined : cell(f.column);
      case 'word': {
        const word = text(f.column).toLowerCase();
        return f.optional && word === '' ? undefined : word;
      }
      case 'code':
        return text(f.column).toUpperCase();
      case 'index':
        return indexAt(f.column);
      case 'number':
        return numberAt(f.column, !f.optional);
      case 'flag':
        return flagAt(f.column);
      case 'pair':
        return pair(f.column[0], f.column[1], !f.optional);
    }
  };
  return {
    row,
    text,
    indexAt,
    /** A value in a column the record does not use is an error: it was most likely typed one column off. */
    onlyUsed(allowed: readonly DesignCsvColumn[], what: string) {
      for (const [c] of columnIndex)
        if (c !== 'record' && !allowed.includes(c) && text(c) !== '')
          at(row, c, `Leave empty in ${what} rows`);
    },
    /**
     * The record's fields in the table's order; an optional one with empty cells is left out. A group's
     * fields make an object of the group's name, there only when one of its cells is filled.
     */
    fields(list: readonly FieldColumn[]): Fields {
      const read = (fields: readonly FieldColumn[]) => {
        const value: Fields = {};
        for (const f of fields) {
          const v = valueOf(f);
          if (v !== undefined || !f.optional) value[f.field] = v;
        }
        return value;
      };
      const value = read(list.filter((f) => f.group === undefined));
      const groups = new Set(list.flatMap((f) => (f.group ? [f.group] : [])));
      for (const group of groups) {
        const fields = list.filter((f) => f.group === group);
        const filled = fields.some((f) =>
          (typeof f.column === 'string' ? [f.column] : f.column).some((c) => text(c) !== ''),
        );
        if (filled) value[group] = read(fields);
      }
      return value;
    },
  };
}
type RowReader = ReturnType<typeof rowReader>;

/** Adds one row's record to the draft, keeping the rules on how many of each a file may hold. */
function takeRecord(record: RecordKind, r: RowReader, draft: Draft, origins: Origins, at: At) {
  const { row } = r;
  switch (record) {
    case 'source':
    case 'analysis': {
      r.onlyUsed(columnsOf(record), record);
      const first = origins[record];
      if (first !== undefined)
        at(row, 'record', `Only one ${record} row is allowed (the first is on row ${first})`);
      else {
        origins[record] = row;
        draft[record] = r.fields(recordFields[record]);
      }
      return;
    }
    case 'body': {
      r.onlyUsed(columnsOf('body'), 'body');
      const index = r.indexAt('body');
      if (index !== undefined && index !== draft.bodies.length)
        at(row, 'body', `Bodies are numbered in order from 0: expected ${draft.bodies.length} here`);
      draft.bodies.push(r.fields(recordFields.body));
      origins.bodies.push({ row });
      return;
    }
    case 'part': {
      const kind = r.text('kind').toLowerCase();
      if (!(partKinds as readonly string[]).includes(kind)) {
        at(
          row,
          'kind',
          kind === '' ? 'Required' : `Unknown part kind "${kind}"; use one of ${partKinds.join(', ')}`,
        );
        return;
      }
      const k = kind as DesignPart['kind'];
      r.onlyUsed(columnsOf('part', k), `${k} part`);
      draft.parts.push(r.fields(fieldsOf('part', k)));
      origins.parts.push({ row, kind: k });
      return;
    }
    case 'pivot':
    case 'seat':
    case 'motion': {
      const list = record === 'pivot' ? 'pivots' : record === 'seat' ? 'seats' : 'motion';
      r.onlyUsed(columnsOf(record), record);
      draft[list].push(r.fields(recordFields[record]));
      origins[list].push({ row });
      return;
    }
    case 'ndt': {
      r.onlyUsed(columnsOf('ndt'), 'ndt');
      draft.ndt.push({ row, joint: r.indexAt('joint'), plan: r.fields(recordFields.ndt) });
      return;
    }
    case 'fatigue': {
      r.onlyUsed(columnsOf('fatigue'), 'fatigue');
      if (origins.fatigue !== undefined)
        at(row, 'record', `Only one fatigue row is allowed (the first is on row ${origins.fatigue})`);
      else {
        origins.fatigue = row;
        draft.fatigue = r.fields(recordFields.fatigue);
      }
      return;
    }
    case 'fatigue_detail': {
      r.onlyUsed(columnsOf('fatigue_detail'), 'fatigue_detail');
      draft.details.push(r.fields(recordFields.fatigue_detail));
      origins.details.push({ row });
      return;
    }
    case 'rider': {
      r.onlyUsed(columnsOf('rider'), 'rider');
      const axis = r.text('axis').toLowerCase();
      if (axis !== 'gx' && axis !== 'gz') {
        at(row, 'axis', axis === '' ? 'Required: gx or gz' : `Unknown axis "${axis}"; use gx or gz`);
        return;
      }
      if (origins.rider[axis] !== undefined) {
        at(row, 'axis', `Only one ${axis} row is allowed (the first is on row ${origins.rider[axis]})`);
        return;
      }
      origins.rider[axis] = row;
      draft.rider[axis] = r.fields(recordFields.rider);
      return;
    }
  }
}

/**
 * Each NDT plan joins the list of the pivot of its joint (rows of one joint keep their order); a plan whose
 * joint has no pivot row is reported on its joint cell.
 */
function placeNdtPlans(draft: Draft, origins: Origins, at: At) {
  for (const { row, joint, plan } of draft.ndt) {
    if (joint === undefined) continue;
    const k = draft.pivots.findIndex((p) => p.joint === joint);
    if (k < 0) {
      at(row, 'joint', `No pivot row for joint ${joint}: an NDT plan belongs to a pivot`);
      continue;
    }
    const plans = (draft.pivots[k].ndt ??= []) as Fields[];
    plans.push(plan);
    (origins.pivots[k].ndt ??= []).push(row);
  }
}

/** The schema's problems, each on its cell; a cell already reported while reading is not reported again. */
function addSchemaIssues(
  schemaIssues: readonly { path: PropertyKey[]; message: string }[],
  origins: Origins,
  issues: ImportIssue[],
  has: { source: boolean; fatigue: boolean },
) {
  const seen = new Set(issues.map((i) => `${i.row}:${i.column}`));
  for (const issue of schemaIssues) {
    const { row, column } = placeOf(issue.path, origins);
    // A cell already reported while reading (not a number, required) needs no second message.
    if (row !== null && seen.has(`${row}:${column}`)) continue;
    // A missing source or fatigue row is reported once, as such, not again field by field.
    if (row === null && issue.path[0] === 'source' && !has.source) continue;
    if (row === null && issue.path[0] === 'fatigue' && issue.path[1] !== 'details' && !has.fatigue) continue;
    issues.push({
      row,
      column,
      path: row !== null ? cellPath(row, column) : issue.path.join('.') || '(file)',
      message: issue.message,
    });
  }
}

/** A schema problem's path in the data → its row and column in the CSV. */
function placeOf(path: PropertyKey[], origins: Origins): { row: number | null; column: string | null } {
  const [head, second, third, fourth] = path;
  if (head === 'source')
    return { row: origins.source ?? null, column: columnOf(recordFields.source, second, undefined) };
  if (head === 'gravityMS2' || head === 'nearMargin')
    return { row: origins.analysis ?? null, column: columnOf(recordFields.analysis, head, undefined) };
  if (head === 'rider' && (second === 'gx' || second === 'gz'))
    return { row: origins.rider[second] ?? null, column: columnOf(recordFields.rider, third, undefined) };
  if (head === 'fatigue') {
    if (second !== 'details')
      return { row: origins.fatigue ?? null, column: columnOf(recordFields.fatigue, second, undefined) };
    const origin = typeof third === 'number' ? origins.details[third] : undefined;
    return {
      row: origin?.row ?? null,
      column: origin ? columnOf(recordFields.fatigue_detail, fourth, undefined) : null,
    };
  }
  if (head === 'pivots' && third === 'ndt') {
    const pivot = typeof second === 'number' ? origins.pivots[second] : undefined;
    const row = typeof fourth === 'number' ? pivot?.ndt?.[fourth] : undefined;
    if (row === undefined) return { row: pivot?.row ?? null, column: null };
    return { row, column: columnOf(recordFields.ndt, path[4], undefined) };
  }
  if (isList(head)) {
    const origin = typeof second === 'number' ? origins[head][second] : undefined;
    return {
      row: origin?.row ?? null,
      column: origin ? columnOf(fieldsOf(listRecords[head], origin.kind), third, fourth) : null,
    };
  }
  return { row: null, column: null };
}
