/**
 * The design data CSV's columns, and for each record kind the one table that says which field of the
 * data each cell holds and how its text is read and written. Export writes cells from it, import reads
 * cells through it (and refuses a value in any column it does not list), and a schema problem is put back
 * on its cell by it; the mapping is written here only.
 */
import type { DesignPart } from '@/features/loads/design-schema';
import { numberText } from '@/features/registry/design-file/csv-text';

export const designCsvRecords = [
  'source',
  'analysis',
  'body',
  'part',
  'pivot',
  'seat',
  'motion',
  'rider',
  'ndt',
  'fatigue',
  'fatigue_detail',
] as const;
export type RecordKind = (typeof designCsvRecords)[number];

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
  'pin_grade',
  'pin_fy_pa',
  'pin_fu_pa',
  'plate_grade',
  'plate_fy_pa',
  'inner_plate_m',
  'outer_plate_m',
  'gap_m',
  'replaceable_pin',
  'gamma_m0',
  'gamma_m2',
  'gamma_m6_ser',
  'gamma_f',
  'spine_angle_rad',
  'facing',
  'rpm',
  'amplitude_rad',
  'period_s',
  'angle_rad',
  'max_rate_rad_s',
  'max_amplitude_rad',
  'free_swing',
  'service_decel_rad_s2',
  'emergency_decel_rad_s2',
  'axis',
  'min_g',
  'max_g',
  'document',
  'revision',
  'gravity_m_s2',
  'near_margin',
  'method',
  'interval_days',
  'note',
  'ride_cycle_s',
  'stops_per_ride_cycle',
  'member',
  'component',
  'stress_per_kn_mpa',
  'section_area_mm2',
  'shear_planes',
  'category_mpa',
  'in_shear',
  'gamma_ff',
  'gamma_mf',
  'damage_limit',
] as const;
export type DesignCsvColumn = (typeof DESIGN_CSV_COLUMNS)[number];

export type Cells = Partial<Record<DesignCsvColumn, string>>;

/**
 * The unit of a number column whose unit is not the SI one its name would suggest: the fatigue detail's
 * values are in the units of EN 1993-1-9 (as the design data holds them), an NDT interval in days.
 */
export const columnUnitWords: Partial<Record<DesignCsvColumn, string>> = {
  stress_per_kn_mpa: 'MPa per kN (per kN·m for a torque)',
  section_area_mm2: 'mm²',
  category_mpa: 'MPa',
  interval_days: 'whole days',
  stops_per_ride_cycle: 'a whole number',
  shear_planes: '1 or 2',
};

/**
 * One field of a record and the cell(s) holding it. `text` is kept as typed (names, document); `word` is
 * trimmed and lower-cased (kinds, shear, facing); `code` trimmed and upper-cased (an NDT method); `index` is a body or joint number; `number` a value in the
 * unit its column names (SI, except the fatigue detail's MPa and mm² of EN 1993-1-9); `flag` yes or no
 * (true/false); `pair` an [x, y] over two columns. An optional field is left out of the data when its cells
 * are empty; a required one is reported as "Required". A field with a `group` lives in an object of that
 * name inside the record (a pivot's `pinCheck`): the object is there when any of its cells is filled, and
 * then its required fields are required.
 */
type Group = 'pinCheck';
export type FieldColumn = { group?: Group } & (
  | {
      field: string;
      column: DesignCsvColumn;
      read: 'text' | 'word' | 'code' | 'number' | 'flag';
      optional: boolean;
    }
  | { field: string; column: 'body' | 'joint'; read: 'index'; optional: false }
  | { field: string; column: readonly [DesignCsvColumn, DesignCsvColumn]; read: 'pair'; optional: boolean }
);

const text = (field: string, column: DesignCsvColumn, optional = false): FieldColumn => ({
  field,
  column,
  read: 'text',
  optional,
});
const word = (field: string, column: DesignCsvColumn, optional = false): FieldColumn => ({
  field,
  column,
  read: 'word',
  optional,
});
const index = (field: 'body' | 'joint'): FieldColumn => ({
  field,
  column: field,
  read: 'index',
  optional: false,
});
const number = (field: string, column: DesignCsvColumn, optional = false): FieldColumn => ({
  field,
  column,
  read: 'number',
  optional,
});
const flag = (field: string, column: DesignCsvColumn): FieldColumn => ({
  field,
  column,
  read: 'flag',
  optional: true,
});
const pair = (field: string, x: DesignCsvColumn, y: DesignCsvColumn, optional = false): FieldColumn => ({
  field,
  column: [x, y],
  read: 'pair',
  optional,
});
const OPTIONAL = true;
const inGroup = (group: Group, fields: FieldColumn[]): FieldColumn[] => fields.map((f) => ({ ...f, group }));

/**
 * The fields of each record kind, in the order import reads them (so problems in one row are listed in
 * this order). A part's fields continue with its kind's (`partKindFields`). The analysis record's fields
 * are top-level fields of the design data.
 */
export const recordFields: Record<RecordKind, readonly FieldColumn[]> = {
  source: [text('document', 'document'), text('revision', 'revision')],
  analysis: [number('gravityMS2', 'gravity_m_s2', OPTIONAL), number('nearMargin', 'near_margin', OPTIONAL)],
  body: [text('name', 'name'), pair('tipM', 'tip_x_m', 'tip_y_m', OPTIONAL)],
  part: [word('kind', 'kind'), index('body'), text('name', 'name'), number('massKg', 'mass_kg')],
  pivot: [
    index('joint'),
    text('name', 'name'),
    word('shear', 'shear'),
    number('bearingLengthM', 'bearing_length_m'),
    number('nominalDiameterM', 'nominal_diameter_m'),
    number('minimumDiameterM', 'minimum_diameter_m'),
    number('maxClearanceM', 'max_clearance_m'),
    number('maxShearStressPa', 'max_shear_stress_pa', OPTIONAL),
    number('maxBearingPressurePa', 'max_bearing_pressure_pa', OPTIONAL),
    number('maxForceN', 'max_force_n', OPTIONAL),
    number('maxTorqueNm', 'max_torque_nm', OPTIONAL),
    ...inGroup('pinCheck', [
      text('pinGrade', 'pin_grade'),
      number('pinFyPa', 'pin_fy_pa'),
      number('pinFuPa', 'pin_fu_pa'),
      text('plateGrade', 'plate_grade'),
      number('plateFyPa', 'plate_fy_pa'),
      number('innerPlateM', 'inner_plate_m'),
      number('outerPlateM', 'outer_plate_m'),
      number('gapM', 'gap_m'),
      flag('replaceable', 'replaceable_pin'),
      number('gammaM0', 'gamma_m0', OPTIONAL),
      number('gammaM2', 'gamma_m2', OPTIONAL),
      number('gammaM6ser', 'gamma_m6_ser', OPTIONAL),
      number('gammaF', 'gamma_f', OPTIONAL),
    ]),
  ],
  seat: [
    index('body'),
    text('name', 'name'),
    pair('positionM', 'x_m', 'y_m'),
    number('spineAngleRad', 'spine_angle_rad'),
    word('facing', 'facing', OPTIONAL),
  ],
  motion: [
    index('joint'),
    word('kind', 'kind'),
    number('rpm', 'rpm', OPTIONAL),
    number('amplitudeRad', 'amplitude_rad', OPTIONAL),
    number('periodS', 'period_s', OPTIONAL),
    number('angleRad', 'angle_rad', OPTIONAL),
    number('maxRateRadS', 'max_rate_rad_s', OPTIONAL),
    number('maxAmplitudeRad', 'max_amplitude_rad', OPTIONAL),
    flag('freeSwing', 'free_swing'),
    number('serviceDecelRadS2', 'service_decel_rad_s2', OPTIONAL),
    number('emergencyDecelRadS2', 'emergency_decel_rad_s2', OPTIONAL),
  ],
  rider: [number('min', 'min_g', OPTIONAL), number('max', 'max_g', OPTIONAL)],
  // The joint says which pivot's list the plan joins; it is not a field of the plan itself.
  ndt: [
    { field: 'method', column: 'method', read: 'code', optional: false },
    number('intervalDays', 'interval_days'),
    text('note', 'note', OPTIONAL),
  ],
  // The fatigue record's fields are those of `fatigue` beside its list of details.
  fatigue: [
    number('rideCycleS', 'ride_cycle_s'),
    number('stopsPerRideCycle', 'stops_per_ride_cycle', OPTIONAL),
  ],
  fatigue_detail: [
    index('joint'),
    text('name', 'name'),
    word('kind', 'kind'),
    word('member', 'member'),
    word('component', 'component'),
    number('stressPerKnMPa', 'stress_per_kn_mpa', OPTIONAL),
    number('sectionAreaMm2', 'section_area_mm2', OPTIONAL),
    number('shearPlanes', 'shear_planes', OPTIONAL),
    number('categoryMPa', 'category_mpa'),
    flag('shear', 'in_shear'),
    number('gammaFf', 'gamma_ff', OPTIONAL),
    number('gammaMf', 'gamma_mf', OPTIONAL),
    number('damageLimit', 'damage_limit', OPTIONAL),
  ],
};

const round = [pair('centreM', 'x_m', 'y_m'), number('radiusM', 'radius_m')];
const partKindFields: Record<DesignPart['kind'], readonly FieldColumn[]> = {
  rod: [pair('fromM', 'x_m', 'y_m'), pair('toM', 'to_x_m', 'to_y_m')],
  point: [pair('atM', 'x_m', 'y_m')],
  disc: round,
  ring: round,
  sphere: round,
  plate: [pair('centreM', 'x_m', 'y_m'), number('widthM', 'width_m'), number('heightM', 'height_m')],
  counterweight: [
    pair('centreM', 'x_m', 'y_m'),
    number('widthM', 'width_m', OPTIONAL),
    number('heightM', 'height_m', OPTIONAL),
  ],
  custom: [pair('cgM', 'x_m', 'y_m'), number('inertiaCgKgM2', 'inertia_kg_m2')],
};

/**
 * Columns that say which record a row is rather than hold one of its fields: a body's place in the chain
 * (its index in the list) and the rider limit's axis (its key).
 */
const keyColumns: Partial<Record<RecordKind, DesignCsvColumn>> = {
  body: 'body',
  rider: 'axis',
  ndt: 'joint',
};

/** The fields of a record; a part's include those of its kind. */
export function fieldsOf(record: RecordKind, partKind?: DesignPart['kind']): readonly FieldColumn[] {
  return record === 'part' && partKind
    ? [...recordFields.part, ...partKindFields[partKind]]
    : recordFields[record];
}

/** Every column a record may fill. */
export function columnsOf(record: RecordKind, partKind?: DesignPart['kind']): DesignCsvColumn[] {
  const key = keyColumns[record];
  return [
    ...(key ? [key] : []),
    ...fieldsOf(record, partKind).flatMap((f) => (typeof f.column === 'string' ? [f.column] : f.column)),
  ];
}

/** A record's cells for export. */
export function cellsOf(fields: readonly FieldColumn[], value: Record<string, unknown>): Cells {
  const cells: Cells = {};
  for (const f of fields) {
    const holder = f.group ? (value[f.group] as Record<string, unknown> | undefined) : value;
    const v = holder?.[f.field];
    if (f.read === 'pair') {
      const xy = v as readonly number[] | undefined;
      cells[f.column[0]] = numberText(xy?.[0]);
      cells[f.column[1]] = numberText(xy?.[1]);
    } else if (f.read === 'number') cells[f.column] = numberText(v as number | undefined);
    else if (f.read === 'flag') cells[f.column] = v === undefined ? '' : v ? 'yes' : 'no';
    else cells[f.column] = v === undefined ? '' : String(v);
  }
  return cells;
}

/**
 * The cell of a field (for a pair, `element` 1 is the y column; anything else the x column; for a group,
 * `element` names the field inside it, and the group as a whole has no one cell).
 */
export function columnOf(
  fields: readonly FieldColumn[],
  field: PropertyKey | undefined,
  element: PropertyKey | undefined,
): DesignCsvColumn | null {
  const grouped = fields.some((c) => c.group !== undefined && c.group === field);
  const f = grouped
    ? fields.find((c) => c.group === field && c.field === element)
    : fields.find((c) => c.group === undefined && c.field === field);
  if (f === undefined) return null;
  if (typeof f.column === 'string') return f.column;
  return element === 1 ? f.column[1] : f.column[0];
}
