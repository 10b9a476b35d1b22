/**
 * Words and numbers of the inspection review, in the person's unit system. Readings are stored in SI by
 * kind (features/inspections/schema.ts): speed rad/s, period s, amplitude rad, diameter and clearance m.
 */
import type { ReadingKind } from '@/features/records/schema';
import { type QuantityKind, type UnitSystem, conversionFactor, formatSignificant } from '@/lib/units';
import type { InspectionReading } from '@/features/review/inspection-schema';
import { type MeasuredSource, formatMeasured, formatSpreadOf, formatTyped } from '@/lib/measured-format';
import { labelsOf, reviewStateVocabulary } from '@/lib/vocabulary';

const readingQuantity: Record<Exclude<ReadingKind, 'other'>, QuantityKind> = {
  speed: 'rate',
  period: 'time',
  amplitude: 'angle',
  pin_diameter: 'lengthSmall',
  clearance: 'lengthSmall',
};

/** The method's words, as the instrument register and the records say them. */
export { readingMethodWords as readingMethodLabel } from '@/features/instruments/schema';

/**
 * A reading's value with its unit, as typed when the record kept the typed text (lib/measured-format.ts);
 * a kind of its own is shown as recorded, in SI.
 */
export function formatReading(
  r: Pick<InspectionReading, 'kind' | 'valueSI' | 'unit'> & {
    entered?: string | null;
    spreadSI?: number | null;
  },
  system: UnitSystem,
) {
  if (r.kind === 'other')
    return `${r.entered ?? formatSignificant(r.valueSI, 4)} (${r.entered ? r.unit || 'no unit' : `SI; typed in ${r.unit || 'no unit'}`})`;
  return formatMeasured(r.valueSI, readingQuantity[r.kind], system, readingSource(r)).text;
}

/** What the display rule needs to know about how a reading was taken. */
function readingSource(r: {
  unit: string;
  entered?: string | null;
  spreadSI?: number | null;
}): MeasuredSource {
  return { entered: r.entered ?? null, unit: r.unit, spreadSI: r.spreadSI ?? null };
}

/** "± 0.023 s" for a reading's spread (two significant figures, in the reading's unit), when it has one. */
export function formatSpread(
  r: Pick<InspectionReading, 'kind'> & {
    spreadSI?: number | null;
    valueSI?: number;
    unit?: string;
    entered?: string | null;
  },
  system: UnitSystem,
) {
  if (r.spreadSI === null || r.spreadSI === undefined || r.kind === 'other') return null;
  const kind = readingQuantity[r.kind];
  const unit =
    r.valueSI !== undefined && r.unit !== undefined
      ? formatMeasured(r.valueSI, kind, system, readingSource({ unit: r.unit, entered: r.entered })).unit
      : undefined;
  return formatSpreadOf(r.spreadSI, kind, system, unit);
}

export const reviewStateLabel = labelsOf(reviewStateVocabulary);

/** "P2 · Gondola arm" (pivots count from 1 for people; joint 0 is the ground pivot). */
export function pivotName(joint: number, names: readonly string[]): string {
  return pivotLabel(joint, names[joint]);
}

export function pivotLabel(joint: number, name: string | null | undefined): string {
  return name ? `P${joint + 1} · ${name}` : `P${joint + 1}`;
}

/** SI units a typed unit may convert from; the first with a factor to it tells the quantity. */
const SI_CANDIDATES = ['m', 'N', 'N m', 'rad', 'rad/s', 's', 'Pa', 'kg', 'm/s^2', 'Hz'];

/**
 * A checklist measurement in the unit the inspector typed it in: the typed text when the record kept it
 * ("0.40 mm"), else the stored value in its shortest exact form in that unit ("79.3 mm"); a unit the
 * converter does not know is shown as the stored SI number, said as such.
 */
export function formatMeasurement(m: { valueSI: number; unit: string; entered?: string | null }): string {
  const unit = m.unit.trim();
  if (m.entered) return unit ? `${m.entered}${unit === '°' ? '' : ' '}${unit}` : m.entered;
  // In this product "g" is standard gravity (as displayed everywhere), not the gram.
  const name = unit === 'g' ? 'gee' : unit;
  if (unit)
    for (const base of SI_CANDIDATES) {
      try {
        return `${formatTyped(m.valueSI * conversionFactor(base, name))} ${unit}`;
      } catch {
        // Not this quantity; try the next.
      }
    }
  return `${formatSignificant(m.valueSI, 4)} (SI${unit ? `; typed in ${unit}` : ''})`;
}
