/**
 * A fatigue detail's stress history and damage against closed forms.
 *
 * Sources:
 * - Rigid-body rotation about a fixed axis (any dynamics textbook, e.g. Meriam & Kraige, Engineering
 *   Mechanics: Dynamics, fixed-axis rotation; from memory): the pivot force on the body is F = m·(a_G − g⃗),
 *   a_G = centripetal r_G·ω² toward the pivot plus tangential r_G·α. For a rod turning at constant ω in a
 *   vertical plane, in the rod's frame: along = −m·ω²·r_G + m·g·sin θ, across = m·g·cos θ — each ranges
 *   over 2·m·g per turn, while the force's size only ranges over 2·m·ω²·r_G.
 * - EN 1993-1-9:2005 §7.1 and Figure 7.1: N_R = 2×10⁶·(Δσ_C/Δσ)³ above Δσ_D = 0.737·Δσ_C; the partial
 *   factors γ_Ff on the range and γ_Mf on the strength (§3, Table 3.1). Palmgren–Miner D = Σ n/N (Annex A).
 * - ASTM E1049-85 (2017) §5.4.4: a history repeating block after block counts one full cycle per block
 *   for each closed loop; a one-off monotonic history is one half cycle.
 * - A plane rotation of a vector into a frame turned by θ: (x cos θ + y sin θ, −x sin θ + y cos θ).
 */
import type { FatigueDetail } from '@/features/loads/design-schema';
import { type ChainBody, analyseCycle } from '@/features/loads/engine';
import { detailLoadHistory, detailStressFactor, detailStressHistory } from '@/features/fatigue/detail-stress';
import { damageOfCycles, detailCaseDamage } from '@/features/fatigue/detail-damage';
import { rainflowRepeating } from '@/features/fatigue/rainflow';

const g = 9.81;
const m = 100;
const L = 2;
const rG = L / 2;
const w = 3;
const rod = (name: string, massKg: number, length: number, tip = false): ChainBody => ({
  name,
  massKg,
  cgM: [length / 2, 0],
  inertiaCgKgM2: (massKg * length * length) / 12,
  ...(tip ? { tipM: [length, 0] as const } : {}),
});

const detail = (over: Partial<FatigueDetail>): FatigueDetail => ({
  joint: 0,
  name: 'Pin',
  kind: 'pin_shear',
  member: 'body',
  component: 'across',
  stressPerKnMPa: 50,
  categoryMPa: 80,
  ...over,
});

const span = (a: ArrayLike<number>) => Math.max(...Array.from(a)) - Math.min(...Array.from(a));

describe('a rod turning at constant ω in a vertical plane (m = 100 kg, L = 2 m, ω = 3 rad/s)', () => {
  const cycle = analyseCycle({
    bodies: [rod('Arm', m, L)],
    gravityMS2: g,
    profiles: [{ kind: 'constant', rpm: (w * 60) / (2 * Math.PI) }],
    samples: 361,
  });

  it('across the arm the pin force follows m·g·cos θ: range 2·m·g (textbook fixed-axis rotation)', () => {
    const across = detailLoadHistory(cycle, detail({ component: 'across' }));
    for (let k = 0; k < 361; k += 15)
      expect(across[k]).toBeCloseTo(m * g * Math.cos(cycle.joints[0].angleRad[k]), 6);
    expect(span(across)).toBeCloseTo(2 * m * g, 6);
  });

  it('along the arm it is −m·ω²·r_G + m·g·sin θ: mean −900 N, range 2·m·g (textbook)', () => {
    const along = detailLoadHistory(cycle, detail({ component: 'along' }));
    for (let k = 0; k < 361; k += 15)
      expect(along[k]).toBeCloseTo(-m * w * w * rG + m * g * Math.sin(cycle.joints[0].angleRad[k]), 6);
    expect(span(along)).toBeCloseTo(2 * m * g, 6);
    // The force's size ranges only over 2·m·ω²·r_G = 1800 N: not what a detail following one component sees.
    expect(span(cycle.joints[0].forceMagnitudeN)).toBeCloseTo(2 * m * w * w * rG, 6);
  });

  it('the ground holding it sees the reaction in global axes: x and y each range 2·m·ω²·r_G (textbook)', () => {
    const x = detailLoadHistory(cycle, detail({ member: 'parent', component: 'along' }));
    const y = detailLoadHistory(cycle, detail({ member: 'parent', component: 'across' }));
    for (let k = 0; k < 361; k += 15) {
      const th = cycle.joints[0].angleRad[k];
      // Reaction on the ground = −F, F = m·(−ω²·r_G·(cos θ, sin θ) + (0, g)).
      expect(x[k]).toBeCloseTo(m * w * w * rG * Math.cos(th), 6);
      expect(y[k]).toBeCloseTo(m * w * w * rG * Math.sin(th) - m * g, 6);
    }
    expect(span(x)).toBeCloseTo(2 * m * w * w * rG, 6);
  });

  it('the stress is the factor times the load in kN: 50 MPa/kN × 2·m·g = 98.1 MPa range', () => {
    const stress = detailStressHistory(cycle, detail({ stressPerKnMPa: 50 }));
    expect(span(stress)).toBeCloseTo((50 * 2 * m * g) / 1000, 9);
  });

  it('one full cycle per turn counted as a repeating block (ASTM E1049 §5.4.4, closed loop)', () => {
    const cycles = rainflowRepeating(detailStressHistory(cycle, detail({})));
    const big = cycles.filter((c) => c.range > 1);
    expect(big).toHaveLength(1);
    expect(big[0].count).toBe(1);
    expect(big[0].range).toBeCloseTo((50 * 2 * m * g) / 1000, 6);
  });

  it('Miner damage per turn = (γFf·γMf·Δσ/Δσ_C)³ / 2×10⁶, hand-worked (EN 1993-1-9 §7, m = 3)', () => {
    const d = detail({ categoryMPa: 80, gammaFf: 1.1, gammaMf: 1.15 });
    // Δσ = 50 × 1.962 kN = 98.10 MPa; γFf·Δσ = 107.9 MPa, above Δσ_D/γMf = 0.737 × 80 / 1.15 = 51.3 MPa,
    // so m = 3: N = 2×10⁶ × (69.57 / 107.9)³ = 5.359×10⁵ turns, D = 1.866×10⁻⁶ per turn.
    const range = (50 * 2 * m * g) / 1000;
    const expected = ((1.1 * 1.15 * range) / 80) ** 3 / 2e6;
    expect(expected / 1.866e-6).toBeCloseTo(1, 3);
    const { damage, maxRangeMPa } = detailCaseDamage(d, 'operating', [cycle]);
    expect(maxRangeMPa).toBeCloseTo(range, 6);
    expect(damage / expected).toBeCloseTo(1, 9);
  });

  it('a torque detail uses kN·m: the drive torque m·g·r_G·cos θ ranges 2·m·g·r_G (textbook)', () => {
    const stress = detailStressHistory(cycle, detail({ component: 'torque', stressPerKnMPa: 10 }));
    expect(span(stress)).toBeCloseTo((10 * 2 * m * g * rG) / 1000, 6);
  });
});

describe('the stress factor', () => {
  it('is given, or 1000 / (area × shear planes): 1 kN on 1 mm² is 1000 MPa (SI definition of the MPa)', () => {
    expect(detailStressFactor({ stressPerKnMPa: 12.5 })).toBe(12.5);
    // A Ø60 mm pin in double shear: A = π·30² = 2827 mm² → 1000/(2827·2) = 0.1768 MPa per kN.
    const area = Math.PI * 30 * 30;
    expect(detailStressFactor({ sectionAreaMm2: area, shearPlanes: 2 })).toBeCloseTo(0.17684, 5);
    expect(detailStressFactor({ sectionAreaMm2: 500 })).toBe(2);
    expect(() => detailStressFactor({})).toThrow(/stress per kN or its section area/);
  });
});

describe('the parent frame on a two-body chain (arm swinging, gondola turning on it)', () => {
  const cycle = analyseCycle({
    bodies: [rod('Arm', 800, 6, true), rod('Gondola', 300, 1.5)],
    gravityMS2: g,
    profiles: [
      { kind: 'swing', amplitudeRad: 0.9, periodS: 8, centreRad: -Math.PI / 2 },
      { kind: 'constant', rpm: 7.5 },
    ],
    samples: 241,
  });
  const j1 = cycle.joints[1];

  it('three bodies: the reaction at the third pivot turned by hand by θ_1 = q_0 + q_1 (plane rotation)', () => {
    const three = analyseCycle({
      bodies: [rod('Arm', 800, 6, true), rod('Sweep', 300, 2, true), rod('Car', 150, 1)],
      gravityMS2: g,
      profiles: [
        { kind: 'swing', amplitudeRad: 0.9, periodS: 8, centreRad: -Math.PI / 2 },
        { kind: 'constant', rpm: 7.5 },
        { kind: 'swing', amplitudeRad: 0.4, periodS: 3, phaseRad: 0.3 },
      ],
      samples: 241,
    });
    const j2 = three.joints[2];
    const along = detailLoadHistory(three, detail({ joint: 2, member: 'parent', component: 'along' }));
    const across = detailLoadHistory(three, detail({ joint: 2, member: 'parent', component: 'across' }));
    for (const k of [0, 41, 97, 180, 240]) {
      const th = three.joints[0].angleRad[k] + three.joints[1].angleRad[k];
      const rx = -j2.forceXN[k];
      const ry = -j2.forceYN[k];
      expect(along[k]).toBeCloseTo(rx * Math.cos(th) + ry * Math.sin(th), 6);
      expect(across[k]).toBeCloseTo(-rx * Math.sin(th) + ry * Math.cos(th), 6);
    }
  });

  it('the reaction on the arm, turned by hand into the arm’s frame (plane rotation)', () => {
    const along = detailLoadHistory(cycle, detail({ joint: 1, member: 'parent', component: 'along' }));
    const across = detailLoadHistory(cycle, detail({ joint: 1, member: 'parent', component: 'across' }));
    for (const k of [0, 37, 120, 199, 240]) {
      const th = cycle.joints[0].angleRad[k];
      const rx = -j1.forceXN[k];
      const ry = -j1.forceYN[k];
      expect(along[k]).toBeCloseTo(rx * Math.cos(th) + ry * Math.sin(th), 6);
      expect(across[k]).toBeCloseTo(-rx * Math.sin(th) + ry * Math.cos(th), 6);
    }
  });

  it('with the gondola held square to the arm the two frames agree up to the sign of the reaction', () => {
    const held = analyseCycle({
      bodies: [rod('Arm', 800, 6, true), rod('Gondola', 300, 1.5)],
      gravityMS2: g,
      profiles: [
        { kind: 'swing', amplitudeRad: 0.9, periodS: 8, centreRad: -Math.PI / 2 },
        { kind: 'fixed', angleRad: 0 },
      ],
      samples: 121,
    });
    const bodyAlong = detailLoadHistory(held, detail({ joint: 1, member: 'body', component: 'along' }));
    const parentAlong = detailLoadHistory(held, detail({ joint: 1, member: 'parent', component: 'along' }));
    const parentAcross = detailLoadHistory(held, detail({ joint: 1, member: 'parent', component: 'across' }));
    for (let k = 0; k < 121; k++) {
      expect(parentAlong[k]).toBeCloseTo(-bodyAlong[k], 6);
      expect(parentAcross[k]).toBeCloseTo(-held.joints[1].forceAcrossN[k], 6);
    }
  });

  it('damage from counted cycles is zero below the cut-off Δσ_L = 0.549·0.737·Δσ_C (EN 1993-1-9 §7)', () => {
    const d = detail({ categoryMPa: 100 });
    expect(damageOfCycles([{ range: 0.549 * 73.7 * 0.99, mean: 0, count: 1 }], d).damage).toBe(0);
    expect(damageOfCycles([], d)).toEqual({ maxRangeMPa: 0, damage: 0 });
  });
});
