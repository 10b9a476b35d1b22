/**
 * The design editor's sheet (features/registry/design-sheet.ts) against the import's documented contract
 * (features/registry/README.md): export then import gives back the same data, every problem is reported
 * on its row and column, and one problem means no data. The sheet is read by the import's own reader, so
 * these checks hold the editor to that contract: an untouched sheet is the version itself, one edited cell
 * changes exactly one field, and text cells survive RFC 4180 quoting (commas, quotes, line breaks).
 * Demo designs are invented.
 */
import { demoDesigns } from '@/server/seed/demo-design';
import { diffDesign } from '@/features/registry/design-diff';
import {
  changedCells,
  checkSheet,
  columnUnit,
  designSheet,
  editableFields,
  fieldKey,
  withCell,
} from '@/features/registry/design-sheet';

import { rodDesign } from '@/tests/support/rod-design';

describe('an untouched sheet is the version it came from', () => {
  test.each(Object.keys(demoDesigns))('%s: no change in the comparison, no edited cell', (key) => {
    const design = demoDesigns[key];
    const rows = designSheet(design);
    const check = checkSheet(rows);
    if (!check.ok) throw new Error(JSON.stringify(check));
    expect(diffDesign(design, check.data, 'si')).toEqual([]);
    expect(check.data).toEqual(design);
    expect(changedCells(rows, rows)).toBe(0);
  });
});

test('one edited cell changes exactly that field of the data', () => {
  const design = rodDesign(200, 4);
  const rows = designSheet(design);
  const part = rows.findIndex((r) => r.record === 'part');
  const edited = withCell(rows, part, 'mass_kg', '212.5');
  const check = checkSheet(edited);
  if (!check.ok) throw new Error(JSON.stringify(check));
  expect(check.data).toEqual({ ...design, parts: [{ ...design.parts[0], massKg: 212.5 }] });
  expect(changedCells(rows, edited)).toBe(1);
  // The shared comparison names it with its unit (design-diff: masses are shown without a verdict).
  const changes = diffDesign(design, check.data, 'si');
  expect(changes).toHaveLength(1);
  expect(changes[0]).toMatchObject({ section: 'parts', effect: 'changed' });
});

test('names with a comma, a quote and a line break come back as typed (RFC 4180 quoting)', () => {
  const design = rodDesign(200, 4);
  const rows = designSheet(design);
  const part = rows.findIndex((r) => r.record === 'part');
  const name = 'Arm, "outer" half\nwelded';
  const check = checkSheet(withCell(rows, part, 'name', name));
  if (!check.ok) throw new Error(JSON.stringify(check));
  expect(check.data.parts[0].name).toBe(name);
});

test('problems land on the field typed in, with the import’s words; none leaves data', () => {
  const rows = designSheet(rodDesign(200, 4));
  const part = rows.findIndex((r) => r.record === 'part');
  const pivot = rows.findIndex((r) => r.record === 'pivot');
  // A row after an edited multi-line cell is still found: the reader counts the cell's lines.
  let edited = withCell(rows, part, 'name', 'Two\nlines');
  edited = withCell(edited, part, 'mass_kg', '1,5');
  edited = withCell(edited, pivot, 'minimum_diameter_m', '0.07');
  edited = withCell(edited, pivot, 'bearing_length_m', '');
  const check = checkSheet(edited);
  expect(check.ok).toBe(false);
  if (check.ok) return;
  // As in an import, cells that cannot be read are reported first; the schema's rules follow once all
  // of them read (the import checks the schema on read data only).
  expect(check.fieldErrors).toEqual({
    [fieldKey(part, 'mass_kg')]: '"1,5" uses a decimal comma: write 1.5',
    [fieldKey(pivot, 'bearing_length_m')]: 'Required',
  });
  const next = checkSheet(
    withCell(withCell(edited, part, 'mass_kg', '1.5'), pivot, 'bearing_length_m', '0.05'),
  );
  expect(next).toEqual({
    ok: false,
    fieldErrors: { [fieldKey(pivot, 'minimum_diameter_m')]: 'Must be below the nominal diameter' },
    general: [],
  });
});

test('each value field shows the unit its column names (SI, as the file header says)', () => {
  expect(columnUnit('mass_kg')).toBe('kg');
  expect(columnUnit('max_force_n')).toBe('N');
  expect(columnUnit('max_torque_nm')).toBe('N·m');
  expect(columnUnit('max_shear_stress_pa')).toBe('Pa');
  expect(columnUnit('max_rate_rad_s')).toBe('rad/s');
  expect(columnUnit('service_decel_rad_s2')).toBe('rad/s²');
  expect(columnUnit('gravity_m_s2')).toBe('m/s²');
  expect(columnUnit('inertia_kg_m2')).toBe('kg·m²');
  expect(columnUnit('min_g')).toBe('g');
  expect(columnUnit('interval_days')).toBe('whole days');
  const rows = designSheet(rodDesign(200, 4));
  const motion = rows.find((r) => r.record === 'motion');
  // A constant-speed joint has a speed, not a swing's amplitude or period.
  const labels = editableFields(motion!).map((f) => f.label);
  expect(labels).toContain('Design speed');
  expect(labels).not.toContain('Design period');
});
