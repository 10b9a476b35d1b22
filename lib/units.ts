import { UNIT_FACTORS, type UnitName } from '@/lib/unit-factors.generated';

/**
 * Units at the edges: everything inside is SI (m, kg, s, N, N·m, rad, Pa); values are converted only
 * for display and entry. Conversion factors are computed from mathjs's unit definitions at build time
 * (scripts/gen-unit-factors.ts writes lib/unit-factors.generated.ts), never typed by hand; mathjs itself
 * stays out of the app and the server. All our units are linear (no offsets), so a factor is enough.
 */

export type { UnitName } from '@/lib/unit-factors.generated';

export type UnitSystem = 'si' | 'us';

export type QuantityKind =
  | 'force'
  | 'moment'
  | 'length'
  | 'lengthSmall'
  | 'mass'
  | 'angle'
  | 'rate'
  | 'angularAccel'
  | 'accel'
  | 'stress'
  | 'pressure'
  | 'time'
  | 'frequency';

/** A display unit: its label as printed and its unit name in mathjs's syntax (the generated table's key). */
export type DisplayUnit = { label: string; mathjs: UnitName };

const SI_BASE: Record<QuantityKind, UnitName> = {
  force: 'N',
  moment: 'N m',
  length: 'm',
  lengthSmall: 'm',
  mass: 'kg',
  angle: 'rad',
  rate: 'rad/s',
  angularAccel: 'rad/s^2',
  accel: 'm/s^2',
  stress: 'Pa',
  pressure: 'Pa',
  time: 's',
  frequency: 'Hz',
};

function u(label: UnitName): DisplayUnit;
function u(label: string, mathjs: UnitName): DisplayUnit;
function u(label: string, mathjs?: UnitName): DisplayUnit {
  return { label, mathjs: mathjs ?? (label as UnitName) };
}

/**
 * The display units per system, smallest first; a value is shown in the largest unit it reaches at
 * least 1 of (so 850 N stays in N, 12 500 N becomes 12.5 kN). Single entries never switch.
 */
const DISPLAY: Record<UnitSystem, Record<QuantityKind, DisplayUnit[]>> = {
  si: {
    force: [u('N'), u('kN')],
    moment: [u('N·m', 'N m'), u('kN·m', 'kN m')],
    length: [u('m')],
    lengthSmall: [u('mm')],
    mass: [u('kg'), u('t')],
    angle: [u('°', 'deg')],
    rate: [u('rpm')],
    angularAccel: [u('rad/s²', 'rad/s^2')],
    accel: [u('g', 'gee')],
    stress: [u('MPa')],
    pressure: [u('kPa'), u('MPa')],
    time: [u('s')],
    frequency: [u('Hz')],
  },
  us: {
    force: [u('lbf'), u('kip')],
    moment: [u('lbf·ft', 'lbf ft'), u('kip·ft', 'kip ft')],
    length: [u('ft')],
    lengthSmall: [u('in')],
    mass: [u('lb')],
    angle: [u('°', 'deg')],
    rate: [u('rpm')],
    angularAccel: [u('rad/s²', 'rad/s^2')],
    accel: [u('g', 'gee')],
    stress: [u('ksi')],
    pressure: [u('psi')],
    time: [u('s')],
    frequency: [u('Hz')],
  },
};

const FACTORS: Readonly<Record<string, Readonly<Record<string, number>>>> = UNIT_FACTORS;

/** Whether the generated table has factors for a unit name (mathjs syntax). */
export function isKnownUnit(name: string): name is UnitName {
  return Object.prototype.hasOwnProperty.call(FACTORS, name);
}

/**
 * How many `to` make one `from` (unit names in mathjs's syntax, e.g. 'lbf', 'kN m', 'rpm'). Throws for a
 * unit the table does not have or for two different quantities, as mathjs did.
 */
export function conversionFactor(from: string, to: string): number {
  const f = isKnownUnit(from) && isKnownUnit(to) ? FACTORS[from][to] : undefined;
  if (f === undefined) throw new Error(`No conversion from "${from}" to "${to}"`);
  return f;
}

export function convert(value: number, from: UnitName, to: UnitName): number {
  return value * conversionFactor(from, to);
}

/** An SI value of a kind, in a named display unit. */
export function fromSI(valueSI: number, kind: QuantityKind, unit: UnitName): number {
  return convert(valueSI, SI_BASE[kind], unit);
}

/** A value entered in a named unit, back to SI for the kind. */
export function toSI(value: number, kind: QuantityKind, unit: UnitName): number {
  return convert(value, unit, SI_BASE[kind]);
}

export function displayUnits(kind: QuantityKind, system: UnitSystem): readonly DisplayUnit[] {
  return DISPLAY[system][kind];
}

/** The unit a value is shown in: the largest of the kind's units that the value reaches 1 of. */
export function pickDisplayUnit(valueSI: number, kind: QuantityKind, system: UnitSystem): DisplayUnit {
  const units = DISPLAY[system][kind];
  let chosen = units[0];
  for (const unit of units) if (Math.abs(fromSI(valueSI, kind, unit.mathjs)) >= 1) chosen = unit;
  return chosen;
}

/**
 * A number to `sig` significant figures without exponent notation; digits left of the point are never
 * rounded away (12 346 stays 12346 rather than 12350), which reads better on a gauge-like display.
 */
export function formatSignificant(value: number, sig = 4): string {
  if (!Number.isFinite(value)) return value > 0 ? '∞' : value < 0 ? '−∞' : '—';
  if (value === 0) return '0';
  // Magnitude after rounding, so 9.9996 becomes 10.00 and not 10.000.
  const rounded = Number(value.toPrecision(sig));
  const magnitude = Math.floor(Math.log10(Math.abs(rounded)));
  const decimals = Math.max(0, sig - 1 - magnitude);
  // Tiny values beyond 20 decimals are noise for this product (and toFixed's comfort zone).
  const text = value.toFixed(Math.min(decimals, 20));
  // −0.000 after rounding is still zero.
  return Number(text) === 0 ? '0' : text;
}

type FormattedQuantity = { value: string; unit: string; text: string };

type FormatOptions = { unit?: string; sig?: number };

/** An SI value shown in the system's units with 3–4 significant figures: `{ value, unit, text }`. */
export function formatQuantity(
  valueSI: number,
  kind: QuantityKind,
  system: UnitSystem,
  options: FormatOptions = {},
): FormattedQuantity {
  const unit = options.unit
    ? (DISPLAY[system][kind].find((d) => d.label === options.unit || d.mathjs === options.unit) ??
        // Any other name is taken as a unit name; conversion refuses one the table lacks.
        { label: options.unit, mathjs: options.unit as UnitName })
    : pickDisplayUnit(valueSI, kind, system);
  const shown = fromSI(valueSI, kind, unit.mathjs);
  const value = formatSignificant(shown, options.sig ?? 4);
  const sep = unit.label === '°' ? '' : ' ';
  return { value, unit: unit.label, text: `${value}${sep}${unit.label}` };
}
