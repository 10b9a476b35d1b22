/**
 * Values at and just past their limits, as the load engine evaluates them, with the typed texts of the
 * record they came from. Pure (no server, no React): the notice issuer's test, the e-mail and PDF test
 * and the app's notice view test all format these same values. Invented demo data.
 */
import { evaluateLimit, type EnvelopeItem, type Limit } from '@/features/loads/engine';
import { formatEnvelopeItem, measuredSources } from '@/features/loads/format';

const mm = (x: number) => x / 1000;
const pin: Limit = { kind: 'lower', min: mm(139), nominal: mm(140) };
const item = (
  id: string,
  label: string,
  quantity: EnvelopeItem['quantity'],
  value: number,
  limit: Limit,
) => ({
  id,
  label,
  quantity,
  ...evaluateLimit(value, limit),
});

/** Typed "139.05", "139.0" and "0.50" mm against 139 mm and 0.5 mm; a computed force just past 210 kN. */
export const limitEnvelope: EnvelopeItem[] = [
  item('joints.0.pin.diameter', 'Main pivot: pin diameter (wear)', 'lengthSmall', mm(139.05), pin),
  item('joints.1.pin.diameter', 'Arm pivot: pin diameter (wear)', 'lengthSmall', mm(139.0), pin),
  item('joints.1.pin.clearance', 'Arm pivot: bushing clearance', 'lengthSmall', mm(0.5), {
    kind: 'upper',
    max: mm(0.5),
  }),
  item('joints.0.force', 'Main pivot: peak pivot force', 'force', 210_000.3, { kind: 'upper', max: 210_000 }),
];

export const limitReadings = [
  { id: 'r1', kind: 'pin_diameter', joint: 0, unit: 'mm', entered: '139.05' },
  { id: 'r2', kind: 'pin_diameter', joint: 1, unit: 'mm', entered: '139.0' },
  { id: 'r3', kind: 'clearance', joint: 1, unit: 'mm', entered: '0.50' },
];

/** The strings the one rule gives for these values, as every display must print them. */
export const limitStrings = (() => {
  const sources = measuredSources({ readings: limitReadings });
  return limitEnvelope.map((i) => ({
    label: i.label,
    status: i.status,
    ...formatEnvelopeItem(i, 'si', sources.get(i.id)),
  }));
})();
