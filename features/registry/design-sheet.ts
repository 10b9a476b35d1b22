/**
 * The design-data editor's model: the version in force written as the import file writes it (one row per
 * record, `designToCsv`), each cell editable, and the edited rows read back by the import's own reader
 * (`parseDesignCsv`: the same cell rules, the same zod schema, the same messages). So an edited version
 * is exactly the document a person could have exported, changed and imported, and every problem comes
 * back on its row and column, which here is the field that was typed in. Pure: no React.
 */
import type { DesignData, DesignPart } from '@/features/loads/design-schema';
import {
  DESIGN_CSV_COLUMNS,
  type Cells,
  type DesignCsvColumn,
  type FieldColumn,
  type RecordKind,
  columnUnitWords,
  fieldsOf,
} from '@/features/registry/design-file/columns';
import { designToCsv } from '@/features/registry/design-file/csv-export';
import { parseDesignCsv } from '@/features/registry/design-file/csv-import';
import { csvCell, readCsv } from '@/features/registry/design-file/csv-text';

/** One record of the sheet: its kind (a part's kind too) and its cells by column. */
export type SheetRow = { record: RecordKind; partKind?: DesignPart['kind']; cells: Cells };

/** One input of the editor: a column of a row, with its words and unit. */
export type SheetField = { column: DesignCsvColumn; label: string; unit: string; optional: boolean };

/** The rows of a design as its CSV export holds them. */
export function designSheet(data: DesignData): SheetRow[] {
  const { records } = readCsv(designToCsv(data));
  const [header, ...rows] = records;
  const columns = header.cells as DesignCsvColumn[];
  return rows.map(({ cells }) => {
    const byColumn: Cells = {};
    columns.forEach((c, i) => {
      if (c !== 'record' && cells[i] !== '') byColumn[c] = cells[i];
    });
    const record = cells[columns.indexOf('record')] as RecordKind;
    return record === 'part'
      ? { record, partKind: byColumn.kind as DesignPart['kind'], cells: byColumn }
      : { record, cells: byColumn };
  });
}

/** The sheet as an import file: the header as export writes it, then one line per row. */
export function sheetToCsv(rows: readonly SheetRow[]): string {
  const lines = [DESIGN_CSV_COLUMNS.join(',')];
  for (const r of rows)
    lines.push(
      DESIGN_CSV_COLUMNS.map((c) => (c === 'record' ? r.record : csvCell(r.cells[c] ?? ''))).join(','),
    );
  return `${lines.join('\r\n')}\r\n`;
}

/** A row with one cell changed (the other rows are shared, not copied). */
export function withCell(
  rows: readonly SheetRow[],
  index: number,
  column: DesignCsvColumn,
  text: string,
): SheetRow[] {
  return rows.map((r, i) => (i === index ? { ...r, cells: { ...r.cells, [column]: text } } : r));
}

export type SheetCheck =
  | { ok: true; data: DesignData }
  | {
      ok: false;
      /** Each problem on its field: `${row index}:${column}`. */
      fieldErrors: Record<string, string>;
      /** Problems of a whole record or of the whole design, in words. */
      general: string[];
    };

export const fieldKey = (index: number, column: DesignCsvColumn) => `${index}:${column}`;

/** Reads the edited sheet with the import's reader; every problem is put on the field it came from. */
export function checkSheet(rows: readonly SheetRow[]): SheetCheck {
  const text = sheetToCsv(rows);
  const result = parseDesignCsv(text);
  if (result.ok) return { ok: true, data: result.data };
  // A cell holding a line break makes a row span lines: find each row's first line as the reader does.
  const lineToIndex = new Map(readCsv(text).records.map((r, i) => [r.row, i - 1]));
  const fieldErrors: Record<string, string> = {};
  const general: string[] = [];
  for (const issue of result.issues) {
    const index = issue.row === null ? undefined : lineToIndex.get(issue.row);
    const row = index === undefined ? undefined : rows[index];
    if (index !== undefined && row && issue.column) {
      const key = fieldKey(index, issue.column as DesignCsvColumn);
      fieldErrors[key] ??= issue.message;
    } else general.push(row ? `${recordTitle(row)}: ${issue.message}` : issue.message);
  }
  return { ok: false, fieldErrors, general };
}

// ——— what each field is called, and in what unit ———

/** Field words; a pair's field names the point ("Centre" → "Centre x", "Centre y"). */
const fieldWords: Record<string, string> = {
  document: 'Design document',
  revision: 'Revision',
  gravityMS2: 'Gravity',
  nearMargin: 'Near-limit margin (ratio)',
  name: 'Name',
  tipM: 'Next body’s pivot',
  massKg: 'Mass',
  fromM: 'From',
  toM: 'To',
  atM: 'At',
  centreM: 'Centre',
  cgM: 'Centre of gravity',
  radiusM: 'Radius',
  widthM: 'Width',
  heightM: 'Height',
  inertiaCgKgM2: 'Inertia about its centre of gravity',
  bearingLengthM: 'Bearing length',
  nominalDiameterM: 'Nominal pin diameter',
  minimumDiameterM: 'Minimum pin diameter',
  maxClearanceM: 'Max clearance',
  maxShearStressPa: 'Allowable shear stress',
  maxBearingPressurePa: 'Allowable bearing pressure',
  maxForceN: 'Max force',
  maxTorqueNm: 'Max torque',
  pinGrade: 'Pin steel',
  pinFyPa: 'Pin yield strength',
  pinFuPa: 'Pin ultimate strength',
  plateGrade: 'Plate steel',
  plateFyPa: 'Plate yield strength',
  innerPlateM: 'Inner plate (lug) thickness',
  outerPlateM: 'Outer plate (cheek) thickness',
  gapM: 'Gap, cheek to lug',
  gammaM0: 'γM0',
  gammaM2: 'γM2',
  gammaM6ser: 'γM6,ser',
  gammaF: 'γF',
  positionM: 'Position',
  spineAngleRad: 'Spine angle',
  rpm: 'Design speed',
  amplitudeRad: 'Design amplitude',
  periodS: 'Design period',
  angleRad: 'Held at angle',
  maxRateRadS: 'Rate limit',
  maxAmplitudeRad: 'Amplitude limit',
  serviceDecelRadS2: 'Service-stop deceleration',
  emergencyDecelRadS2: 'Emergency-stop deceleration',
  min: 'Lowest',
  max: 'Highest',
  method: 'Method',
  intervalDays: 'Interval',
  note: 'Note',
  rideCycleS: 'One ride cycle',
  stopsPerRideCycle: 'Service stops per ride cycle',
  stressPerKnMPa: 'Stress per kN',
  sectionAreaMm2: 'Section area',
  shearPlanes: 'Shear planes',
  categoryMPa: 'Detail category',
  gammaFf: 'γFf',
  gammaMf: 'γMf',
  damageLimit: 'Damage limit (Miner sum)',
};

/** A column's unit from its name's ending (longest first), as the file's header states it. */
const unitEndings: [string, string][] = [
  ['_rad_s2', 'rad/s²'],
  ['_rad_s', 'rad/s'],
  ['_m_s2', 'm/s²'],
  ['_kg_m2', 'kg·m²'],
  ['_kg', 'kg'],
  ['_pa', 'Pa'],
  ['_nm', 'N·m'],
  ['_n', 'N'],
  ['_rad', 'rad'],
  ['_m', 'm'],
  ['_s', 's'],
  ['_g', 'g'],
];

export function columnUnit(column: DesignCsvColumn): string {
  const words = columnUnitWords[column];
  if (words) return words;
  if (column === 'rpm') return 'rpm';
  return unitEndings.find(([ending]) => column.endsWith(ending))?.[1] ?? '';
}

/** A motion's values that its kind does not use (the schema refuses the stops of a fixed joint). */
const motionSkips: Record<string, string[]> = {
  constant: ['amplitudeRad', 'periodS', 'angleRad'],
  swing: ['rpm', 'angleRad'],
  fixed: [
    'rpm',
    'amplitudeRad',
    'periodS',
    'maxRateRadS',
    'maxAmplitudeRad',
    'serviceDecelRadS2',
    'emergencyDecelRadS2',
  ],
};

/**
 * The fields a person edits on a row: names and values (text and numbers, each of a pair's two numbers).
 * Which record a row is (its body or joint, its kind, an axis) and yes/no and word choices stay as they
 * are: changing them changes the record's shape, which is a new file's job. A pivot's pin-check values
 * are there only when the pivot has a pin check.
 */
export function editableFields(row: SheetRow): SheetField[] {
  const hasGroup = (f: FieldColumn) =>
    fieldsOf(row.record, row.partKind).some(
      (g) => g.group === f.group && typeof g.column === 'string' && (row.cells[g.column] ?? '') !== '',
    );
  const out: SheetField[] = [];
  const skip = row.record === 'motion' ? motionSkips[row.cells.kind ?? ''] : undefined;
  for (const f of fieldsOf(row.record, row.partKind)) {
    if (f.group && !hasGroup(f)) continue;
    if (skip?.includes(f.field)) continue;
    const words = fieldWords[f.field] ?? f.field;
    if (f.read === 'pair') {
      out.push({
        column: f.column[0],
        label: `${words} x`,
        unit: columnUnit(f.column[0]),
        optional: f.optional,
      });
      out.push({
        column: f.column[1],
        label: `${words} y`,
        unit: columnUnit(f.column[1]),
        optional: f.optional,
      });
    } else if (f.read === 'number' || f.read === 'text')
      out.push({ column: f.column, label: words, unit: columnUnit(f.column), optional: f.optional });
  }
  return out;
}

/** The record's heading: what it is and which one. */
export function recordTitle(row: SheetRow): string {
  const c = row.cells;
  switch (row.record) {
    case 'source':
      return 'Design document';
    case 'analysis':
      return 'Analysis settings';
    case 'body':
      return `Body ${c.body ?? '?'} · ${c.name ?? ''}`;
    case 'part':
      return `${c.name ?? 'Part'} · ${c.kind ?? ''} on body ${c.body ?? '?'}`;
    case 'pivot':
      return `Pivot ${c.joint ?? '?'} · ${c.name ?? ''}`;
    case 'ndt':
      return `NDT at pivot ${c.joint ?? '?'} · ${c.method ?? ''}`;
    case 'seat':
      return `Seat ${c.name ?? ''} on body ${c.body ?? '?'}`;
    case 'motion':
      return `Motion of joint ${c.joint ?? '?'} · ${c.kind ?? ''}${c.free_swing === 'yes' ? ' (free swing)' : ''}`;
    case 'rider':
      return `Rider acceleration limits, ${c.axis ?? ''}`;
    case 'fatigue':
      return 'Fatigue: how the ride runs';
    case 'fatigue_detail':
      return `Fatigue detail ${c.name ?? ''} at joint ${c.joint ?? '?'}`;
  }
}

/** The editor's sections, in the file's record order, each with the rows it holds (by index). */
export const sheetSections: { title: string; records: RecordKind[] }[] = [
  { title: 'Source and analysis', records: ['source', 'analysis'] },
  { title: 'Bodies and parts', records: ['body', 'part'] },
  { title: 'Pivots, pins and NDT', records: ['pivot', 'ndt'] },
  { title: 'Seats', records: ['seat'] },
  { title: 'Motion and envelope', records: ['motion', 'rider'] },
  { title: 'Fatigue', records: ['fatigue', 'fatigue_detail'] },
];

/** How many cells differ from the version the sheet started from. */
export function changedCells(start: readonly SheetRow[], now: readonly SheetRow[]): number {
  let n = 0;
  now.forEach((r, i) => {
    for (const c of DESIGN_CSV_COLUMNS) if ((r.cells[c] ?? '') !== (start[i]?.cells[c] ?? '')) n++;
  });
  return n;
}
