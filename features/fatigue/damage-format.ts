/**
 * Fatigue results in words, shared by the review desk, the PDF report and the ride's pivot life: a Miner
 * damage (a small pure number, four significant figures with a power of ten), the ride cycles a detail
 * takes to reach its limit, the standards named.
 */
import type { LoadCaseKind } from '@/features/loads/engine';

const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻',
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
};

/** "3.626 × 10⁻⁷"; "0" for no damage; four significant figures between 0.001 and 1000. */
export function formatDamage(d: number): string {
  if (!Number.isFinite(d)) return 'not finite';
  if (d === 0) return '0';
  const exp = Math.floor(Math.log10(Math.abs(d)));
  if (exp >= -3 && exp < 3) return String(Number(d.toPrecision(4)));
  let mantissa = Number((d / 10 ** exp).toPrecision(4));
  let e = exp;
  // Rounding may carry to 10.00.
  if (Math.abs(mantissa) >= 10) {
    mantissa /= 10;
    e += 1;
  }
  return `${mantissa.toFixed(3)} × ${powerOfTen(e)}`;
}

/** "10⁻⁷": a power of ten with its exponent in superscript. */
export const powerOfTen = (exponent: number): string =>
  `10${String(exponent)
    .split('')
    .map((c) => SUPERSCRIPT[c] ?? c)
    .join('')}`;

/** Ride cycles until the damage limit: "1.234 million", "56,700", "Never: no damage". */
export function cyclesToLimitText(damagePerRideCycle: number, damageLimit: number): string {
  if (!(damagePerRideCycle > 0)) return 'Never: no damage';
  const n = damageLimit / damagePerRideCycle;
  if (n >= 1e9) return `${Number((n / 1e9).toPrecision(4))} billion`;
  if (n >= 1e6) return `${Number((n / 1e6).toPrecision(4))} million`;
  return Math.round(Number(n.toPrecision(4))).toLocaleString('en-GB');
}

/** "Δσ_C 80 MPa" or, for a shear detail, "Δτ_C 100 MPa" (EN 1993-1-9 detail category). */
export function categoryText(d: { categoryMPa: number; shear: boolean }): string {
  return `${d.shear ? 'Δτ_C' : 'Δσ_C'} ${Number(d.categoryMPa.toPrecision(4))} MPa`;
}

export const FATIGUE_CASE_WORDS: Record<LoadCaseKind, string> = {
  operating: 'Operating cycle',
  service_stop: 'Service stop',
  emergency_stop: 'Emergency stop',
};

/** How the fatigue numbers were made, with the standards named. */
export const FATIGUE_BASIS =
  'Stress ranges counted by rainflow (ASTM E1049-85, §5.4.4) and summed by Palmgren–Miner on each ' +
  'detail’s EN 1993-1-9 §7 S-N curve (its category, γFf and γMf). One ride cycle is the design’s ride ' +
  'time of operating motion plus its service stops; an emergency stop is counted per stop. The stress per ' +
  'kN comes from the design data, and the loads from idealised rigid-body dynamics.';
