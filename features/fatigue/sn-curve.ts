/**
 * EN 1993-1-9 §7 fatigue strength curves and the Palmgren–Miner damage sum. Stresses in MPa (N/mm²).
 *
 * Partial factors, as §6–§7 apply them: each stress range is multiplied by γ_Ff, and compared with the
 * curve whose reference strength is Δσ_C/γ_Mf. The curve returned (`snCurve`, `minerDamage().curve`) is
 * that design curve — all three values already divided by γ_Mf — since it is the one the ranges met.
 *
 * Cut-off: a range strictly below Δσ_L does no damage; a range exactly at Δσ_L lies on the curve's end
 * (10⁸ cycles) and counts.
 */

/** Cycles at the reference strength Δσ_C (or Δτ_C). */
export const N_C = 2e6;
/** Cycles at the constant-amplitude fatigue limit Δσ_D (direct stress). */
export const N_D = 5e6;
/** Cycles at the cut-off limit Δσ_L (and Δτ_L). */
export const N_L = 1e8;

/**
 * A design S-N curve: `deltaSigmaDMPa` is null for shear, whose curve has one slope (m = 5) down to its
 * cut-off Δτ_L; for shear the C and L values are Δτ_C/γ_Mf and Δτ_L.
 */
export type SnCurve = { deltaSigmaCMPa: number; deltaSigmaDMPa: number | null; deltaSigmaLMPa: number };

export type SnOptions = { shear?: boolean; gammaMf?: number };

/**
 * The EN 1993-1-9 curve for detail category `categoryMPa` (Δσ_C or Δτ_C at 2×10⁶ cycles) divided by γ_Mf.
 * Direct stress: Δσ_D = (2/5)^(1/3)·Δσ_C (m = 3 above it), Δσ_L = (5/100)^(1/5)·Δσ_D (m = 5 between).
 * Shear: Δτ_L = (2/100)^(1/5)·Δτ_C (m = 5 throughout).
 */
export function snCurve(categoryMPa: number, options: SnOptions = {}): SnCurve {
  const gammaMf = options.gammaMf ?? 1;
  if (!(categoryMPa > 0) || !Number.isFinite(categoryMPa)) {
    throw new RangeError('The detail category must be a finite stress above 0 MPa.');
  }
  if (!(gammaMf >= 1) || !Number.isFinite(gammaMf)) throw new RangeError('γ_Mf must be at least 1.');
  const c = categoryMPa / gammaMf;
  if (options.shear)
    return { deltaSigmaCMPa: c, deltaSigmaDMPa: null, deltaSigmaLMPa: (N_C / N_L) ** (1 / 5) * c };
  const d = (N_C / N_D) ** (1 / 3) * c;
  return { deltaSigmaCMPa: c, deltaSigmaDMPa: d, deltaSigmaLMPa: (N_D / N_L) ** (1 / 5) * d };
}

/**
 * Cycles to failure N_R for a (factored) stress range on `curve`; Infinity below the cut-off Δσ_L.
 * Direct: N = 2×10⁶·(Δσ_C/Δσ)³ at or above Δσ_D, 5×10⁶·(Δσ_D/Δσ)⁵ from Δσ_L up to Δσ_D.
 * Shear: N = 2×10⁶·(Δτ_C/Δτ)⁵ from Δτ_L up.
 */
export function cyclesToFailure(rangeMPa: number, curve: SnCurve): number {
  if (!(rangeMPa >= curve.deltaSigmaLMPa) || rangeMPa <= 0) return Infinity;
  const d = curve.deltaSigmaDMPa;
  if (d === null) return N_C * (curve.deltaSigmaCMPa / rangeMPa) ** 5;
  if (rangeMPa >= d) return N_C * (curve.deltaSigmaCMPa / rangeMPa) ** 3;
  return N_D * (d / rangeMPa) ** 5;
}

export type MinerOptions = { categoryMPa: number; shear?: boolean; gammaFf?: number; gammaMf?: number };

/** One range of a Miner sum: `cyclesToFailure` is null when the range does no damage (JSON has no ∞). */
export type MinerCycle = { rangeMPa: number; count: number; cyclesToFailure: number | null; damage: number };

export type MinerResult = { damage: number; cycles: MinerCycle[]; curve: SnCurve };

/**
 * Palmgren–Miner damage D = Σ nᵢ/Nᵢ (EN 1993-1-9; clause numbers §8 and Annex A from memory) of stress ranges (MPa, as given,
 * before γ_Ff) with their counts. Each entry echoes its range and count, with N_R and the damage of the
 * factored range γ_Ff·Δσ on the curve for Δσ_C/γ_Mf.
 */
export function minerDamage(
  cycles: readonly { rangeMPa: number; count: number }[],
  options: MinerOptions,
): MinerResult {
  const gammaFf = options.gammaFf ?? 1;
  if (!(gammaFf >= 1) || !Number.isFinite(gammaFf)) throw new RangeError('γ_Ff must be at least 1.');
  const curve = snCurve(options.categoryMPa, { shear: options.shear, gammaMf: options.gammaMf });
  let damage = 0;
  const out: MinerCycle[] = new Array(cycles.length);
  for (let i = 0; i < cycles.length; i++) {
    const { rangeMPa, count } = cycles[i];
    if (!(rangeMPa >= 0) || !(count >= 0) || !Number.isFinite(rangeMPa) || !Number.isFinite(count)) {
      throw new RangeError(`Cycle ${i} needs a finite range and count of at least 0.`);
    }
    const n = cyclesToFailure(gammaFf * rangeMPa, curve);
    const d = n === Infinity ? 0 : count / n;
    damage += d;
    out[i] = { rangeMPa, count, cyclesToFailure: n === Infinity ? null : n, damage: d };
  }
  return { damage, cycles: out, curve };
}
