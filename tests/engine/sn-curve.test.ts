import { N_C, N_D, N_L, cyclesToFailure, minerDamage, snCurve } from '@/features/fatigue';

/**
 * EN 1993-1-9 §7 fatigue strength curves and the Palmgren–Miner sum (EN 1993-1-9 §8 / Annex A [mem]) against
 * the standard's own definitions (Δσ_D = (2/5)^(1/3)·Δσ_C, Δσ_L = (5/100)^(1/5)·Δσ_D, Δτ_L =
 * (2/100)^(1/5)·Δτ_C, slopes 3 and 5 / 5) and values worked by hand. The rounded ratios and the
 * category-71 points are the ones in /work/shared/notes/domain.md (EN 1993-1-9 curves, ratios
 * recomputed there).
 */

/** Relative closeness, for values quoted to three significant figures. */
const expectNear = (actual: number, expected: number, rel = 0.005) =>
  expect(Math.abs(actual - expected) / Math.abs(expected)).toBeLessThan(rel);

describe('EN 1993-1-9 §7 curve points', () => {
  test('Δσ_D/Δσ_C = 0.737, Δσ_L/Δσ_D = 0.549 (direct stress), Δτ_L/Δτ_C = 0.457 (shear)', () => {
    const direct = snCurve(100);
    expect(direct.deltaSigmaDMPa! / direct.deltaSigmaCMPa).toBeCloseTo(0.737, 3);
    expect(direct.deltaSigmaLMPa / direct.deltaSigmaDMPa!).toBeCloseTo(0.549, 3);
    const shear = snCurve(100, { shear: true });
    expect(shear.deltaSigmaDMPa).toBeNull();
    expect(shear.deltaSigmaLMPa / shear.deltaSigmaCMPa).toBeCloseTo(0.457, 3);
  });

  test('category 71: Δσ_D = 52.3 MPa, Δσ_L = 28.7 MPa; 60 MPa lasts 3.31×10⁶ cycles, 40 MPa 1.91×10⁷', () => {
    const c71 = snCurve(71);
    expect(c71.deltaSigmaCMPa).toBe(71);
    expect(c71.deltaSigmaDMPa).toBeCloseTo(52.3, 1);
    expect(c71.deltaSigmaLMPa).toBeCloseTo(28.7, 1);
    expectNear(cyclesToFailure(60, c71), 3.31e6);
    expectNear(cyclesToFailure(40, c71), 1.91e7);
  });

  test('the curve passes 2×10⁶ at Δσ_C, 5×10⁶ at Δσ_D and 10⁸ at Δσ_L for every category (160 … 36)', () => {
    for (const category of [160, 140, 125, 112, 100, 90, 80, 71, 63, 56, 50, 45, 40, 36]) {
      const curve = snCurve(category);
      expect(cyclesToFailure(curve.deltaSigmaCMPa, curve) / N_C).toBeCloseTo(1, 12);
      expect(cyclesToFailure(curve.deltaSigmaDMPa!, curve) / N_D).toBeCloseTo(1, 12);
      expect(cyclesToFailure(curve.deltaSigmaLMPa, curve) / N_L).toBeCloseTo(1, 12);
      const shear = snCurve(category, { shear: true });
      expect(cyclesToFailure(shear.deltaSigmaCMPa, shear) / N_C).toBeCloseTo(1, 12);
      expect(cyclesToFailure(shear.deltaSigmaLMPa, shear) / N_L).toBeCloseTo(1, 12);
    }
  });

  test('slopes: m = 3 above Δσ_D, m = 5 between Δσ_D and Δσ_L; shear m = 5 (EN 1993-1-9 §7; figure numbers 7.1, 7.2 [mem])', () => {
    const c = snCurve(90);
    // Halving a range above Δσ_D (here 180 → 90) multiplies life by 2³; between D and L by 2⁵ (30·2 → 30).
    expect(cyclesToFailure(90, c) / cyclesToFailure(180, c)).toBeCloseTo(8, 10);
    const low = c.deltaSigmaLMPa * 1.1;
    expect(cyclesToFailure(low, c) / cyclesToFailure(low * 1.5, c)).toBeCloseTo(1.5 ** 5, 10);
    const s = snCurve(100, { shear: true });
    expect(cyclesToFailure(60, s) / cyclesToFailure(120, s)).toBeCloseTo(32, 10);
  });

  test('cut-off: below Δσ_L no damage (N = ∞); exactly at Δσ_L the curve’s end, 10⁸ cycles', () => {
    const c = snCurve(71);
    expect(cyclesToFailure(c.deltaSigmaLMPa * 0.999, c)).toBe(Infinity);
    expect(cyclesToFailure(28, c)).toBe(Infinity);
    expect(cyclesToFailure(0, c)).toBe(Infinity);
    expect(cyclesToFailure(c.deltaSigmaLMPa, c)).toBeCloseTo(N_L, 0);
    expect(cyclesToFailure(44, snCurve(100, { shear: true }))).toBe(Infinity); // Δτ_L = 45.7
  });

  test('γ_Mf divides the whole curve; the returned curve is that design curve', () => {
    const c = snCurve(90, { gammaMf: 1.35 });
    expect(c.deltaSigmaCMPa).toBeCloseTo(66.667, 3);
    expect(c.deltaSigmaDMPa).toBeCloseTo(0.7368 * 66.667, 1);
    expect(c.deltaSigmaLMPa).toBeCloseTo(0.5493 * 0.7368 * 66.667, 1);
  });

  test('refuses a category ≤ 0 and γ_Mf < 1', () => {
    expect(() => snCurve(0)).toThrow(RangeError);
    expect(() => snCurve(-71)).toThrow(RangeError);
    expect(() => snCurve(71, { gammaMf: 0.9 })).toThrow(RangeError);
  });
});

describe('Palmgren–Miner sums worked by hand', () => {
  test('category 71: 10⁶ × 60 MPa + 5×10⁶ × 40 MPa + 10⁹ × 20 MPa', () => {
    /*
     * 60 > Δσ_D = 52.31: N = 2e6·(71/60)³ = 2e6 × 1.65700 = 3.3140e6 → D₁ = 1e6/3.3140e6 = 0.30175
     * 40 between Δσ_L and Δσ_D: N = 5e6·(52.313/40)⁵ = 5e6 × 3.8261 = 1.9131e7 → D₂ = 5e6/1.9131e7 = 0.26136
     * 20 < Δσ_L = 28.73: N = ∞ → D₃ = 0.            Σ = 0.56311
     */
    const r = minerDamage(
      [
        { rangeMPa: 60, count: 1e6 },
        { rangeMPa: 40, count: 5e6 },
        { rangeMPa: 20, count: 1e9 },
      ],
      { categoryMPa: 71 },
    );
    expect(r.cycles[0].cyclesToFailure! / 3.314e6).toBeCloseTo(1, 3);
    expect(r.cycles[0].damage).toBeCloseTo(0.30175, 4);
    expect(r.cycles[1].damage).toBeCloseTo(0.26136, 4);
    expect(r.cycles[2]).toEqual({ rangeMPa: 20, count: 1e9, cyclesToFailure: null, damage: 0 });
    expect(r.damage).toBeCloseTo(0.56311, 4);
    expect(r.curve).toEqual(snCurve(71));
    // JSON-safe: no Infinity anywhere.
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });

  test('γ_Ff = 1.2, γ_Mf = 1.35, category 90, 10⁶ × 50 MPa: D = ½·(60/66.67)³ = 0.3645', () => {
    /*
     * Factored range 1.2 × 50 = 60 MPa; design curve Δσ_C/γ_Mf = 90/1.35 = 66.667, Δσ_D = 49.12 < 60,
     * so N = 2e6·(66.667/60)³ and D = 1e6/N = ½·(0.9)³ = 0.3645. The echo keeps the range as given.
     */
    const r = minerDamage([{ rangeMPa: 50, count: 1e6 }], { categoryMPa: 90, gammaFf: 1.2, gammaMf: 1.35 });
    expect(r.damage).toBeCloseTo(0.3645, 10);
    expect(r.cycles[0].rangeMPa).toBe(50);
    expect(r.cycles[0].cyclesToFailure).toBeCloseTo(2e6 / 0.729, 0);
    expect(r.curve.deltaSigmaCMPa).toBeCloseTo(66.667, 3);
  });

  test('γ_Ff lifts a range over the cut-off: 27 MPa on category 71 does nothing, × 1.1 = 29.7 MPa does', () => {
    /* 29.7 between Δσ_L = 28.73 and Δσ_D = 52.31: N = 5e6·(52.313/29.7)⁵ = 5e6 × 16.954 = 8.4771e7. */
    expect(minerDamage([{ rangeMPa: 27, count: 1e7 }], { categoryMPa: 71 }).damage).toBe(0);
    const r = minerDamage([{ rangeMPa: 27, count: 1e7 }], { categoryMPa: 71, gammaFf: 1.1 });
    expect(r.cycles[0].cyclesToFailure! / 8.4771e7).toBeCloseTo(1, 3);
    expect(r.damage).toBeCloseTo(0.11797, 4);
  });

  test('shear, Δτ_C = 100: 2×10⁶ × 80 MPa + 6.4×10⁶ × 50 MPa + any × 40 MPa = 0.8⁵ + 0.1', () => {
    /*
     * m = 5 throughout: N(80) = 2e6·(100/80)⁵ → D = 2e6/N = 0.8⁵ = 0.32768; N(50) = 2e6·2⁵ = 6.4e7 →
     * D = 6.4e6/6.4e7 = 0.1; 40 < Δτ_L = 45.73 → 0.  Σ = 0.42768
     */
    const r = minerDamage(
      [
        { rangeMPa: 80, count: 2e6 },
        { rangeMPa: 50, count: 6.4e6 },
        { rangeMPa: 40, count: 1e12 },
      ],
      { categoryMPa: 100, shear: true },
    );
    expect(r.cycles.map((c) => c.damage)).toEqual([expect.closeTo(0.32768, 10), expect.closeTo(0.1, 10), 0]);
    expect(r.damage).toBeCloseTo(0.42768, 10);
    expect(r.curve.deltaSigmaDMPa).toBeNull();
    expect(r.curve.deltaSigmaLMPa).toBeCloseTo(45.73, 2);
  });

  test('half cycles count half; no cycles, no damage; bad input refused', () => {
    const whole = minerDamage([{ rangeMPa: 100, count: 1 }], { categoryMPa: 71 }).damage;
    const halves = minerDamage(
      [
        { rangeMPa: 100, count: 0.5 },
        { rangeMPa: 100, count: 0.5 },
      ],
      { categoryMPa: 71 },
    ).damage;
    expect(halves).toBeCloseTo(whole, 15);
    expect(minerDamage([], { categoryMPa: 71 })).toEqual({ damage: 0, cycles: [], curve: snCurve(71) });
    expect(() => minerDamage([{ rangeMPa: -1, count: 1 }], { categoryMPa: 71 })).toThrow(RangeError);
    expect(() => minerDamage([{ rangeMPa: 1, count: -1 }], { categoryMPa: 71 })).toThrow(RangeError);
    expect(() => minerDamage([], { categoryMPa: 71, gammaFf: 0.5 })).toThrow(RangeError);
  });
});
