/**
 * Design data import and export: a CSV with one row per record (source, analysis settings, body, part,
 * pivot, seat, motion, rider limit) and the JSON form of the DesignData object. Pure TypeScript (no React,
 * no I/O), so the server and the app read and write files the same way. The format is described in
 * features/registry/README.md.
 *
 * Import is all or nothing: every problem in a file is reported (CSV rows counted as in the file, 1 = the
 * header line), and a file with any problem gives no data. Export then import gives back the same data:
 * numbers are written with JavaScript's shortest round-trip form, text is quoted when it needs to be.
 */
import { z } from 'zod';

import {
  designDataSchema,
  partKinds,
  type DesignData,
  type DesignPart,
} from '@/features/loads/design-schema';
import type { DesignFileFormat } from '@/features/registry/schema/design-files';

/** One problem in an imported file. `row` and `column` are set when the problem has a place in a CSV. */
export type ImportIssue = { row: number | null; column: string | null; path: string; message: string };

export type ImportResult = { ok: true; data: DesignData } | { ok: false; issues: ImportIssue[] };

export const designCsvRecords = [
  'source',
  'analysis',
  'body',
  'part',
  'pivot',
  'seat',
  'motion',
  'rider',
] as const;
type RecordKind = (typeof designCsvRecords)[number];

/** The header, in the order export writes it. Import accepts any order and any subset containing `record`. */
export const DESIGN_CSV_COLUMNS = [
  'record',
  'body',
  'joint',
  'name',
  'kind',
  'mass_kg',
  'x_m',
  'y_m',
  'to_x_m',
  'to_y_m',
  'radius_m',
  'width_m',
  'height_m',
  'inertia_kg_m2',
  'tip_x_m',
  'tip_y_m',
  'shear',
  'bearing_length_m',
  'nominal_diameter_m',
  'minimum_diameter_m',
  'max_clearance_m',
  'max_shear_stress_pa',
  'max_bearing_pressure_pa',
  'max_force_n',
  'max_torque_nm',
  'spine_angle_rad',
  'facing',
  'rpm',
  'amplitude_rad',
  'period_s',
  'angle_rad',
  'max_rate_rad_s',
  'max_amplitude_rad',
  'axis',
  'min_g',
  'max_g',
  'document',
  'revision',
  'gravity_m_s2',
  'near_margin',
] as const;
export type DesignCsvColumn = (typeof DESIGN_CSV_COLUMNS)[number];

type Cells = Partial<Record<DesignCsvColumn, string>>;

// ——— CSV text ———

const needsQuotes = /[",\r\n]|^\s|\s$/;
function csvCell(value: string): string {
  return needsQuotes.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** Shortest text that reads back as the same number, −0 included. */
function numberText(n: number | undefined): string {
  if (n === undefined) return '';
  return Object.is(n, -0) ? '-0' : String(n);
}

type RawRecord = { row: number; cells: string[] };

/**
 * RFC 4180 records: commas between cells, double quotes around cells holding commas, quotes or line
 * breaks, "" for a quote inside. A record's row is the file line it starts on. Blank lines are skipped.
 */
function readCsv(text: string): { records: RawRecord[]; error?: { row: number; message: string } } {
  const records: RawRecord[] = [];
  let cells: string[] = [];
  let cell = '';
  let quoted = false;
  let cellStarted = false;
  let line = 1;
  let recordLine = 1;
  let i = 0;
  const endCell = () => {
    cells.push(cell);
    cell = '';
    cellStarted = false;
  };
  const endRecord = () => {
    endCell();
    if (!(cells.length === 1 && cells[0].trim() === '')) records.push({ row: recordLine, cells });
    cells = [];
  };
  while (i < text.length) {
    const c = text[i];
    if (quoted) {
      if (c === '"') {
        if (text[i + 1] === '"') {
          cell += '"';
          i += 2;
          continue;
        }
        quoted = false;
        i++;
        continue;
      }
      if (c === '\n') line++;
      cell += c;
      i++;
      continue;
    }
    if (c === '"') {
      if (cellStarted && cell.trim() !== '')
        return {
          records,
          error: { row: line, message: 'A quote inside an unquoted cell: quote the whole cell' },
        };
      cell = '';
      quoted = true;
      cellStarted = true;
      i++;
      continue;
    }
    if (c === ',') {
      endCell();
      i++;
      continue;
    }
    if (c === '\r' || c === '\n') {
      endRecord();
      i += c === '\r' && text[i + 1] === '\n' ? 2 : 1;
      line++;
      recordLine = line;
      continue;
    }
    cell += c;
    cellStarted = true;
    i++;
  }
  if (quoted) return { records, error: { row: recordLine, message: 'A quoted cell is never closed' } };
  if (cellStarted || cells.length > 0) endRecord();
  return { records };
}

// ——— export ———

function partCells(p: DesignPart): Cells {
  const base: Cells = { body: String(p.body), name: p.name, kind: p.kind, mass_kg: numberText(p.massKg) };
  switch (p.kind) {
    case 'rod':
      return {
        ...base,
        x_m: numberText(p.fromM[0]),
        y_m: numberText(p.fromM[1]),
        to_x_m: numberText(p.toM[0]),
        to_y_m: numberText(p.toM[1]),
      };
    case 'point':
      return { ...base, x_m: numberText(p.atM[0]), y_m: numberText(p.atM[1]) };
    case 'plate':
    case 'counterweight':
      return {
        ...base,
        x_m: numberText(p.centreM[0]),
        y_m: numberText(p.centreM[1]),
        width_m: numberText(p.widthM),
        height_m: numberText(p.heightM),
      };
    case 'custom':
      return {
        ...base,
        x_m: numberText(p.cgM[0]),
        y_m: numberText(p.cgM[1]),
        inertia_kg_m2: numberText(p.inertiaCgKgM2),
      };
    default:
      return {
        ...base,
        x_m: numberText(p.centreM[0]),
        y_m: numberText(p.centreM[1]),
        radius_m: numberText(p.radiusM),
      };
  }
}

/** The design data as CSV text (header first, CRLF line ends, as spreadsheets expect). */
export function designToCsv(d: DesignData): string {
  const rows: [RecordKind, Cells][] = [];
  rows.push(['source', { document: d.source.document, revision: d.source.revision }]);
  if (d.gravityMS2 !== undefined || d.nearMargin !== undefined)
    rows.push([
      'analysis',
      { gravity_m_s2: numberText(d.gravityMS2), near_margin: numberText(d.nearMargin) },
    ]);
  d.bodies.forEach((b, i) =>
    rows.push([
      'body',
      { body: String(i), name: b.name, tip_x_m: numberText(b.tipM?.[0]), tip_y_m: numberText(b.tipM?.[1]) },
    ]),
  );
  d.parts.forEach((p) => rows.push(['part', partCells(p)]));
  d.pivots.forEach((p) =>
    rows.push([
      'pivot',
      {
        joint: String(p.joint),
        name: p.name,
        shear: p.shear,
        bearing_length_m: numberText(p.bearingLengthM),
        nominal_diameter_m: numberText(p.nominalDiameterM),
        minimum_diameter_m: numberText(p.minimumDiameterM),
        max_clearance_m: numberText(p.maxClearanceM),
        max_shear_stress_pa: numberText(p.maxShearStressPa),
        max_bearing_pressure_pa: numberText(p.maxBearingPressurePa),
        max_force_n: numberText(p.maxForceN),
        max_torque_nm: numberText(p.maxTorqueNm),
      },
    ]),
  );
  d.seats.forEach((s) =>
    rows.push([
      'seat',
      {
        body: String(s.body),
        name: s.name,
        x_m: numberText(s.positionM[0]),
        y_m: numberText(s.positionM[1]),
        spine_angle_rad: numberText(s.spineAngleRad),
        facing: s.facing ?? '',
      },
    ]),
  );
  d.motion.forEach((m) =>
    rows.push([
      'motion',
      {
        joint: String(m.joint),
        kind: m.kind,
        rpm: numberText(m.rpm),
        amplitude_rad: numberText(m.amplitudeRad),
        period_s: numberText(m.periodS),
        angle_rad: numberText(m.angleRad),
        max_rate_rad_s: numberText(m.maxRateRadS),
        max_amplitude_rad: numberText(m.maxAmplitudeRad),
      },
    ]),
  );
  for (const axis of ['gx', 'gz'] as const) {
    const limit = d.rider[axis];
    if (limit) rows.push(['rider', { axis, min_g: numberText(limit.min), max_g: numberText(limit.max) }]);
  }
  const lines = [DESIGN_CSV_COLUMNS.join(',')];
  for (const [record, cells] of rows)
    lines.push(DESIGN_CSV_COLUMNS.map((c) => (c === 'record' ? record : csvCell(cells[c] ?? ''))).join(','));
  return `${lines.join('\r\n')}\r\n`;
}

/** The design data as JSON text: the DesignData object, indented for reading and diffing. */
export function designToJson(d: DesignData): string {
  return `${JSON.stringify(d, null, 2)}\n`;
}

// ——— import ———

/** Which columns each record (and each part kind, each motion kind) may fill. */
const recordColumns: Record<RecordKind, readonly DesignCsvColumn[]> = {
  source: ['document', 'revision'],
  analysis: ['gravity_m_s2', 'near_margin'],
  body: ['body', 'name', 'tip_x_m', 'tip_y_m'],
  part: ['body', 'name', 'kind', 'mass_kg'],
  pivot: [
    'joint',
    'name',
    'shear',
    'bearing_length_m',
    'nominal_diameter_m',
    'minimum_diameter_m',
    'max_clearance_m',
    'max_shear_stress_pa',
    'max_bearing_pressure_pa',
    'max_force_n',
    'max_torque_nm',
  ],
  seat: ['body', 'name', 'x_m', 'y_m', 'spine_angle_rad', 'facing'],
  motion: [
    'joint',
    'kind',
    'rpm',
    'amplitude_rad',
    'period_s',
    'angle_rad',
    'max_rate_rad_s',
    'max_amplitude_rad',
  ],
  rider: ['axis', 'min_g', 'max_g'],
};
const partKindColumns: Record<DesignPart['kind'], readonly DesignCsvColumn[]> = {
  rod: ['x_m', 'y_m', 'to_x_m', 'to_y_m'],
  point: ['x_m', 'y_m'],
  disc: ['x_m', 'y_m', 'radius_m'],
  ring: ['x_m', 'y_m', 'radius_m'],
  sphere: ['x_m', 'y_m', 'radius_m'],
  plate: ['x_m', 'y_m', 'width_m', 'height_m'],
  counterweight: ['x_m', 'y_m', 'width_m', 'height_m'],
  custom: ['x_m', 'y_m', 'inertia_kg_m2'],
};

/** Where each field of the data came from in the file, to put a validation problem back on its cell. */
type Origin = { row: number; kind?: string };
type Origins = {
  source?: number;
  analysis?: number;
  bodies: Origin[];
  parts: Origin[];
  pivots: Origin[];
  seats: Origin[];
  motion: Origin[];
  rider: Partial<Record<'gx' | 'gz', number>>;
};

const fieldColumns: Record<string, DesignCsvColumn | [DesignCsvColumn, DesignCsvColumn]> = {
  body: 'body',
  joint: 'joint',
  name: 'name',
  kind: 'kind',
  massKg: 'mass_kg',
  fromM: ['x_m', 'y_m'],
  atM: ['x_m', 'y_m'],
  centreM: ['x_m', 'y_m'],
  cgM: ['x_m', 'y_m'],
  positionM: ['x_m', 'y_m'],
  toM: ['to_x_m', 'to_y_m'],
  tipM: ['tip_x_m', 'tip_y_m'],
  radiusM: 'radius_m',
  widthM: 'width_m',
  heightM: 'height_m',
  inertiaCgKgM2: 'inertia_kg_m2',
  shear: 'shear',
  bearingLengthM: 'bearing_length_m',
  nominalDiameterM: 'nominal_diameter_m',
  minimumDiameterM: 'minimum_diameter_m',
  maxClearanceM: 'max_clearance_m',
  maxShearStressPa: 'max_shear_stress_pa',
  maxBearingPressurePa: 'max_bearing_pressure_pa',
  maxForceN: 'max_force_n',
  maxTorqueNm: 'max_torque_nm',
  spineAngleRad: 'spine_angle_rad',
  facing: 'facing',
  rpm: 'rpm',
  amplitudeRad: 'amplitude_rad',
  periodS: 'period_s',
  angleRad: 'angle_rad',
  maxRateRadS: 'max_rate_rad_s',
  maxAmplitudeRad: 'max_amplitude_rad',
  document: 'document',
  revision: 'revision',
  min: 'min_g',
  max: 'max_g',
};

/** A schema problem's path in the data → its row and column in the CSV. */
function placeOf(path: PropertyKey[], origins: Origins): { row: number | null; column: string | null } {
  const [head, second, third, fourth] = path;
  const column = (field: PropertyKey | undefined, index: PropertyKey | undefined) => {
    const mapped = typeof field === 'string' ? fieldColumns[field] : undefined;
    if (mapped === undefined) return null;
    if (typeof mapped === 'string') return mapped;
    return index === 1 ? mapped[1] : mapped[0];
  };
  if (head === 'source') return { row: origins.source ?? null, column: column(second, undefined) };
  if (head === 'gravityMS2') return { row: origins.analysis ?? null, column: 'gravity_m_s2' };
  if (head === 'nearMargin') return { row: origins.analysis ?? null, column: 'near_margin' };
  if (head === 'rider' && (second === 'gx' || second === 'gz'))
    return { row: origins.rider[second] ?? null, column: column(third, undefined) };
  if (head === 'bodies' || head === 'parts' || head === 'pivots' || head === 'seats' || head === 'motion') {
    const list = origins[head];
    const origin = typeof second === 'number' ? list[second] : undefined;
    return { row: origin?.row ?? null, column: origin ? column(third, fourth) : null };
  }
  return { row: null, column: null };
}

/** `{ key: value }`, or nothing when the value is absent, so optional fields stay absent. */
const optional = <K extends string, V>(key: K, value: V | undefined) =>
  value === undefined ? {} : ({ [key]: value } as Record<K, V>);

const numberPattern = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Reads design data from CSV text. Every problem is reported with its row (as in the file, 1 = header) and
 * column; any problem means no data.
 */
export function parseDesignCsv(text: string): ImportResult {
  const issues: ImportIssue[] = [];
  const at = (row: number | null, column: string | null, message: string) =>
    issues.push({
      row,
      column,
      path: row === null ? (column ?? '(file)') : column ? `row ${row}, ${column}` : `row ${row}`,
      message,
    });

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
  const header = headerRecord.cells.map((h) => h.trim().toLowerCase());
  if (header.length === 1 && header[0].includes(';')) {
    at(
      headerRecord.row,
      null,
      'Columns are separated by semicolons: save the file with commas between columns',
    );
    return { ok: false, issues };
  }
  const known = new Set<string>(DESIGN_CSV_COLUMNS);
  const columnIndex = new Map<DesignCsvColumn, number>();
  header.forEach((name, i) => {
    if (name === '') return;
    if (!known.has(name))
      at(
        headerRecord.row,
        name,
        `Unknown column "${name}"; see the list of columns in the format description`,
      );
    else if (columnIndex.has(name as DesignCsvColumn))
      at(headerRecord.row, name, `Column "${name}" appears twice`);
    else columnIndex.set(name as DesignCsvColumn, i);
  });
  if (!columnIndex.has('record')) at(headerRecord.row, 'record', 'The header needs a "record" column');
  if (issues.length > 0) return { ok: false, issues };

  const origins: Origins = { bodies: [], parts: [], pivots: [], seats: [], motion: [], rider: {} };
  const draft = {
    source: undefined as { document: string; revision: string } | undefined,
    gravityMS2: undefined as number | undefined,
    nearMargin: undefined as number | undefined,
    bodies: [] as { name: string; tipM?: [number, number] }[],
    parts: [] as Record<string, unknown>[],
    pivots: [] as Record<string, unknown>[],
    seats: [] as Record<string, unknown>[],
    motion: [] as Record<string, unknown>[],
    rider: {} as Record<string, { min?: number; max?: number }>,
  };

  for (const { row, cells } of rows) {
    if (cells.length > header.length && cells.slice(header.length).some((c) => c.trim() !== ''))
      at(row, null, `This row has ${cells.length} cells but the header has ${header.length} columns`);
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
            : `"${raw}" is not a number (SI units, point as the decimal mark)`,
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
    const pair = (
      x: DesignCsvColumn,
      y: DesignCsvColumn,
      required: boolean,
    ): [number, number] | undefined => {
      const a = numberAt(x, required);
      const b = numberAt(y, required);
      if (a === undefined && b === undefined) return undefined;
      if (a === undefined || b === undefined) {
        if (!required) at(row, a === undefined ? x : y, `Give both ${x} and ${y}, or neither`);
        return undefined;
      }
      return [a, b];
    };
    const onlyUsed = (allowed: readonly DesignCsvColumn[], what: string) => {
      for (const [c] of columnIndex)
        if (c !== 'record' && !allowed.includes(c) && text(c) !== '')
          at(row, c, `Leave empty in ${what} rows`);
    };

    const record = text('record').toLowerCase();
    if (!(designCsvRecords as readonly string[]).includes(record)) {
      at(
        row,
        'record',
        record === '' ? 'Required' : `Unknown record "${record}"; use one of ${designCsvRecords.join(', ')}`,
      );
      continue;
    }
    switch (record as RecordKind) {
      case 'source': {
        onlyUsed(recordColumns.source, 'source');
        if (draft.source)
          at(row, 'record', `Only one source row is allowed (the first is on row ${origins.source})`);
        else {
          draft.source = { document: cell('document'), revision: cell('revision') };
          origins.source = row;
        }
        break;
      }
      case 'analysis': {
        onlyUsed(recordColumns.analysis, 'analysis');
        if (origins.analysis !== undefined)
          at(row, 'record', `Only one analysis row is allowed (the first is on row ${origins.analysis})`);
        else {
          origins.analysis = row;
          draft.gravityMS2 = numberAt('gravity_m_s2', false);
          draft.nearMargin = numberAt('near_margin', false);
        }
        break;
      }
      case 'body': {
        onlyUsed(recordColumns.body, 'body');
        const index = indexAt('body');
        if (index !== undefined && index !== draft.bodies.length)
          at(row, 'body', `Bodies are numbered in order from 0: expected ${draft.bodies.length} here`);
        const tip = pair('tip_x_m', 'tip_y_m', false);
        draft.bodies.push({ name: cell('name'), ...(tip ? { tipM: tip } : {}) });
        origins.bodies.push({ row });
        break;
      }
      case 'part': {
        const kind = text('kind').toLowerCase();
        if (!(partKinds as readonly string[]).includes(kind)) {
          at(
            row,
            'kind',
            kind === '' ? 'Required' : `Unknown part kind "${kind}"; use one of ${partKinds.join(', ')}`,
          );
          break;
        }
        const k = kind as DesignPart['kind'];
        onlyUsed([...recordColumns.part, ...partKindColumns[k]], `${k} part`);
        const base = {
          kind: k,
          body: indexAt('body'),
          name: cell('name'),
          massKg: numberAt('mass_kg', true),
        };
        const xy = () => pair('x_m', 'y_m', true);
        const part: Record<string, unknown> =
          k === 'rod'
            ? { ...base, fromM: xy(), toM: pair('to_x_m', 'to_y_m', true) }
            : k === 'point'
              ? { ...base, atM: xy() }
              : k === 'custom'
                ? { ...base, cgM: xy(), inertiaCgKgM2: numberAt('inertia_kg_m2', true) }
                : k === 'plate'
                  ? {
                      ...base,
                      centreM: xy(),
                      widthM: numberAt('width_m', true),
                      heightM: numberAt('height_m', true),
                    }
                  : k === 'counterweight'
                    ? {
                        ...base,
                        centreM: xy(),
                        ...optional('widthM', numberAt('width_m', false)),
                        ...optional('heightM', numberAt('height_m', false)),
                      }
                    : { ...base, centreM: xy(), radiusM: numberAt('radius_m', true) };
        draft.parts.push(part);
        origins.parts.push({ row, kind: k });
        break;
      }
      case 'pivot': {
        onlyUsed(recordColumns.pivot, 'pivot');
        draft.pivots.push({
          joint: indexAt('joint'),
          name: cell('name'),
          shear: text('shear').toLowerCase(),
          bearingLengthM: numberAt('bearing_length_m', true),
          nominalDiameterM: numberAt('nominal_diameter_m', true),
          minimumDiameterM: numberAt('minimum_diameter_m', true),
          maxClearanceM: numberAt('max_clearance_m', true),
          ...optional('maxShearStressPa', numberAt('max_shear_stress_pa', false)),
          ...optional('maxBearingPressurePa', numberAt('max_bearing_pressure_pa', false)),
          ...optional('maxForceN', numberAt('max_force_n', false)),
          ...optional('maxTorqueNm', numberAt('max_torque_nm', false)),
        });
        origins.pivots.push({ row });
        break;
      }
      case 'seat': {
        onlyUsed(recordColumns.seat, 'seat');
        const facing = text('facing').toLowerCase();
        draft.seats.push({
          body: indexAt('body'),
          name: cell('name'),
          positionM: pair('x_m', 'y_m', true),
          spineAngleRad: numberAt('spine_angle_rad', true),
          ...optional('facing', facing === '' ? undefined : facing),
        });
        origins.seats.push({ row });
        break;
      }
      case 'motion': {
        onlyUsed(recordColumns.motion, 'motion');
        draft.motion.push({
          joint: indexAt('joint'),
          kind: text('kind').toLowerCase(),
          ...optional('rpm', numberAt('rpm', false)),
          ...optional('amplitudeRad', numberAt('amplitude_rad', false)),
          ...optional('periodS', numberAt('period_s', false)),
          ...optional('angleRad', numberAt('angle_rad', false)),
          ...optional('maxRateRadS', numberAt('max_rate_rad_s', false)),
          ...optional('maxAmplitudeRad', numberAt('max_amplitude_rad', false)),
        });
        origins.motion.push({ row });
        break;
      }
      case 'rider': {
        onlyUsed(recordColumns.rider, 'rider');
        const axis = text('axis').toLowerCase();
        if (axis !== 'gx' && axis !== 'gz') {
          at(row, 'axis', axis === '' ? 'Required: gx or gz' : `Unknown axis "${axis}"; use gx or gz`);
          break;
        }
        if (origins.rider[axis] !== undefined) {
          at(row, 'axis', `Only one ${axis} row is allowed (the first is on row ${origins.rider[axis]})`);
          break;
        }
        origins.rider[axis] = row;
        draft.rider[axis] = {
          ...optional('min', numberAt('min_g', false)),
          ...optional('max', numberAt('max_g', false)),
        };
        break;
      }
    }
  }
  if (!draft.source)
    at(null, 'record', 'No source row: add one with record "source", the document and its revision');

  // Problems found while reading come first; the schema then checks everything it can still see.
  const parsed = designDataSchema.safeParse({
    source: draft.source,
    ...optional('gravityMS2', draft.gravityMS2),
    ...optional('nearMargin', draft.nearMargin),
    bodies: draft.bodies,
    parts: draft.parts,
    pivots: draft.pivots,
    seats: draft.seats,
    motion: draft.motion,
    rider: draft.rider,
  });
  if (!parsed.success) {
    const seen = new Set(issues.map((i) => `${i.row}:${i.column}`));
    for (const issue of parsed.error.issues) {
      const { row, column } = placeOf(issue.path, origins);
      // A cell already reported while reading (not a number, required) needs no second message.
      if (row !== null && seen.has(`${row}:${column}`)) continue;
      if (row === null && issue.path[0] === 'source' && !draft.source) continue;
      issues.push({
        row,
        column,
        path:
          row !== null ? (column ? `row ${row}, ${column}` : `row ${row}`) : issue.path.join('.') || '(file)',
        message: issue.message,
      });
    }
  }
  if (issues.length > 0 || !parsed.success) return { ok: false, issues: sortIssues(issues) };
  return { ok: true, data: parsed.data };
}

function sortIssues(issues: ImportIssue[]): ImportIssue[] {
  return [...issues].sort((a, b) => (a.row ?? Infinity) - (b.row ?? Infinity));
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

/** The 400 body of a rejected import: the API error shape, its issues carrying row and column. */
export const importIssueSchema = z.object({
  row: z.number().int().nullable(),
  column: z.string().nullable(),
  path: z.string(),
  message: z.string(),
});
export const importErrorSchema = z.object({
  error: z.object({
    code: z.literal('import_invalid'),
    message: z.string(),
    issues: z.array(importIssueSchema),
  }),
});
