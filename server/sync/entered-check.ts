/**
 * A record's typed texts must say its values: `entered` is shown in place of the number wherever the
 * value appears, so a text that does not convert to the stored SI value would show one number and
 * analyse another. Checked at ingest, after the schema (which already requires a plain decimal).
 */
import type { InspectionRecord } from '@/features/records/schema';
import { type QuantityKind, toSI } from '@/lib/units';
import { unitOfLabel } from '@/lib/measured-format';

type Issue = { path: string; message: string };

const readingQuantity: Partial<Record<InspectionRecord['readings'][number]['kind'], QuantityKind>> = {
  speed: 'rate',
  period: 'time',
  amplitude: 'angle',
  pin_diameter: 'lengthSmall',
  clearance: 'lengthSmall',
};
const allKinds: QuantityKind[] = [
  'lengthSmall',
  'length',
  'force',
  'moment',
  'mass',
  'angle',
  'rate',
  'time',
  'accel',
  'stress',
  'pressure',
];

/** Relative agreement of one conversion to SI (a float product) with the stored value. */
const agrees = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b), 1e-300);

/** The SI value a typed text says, or null when its unit is not one this check knows. */
function typedSI(entered: string, unit: string, kind: QuantityKind | null): number | null {
  const kinds = kind ? [kind] : allKinds;
  for (const k of kinds) {
    const u = unitOfLabel(k, unit);
    if (u) return toSI(Number(entered), k, u.mathjs);
  }
  return null;
}

const message = (unit: string) =>
  `The typed text does not say the stored value (read in ${unit || 'no unit'}); send the value as typed`;

export function enteredIssues(record: InspectionRecord): Issue[] {
  const issues: Issue[] = [];
  record.readings.forEach((r, i) => {
    if (r.entered === undefined) return;
    const si =
      r.kind === 'other' ? Number(r.entered) : typedSI(r.entered, r.unit, readingQuantity[r.kind] ?? null);
    if (si !== null && !agrees(si, r.valueSI))
      issues.push({ path: `readings.${i}.entered`, message: message(r.unit) });
  });
  record.checklist.forEach((a, i) => {
    const m = a.measurement;
    if (!m || m.entered === undefined) return;
    // An item without a quantity stores the number as typed, whatever its label says.
    const si = typedSI(m.entered, m.unit, null);
    if (!agrees(Number(m.entered), m.valueSI) && (si === null || !agrees(si, m.valueSI)))
      issues.push({ path: `checklist.${i}.measurement.entered`, message: message(m.unit) });
  });
  return issues;
}
