/**
 * Free swings and stop decelerations in design data: optional (every stored design still parses), checked
 * where they make sense with clear messages, carried by the design-data CSV both ways, and an older CSV
 * without the new columns still imports.
 */
import { designDataSchema, type DesignData } from '@/features/loads/design-schema';
import { designToCsv, parseDesignCsv } from '@/features/registry/csv';
import { skylarkDesign, tidebreakerDesign } from '@/server/seed/demo-design';

const withMotion = (d: DesignData, patch: Record<string, unknown>, joint = 0) => ({
  ...d,
  motion: d.motion.map((m) => (m.joint === joint ? { ...m, ...patch } : m)),
});
const issues = (d: unknown) => {
  const r = designDataSchema.safeParse(d);
  return r.success ? [] : r.error.issues.map((i) => [i.path.join('.'), i.message]);
};

test('designs without the new fields still parse', () => {
  const plain = withMotion(skylarkDesign, {
    freeSwing: undefined,
    serviceDecelRadS2: undefined,
    emergencyDecelRadS2: undefined,
  });
  expect(issues(plain)).toEqual([]);
});

test('decelerations must be positive and belong to moving joints; only a swing swings freely', () => {
  expect(issues(withMotion(tidebreakerDesign, { serviceDecelRadS2: 0 }))).toEqual([
    ['motion.0.serviceDecelRadS2', 'Service-stop deceleration must be greater than 0'],
  ]);
  expect(issues(withMotion(tidebreakerDesign, { emergencyDecelRadS2: -1 }))).toEqual([
    ['motion.0.emergencyDecelRadS2', 'Emergency-stop deceleration must be greater than 0'],
  ]);
  expect(issues(withMotion(tidebreakerDesign, { serviceDecelRadS2: 0.2 }, 2))).toEqual([
    ['motion.2.serviceDecelRadS2', 'A fixed joint does not move, so it has no stop: leave empty'],
  ]);
  expect(issues(withMotion(tidebreakerDesign, { freeSwing: true }))).toEqual([
    ['motion.0.freeSwing', 'Only a swing motion can swing freely'],
  ]);
});

test('the CSV carries them both ways, yes/no for the free swing, and names a bad cell', () => {
  const csv = designToCsv(skylarkDesign);
  const header = csv.split('\r\n')[0].split(',');
  const motionRow =
    csv
      .split('\r\n')
      .find((l) => l.startsWith('motion,'))
      ?.split(',') ?? [];
  expect(motionRow[header.indexOf('free_swing')]).toBe('yes');
  expect(Number(motionRow[header.indexOf('service_decel_rad_s2')])).toBe(0.5);
  expect(Number(motionRow[header.indexOf('emergency_decel_rad_s2')])).toBe(0.65);
  const back = parseDesignCsv(csv);
  expect(back.ok && back.data).toEqual(skylarkDesign);

  const bad = csv.replace(/^motion,(.*?),yes,/m, (row) => row.replace(',yes,', ',perhaps,'));
  const r = parseDesignCsv(bad);
  expect(r.ok).toBe(false);
  if (!r.ok)
    expect(r.issues.map((i) => [i.column, i.message])).toContainEqual([
      'free_swing',
      '"perhaps" is not yes or no',
    ]);
});

test('a CSV written before the new columns existed still imports', () => {
  const csv = designToCsv(tidebreakerDesign);
  const lines = csv
    .trimEnd()
    .split('\r\n')
    .map((l) => l.split(','));
  const drop = ['free_swing', 'service_decel_rad_s2', 'emergency_decel_rad_s2'].map((c) =>
    lines[0].indexOf(c),
  );
  const old = lines.map((cells) => cells.filter((_, i) => !drop.includes(i)).join(',')).join('\n');
  const r = parseDesignCsv(old);
  expect(r.ok).toBe(true);
  if (r.ok) expect(r.data.motion.every((m) => m.serviceDecelRadS2 === undefined)).toBe(true);
});
