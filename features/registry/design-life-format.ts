/**
 * A pivot's pin-check data, its NDT plans and the ride's fatigue details as people read them, in the
 * person's unit system. Design values are shown as the document states them (no padding zeros); unit
 * conversions go through lib/units. Pure, so the tables' text is tested.
 */
import {
  NDT_METHOD_WORDS,
  type DesignData,
  type DesignPivot,
  type FatigueComponent,
  type FatigueDetail,
  type FatigueDetailKind,
  type PinCheckData,
} from '@/features/loads/design-schema';
import { detailStressFactor } from '@/features/fatigue';
import { quantityPair } from '@/features/registry/design-diff-collector';
import { type QuantityKind, type UnitSystem, convert, formatSignificant } from '@/lib/units';

/** A design value in the system's unit, as stated: "650 MPa", "35 mm" (converted: four figures). */
export const q = (value: number, kind: QuantityKind, system: UnitSystem): string =>
  quantityPair(value, undefined, kind, system)[0] ?? '—';

/** A design value as stated: up to six figures, no padding zeros ("1.15", "0.062", "20106"). */
export const stated = (v: number) => String(Number(v.toPrecision(6))).replace(/^-/, '−');

/** Each NDT method in words (one list, beside the methods in the design-data contract). */
export const ndtMethodLabel = NDT_METHOD_WORDS;

/** "every 365 days (1 year)": whole years are named, as manuals state them. */
export function ndtIntervalText(days: number): string {
  const years = days / 365;
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  return Number.isInteger(years)
    ? `every ${plural(days, 'day')} (${plural(years, 'year')})`
    : `every ${plural(days, 'day')}`;
}

export const fatigueKindLabel: Record<FatigueDetailKind, string> = {
  pin_shear: 'Pin in shear',
  lug_net_section: 'Lug net section',
  weld_toe: 'Weld toe',
  bolt: 'Bolt',
  other: 'Other detail',
};

const componentWord: Record<FatigueComponent, string> = {
  along: 'Force along',
  across: 'Force across',
  torque: 'Torque on',
};

/**
 * The load a detail follows and the frame it is taken in: "Force across Main arm (the body the pivot
 * carries, in its frame)". The ground, which holds joint 0, has the global frame: x across, y up.
 */
export function detailLoadText(d: Pick<FatigueDetail, 'joint' | 'member' | 'component'>, data: DesignData) {
  const body = (i: number) => data.bodies[i]?.name ?? `body ${i + 1}`;
  if (d.member === 'body') return `${componentWord[d.component]} ${body(d.joint)} (carried body, its frame)`;
  if (d.joint === 0)
    return d.component === 'torque'
      ? 'Torque on the ground (holding side)'
      : `${d.component === 'along' ? 'Horizontal' : 'Vertical'} force on the ground (global x, y)`;
  return `${componentWord[d.component]} ${body(d.joint - 1)} (holding body, its frame)`;
}

/** MPa per kN (per kN·m for a torque), in the system's units. */
function perLoadText(mpaPerKn: number, torque: boolean, system: UnitSystem, given: boolean): string {
  if (system === 'si')
    return `${given ? stated(mpaPerKn) : formatSignificant(mpaPerKn, 3)} MPa/${torque ? 'kN·m' : 'kN'}`;
  const value = torque
    ? convert(mpaPerKn, 'MPa/(kN m)', 'ksi/(kip ft)')
    : convert(mpaPerKn, 'MPa/kN', 'ksi/kip');
  return `${formatSignificant(value, 3)} ksi/${torque ? 'kip·ft' : 'kip'}`;
}

/** The stress per unit load (MPa per kN, or per kN·m): the fatigue engine's own rule, given or derived. */
export const stressPerLoad = detailStressFactor;

/**
 * The stress per unit load as given, or the section it comes from and what that gives:
 * "20106 mm², 2 planes → 0.0249 MPa/kN" (stress = load / (area × planes); 1 kN on 1 mm² is 1000 MPa).
 */
export function stressFactorText(
  d: Pick<FatigueDetail, 'stressPerKnMPa' | 'sectionAreaMm2' | 'shearPlanes' | 'component'>,
  system: UnitSystem,
): string {
  const torque = d.component === 'torque';
  if (d.stressPerKnMPa !== undefined) return perLoadText(d.stressPerKnMPa, torque, system, true);
  if (d.sectionAreaMm2 === undefined) return '—';
  const planes = d.shearPlanes ?? 1;
  const area =
    system === 'si'
      ? `${stated(d.sectionAreaMm2)} mm²`
      : `${formatSignificant(convert(d.sectionAreaMm2, 'mm^2', 'in^2'), 4)} in²`;
  const derived = perLoadText(stressPerLoad(d), torque, system, false);
  return `${area}${planes === 2 ? ', 2 planes' : ''} → ${derived}`;
}

/** "71 (Δσ_C 71 MPa)" / "100 (Δτ_C 100 MPa)": the category is named by its MPa value at 2×10⁶ cycles. */
export function categoryText(d: Pick<FatigueDetail, 'categoryMPa' | 'shear'>, system: UnitSystem): string {
  const symbol = d.shear ? 'Δτ_C' : 'Δσ_C';
  return `${stated(d.categoryMPa)} (${symbol} ${q(d.categoryMPa * 1e6, 'stress', system)})`;
}

/** The S-N curve's shape (EN 1993-1-9 §7). */
export function curveText(d: Pick<FatigueDetail, 'shear'>): string {
  return d.shear ? 'Shear: m = 5 to 10⁸' : 'Direct: m = 3 to 5×10⁶, then 5 to 10⁸';
}

/** A partial factor or limit as given, else its default marked * (the tables say what * means). */
export function givenOr(value: number | undefined, fallback: number): string {
  return value === undefined ? `${stated(fallback)}*` : stated(value);
}

/** "γFf 1* · γMf 1.15": a detail's partial factors, * where the default 1 applies. */
export function fatigueFactorsText(d: Pick<FatigueDetail, 'gammaFf' | 'gammaMf'>): string {
  return `γFf ${givenOr(d.gammaFf, 1)} · γMf ${givenOr(d.gammaMf, 1)}`;
}

/** "42CrMo4+QT · f_y 550 MPa · f_u 800 MPa"; `lines` puts the strengths under the grade (a table cell). */
export function pinSteelText(p: PinCheckData, system: UnitSystem, lines = false): string {
  const strengths = `f_y ${q(p.pinFyPa, 'stress', system)} · f_u ${q(p.pinFuPa, 'stress', system)}`;
  return `${p.pinGrade}${lines ? '\n' : ' · '}${strengths}`;
}

/** "S355 · f_y 335 MPa". */
export function plateSteelText(p: PinCheckData, system: UnitSystem): string {
  return `${p.plateGrade} · f_y ${q(p.plateFyPa, 'stress', system)}`;
}

/** The clevis: "lug 60 mm · cheeks 2 × 40 mm · gap 4 mm" (one cheek in single shear). */
export function platesText(p: PinCheckData, shear: DesignPivot['shear'], system: UnitSystem): string {
  const t = (v: number) => q(v, 'lengthSmall', system);
  const cheeks = shear === 'double' ? `cheeks 2 × ${t(p.outerPlateM)}` : `cheek ${t(p.outerPlateM)}`;
  return `lug ${t(p.innerPlateM)} · ${cheeks} · gap ${t(p.gapM)}`;
}

/** EN 1993-1-8's recommended partial factors, used where the design data gives none. */
export const PIN_FACTOR_DEFAULTS = { gammaM0: 1, gammaM2: 1.25, gammaM6ser: 1, gammaF: 1 } as const;

/** "γM0 1 · γM2 1.25* · γM6,ser 1* · γF 1*" — * marks EN 1993-1-8's recommended value (not given). */
export function pinFactorsText(p: PinCheckData): string {
  const f = (label: string, key: keyof typeof PIN_FACTOR_DEFAULTS) =>
    `${label} ${p[key] === undefined ? `${stated(PIN_FACTOR_DEFAULTS[key])}*` : stated(p[key])}`;
  return [f('γM0', 'gammaM0'), f('γM2', 'gammaM2'), f('γM6,ser', 'gammaM6ser'), f('γF', 'gammaF')].join(
    ' · ',
  );
}
