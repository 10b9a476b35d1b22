/**
 * Fatigue over an analysis's load cases: a swing's stop counted once, the damage per ride cycle, and the
 * design details of a whole analysis.
 *
 * Sources:
 * - Fixed-axis rotation (any dynamics textbook, e.g. Meriam & Kraige, Dynamics; from memory): in the body's
 *   frame the pin force across a rod is m·(α·r_G + g·cos θ). A pendulum hanging at θ = −90° + φ braked at a
 *   constant α₀ from its swing's peak rate ω₀ turns φ_end = ω₀²/(2·α₀) before it rests, so the force across
 *   it climbs without turning back from −m·α₀·r_G to m·g·sin φ_end: one range of m·(g·sin φ_end + α₀·r_G).
 * - ASTM E1049-85 (2017) §5.4.4: a one-off history with one rise is one half cycle (the residue).
 * - EN 1993-1-9:2005 §7.1: N_R = 2×10⁶·(Δσ_C/Δσ)³ above Δσ_D = 0.737·Δσ_C; Palmgren–Miner D = Σ n/N.
 * - The ride cycle (this project's definition, design-schema.ts `fatigue`): rideCycleS of operating motion
 *   and stopsPerRideCycle service stops; D = D_op·rideCycleS/T_op + stops·D_stop. Emergency stops are
 *   events, reported per stop.
 */
import type { FatigueDetail } from '@/features/loads/design-schema';
import { type ChainBody, type CycleInput } from '@/features/loads/engine';
import { analyseLoadCases } from '@/features/loads/load-cases';
import {
  damagePerRideCycle,
  detailCaseDamage,
  fatigueOfLoadCases,
  governingFatigueCase,
} from '@/features/fatigue/detail-damage';
import { detailLoadHistory } from '@/features/fatigue/detail-stress';
import { rainflow } from '@/features/fatigue/rainflow';

const g = 9.81;
const m = 400;
const L = 5;
const rG = L / 2;
const rod: ChainBody = { name: 'Arm', massKg: m, cgM: [rG, 0], inertiaCgKgM2: (m * L * L) / 12 };

const detail = (over: Partial<FatigueDetail>): FatigueDetail => ({
  joint: 0,
  name: 'Lug',
  kind: 'lug_net_section',
  member: 'body',
  component: 'across',
  stressPerKnMPa: 40,
  categoryMPa: 71,
  ...over,
});

describe('a swing braked at the centre of its swing (pendulum, amplitude 0.6 rad, period 6 s, α₀ = 0.5 rad/s²)', () => {
  const amplitude = 0.6;
  const period = 6;
  const a0 = 0.5;
  const w0 = (amplitude * 2 * Math.PI) / period;
  const phiEnd = (w0 * w0) / (2 * a0); // 0.395 rad, inside the swing
  const input: CycleInput = {
    bodies: [rod],
    profiles: [{ kind: 'swing', amplitudeRad: amplitude, periodS: period, centreRad: -Math.PI / 2 }],
    gravityMS2: g,
    samples: 361,
  };
  const cases = analyseLoadCases(input, [{ joint: 0, serviceDecelRadS2: a0 }]);
  const stop = cases.cases.find((c) => c.kind === 'service_stop');

  it('runs the stop both ways from the centre', () => {
    expect(stop?.results).toHaveLength(2);
  });

  it('the force across the arm climbs once by m·(g·sin φ_end + α₀·r_G) = 2009 N (textbook), one half cycle (ASTM E1049)', () => {
    const range = m * (g * Math.sin(phiEnd) + a0 * rG);
    expect(range).toBeCloseTo(2009.2, 0);
    for (const run of stop?.results ?? []) {
      const across = detailLoadHistory(run, detail({}));
      const cycles = rainflow(across).filter((c) => c.range > 1e-6 * range);
      expect(cycles).toHaveLength(1);
      expect(cycles[0].count).toBe(0.5);
      expect(cycles[0].range).toBeCloseTo(range, 3);
    }
  });

  it('its damage per stop is half a cycle on the EN 1993-1-9 curve, hand-worked', () => {
    // Δσ = 40 MPa/kN × 2.009 kN = 80.38 MPa > Δσ_D = 0.737 × 71 = 52.3 MPa: N = 2×10⁶ × (71/80.38)³.
    const rangeMPa = (40 * m * (g * Math.sin(phiEnd) + a0 * rG)) / 1000;
    const expected = 0.5 / (2e6 * (71 / rangeMPa) ** 3);
    expect(expected / 3.626e-7).toBeCloseTo(1, 3);
    const got = detailCaseDamage(detail({}), 'service_stop', stop?.results ?? []);
    expect(got.maxRangeMPa / rangeMPa).toBeCloseTo(1, 5);
    expect(got.damage / expected).toBeCloseTo(1, 5);
  });
});

describe('damage per ride cycle', () => {
  it('is D_op × rideCycleS / T_op + stops × D_stop (the ride cycle’s definition)', () => {
    // 1e-6 per 12 s cycle over a 90 s ride: 7.5e-6; two stops of 2e-7 add 4e-7.
    expect(damagePerRideCycle(1e-6, 12, 2e-7, { rideCycleS: 90, stopsPerRideCycle: 2 })).toBeCloseTo(
      7.9e-6,
      18,
    );
    expect(damagePerRideCycle(1e-6, 12, 2e-7, { rideCycleS: 90 })).toBeCloseTo(7.7e-6, 18);
    expect(damagePerRideCycle(1e-6, 12, 2e-7, { rideCycleS: 90, stopsPerRideCycle: 0 })).toBeCloseTo(
      7.5e-6,
      18,
    );
  });
});

describe('every detail of a design over its load cases (rod at 10 rpm, service and emergency stops)', () => {
  const rpm = 10;
  const input: CycleInput = {
    bodies: [rod],
    profiles: [{ kind: 'constant', rpm }],
    gravityMS2: g,
    samples: 361,
  };
  const lc = analyseLoadCases(input, [{ joint: 0, serviceDecelRadS2: 0.4, emergencyDecelRadS2: 1.2 }]);
  const details: FatigueDetail[] = [
    detail({
      name: 'Pin shear',
      kind: 'pin_shear',
      component: 'across',
      sectionAreaMm2: 2000,
      shearPlanes: 2,
      stressPerKnMPa: undefined,
      categoryMPa: 100,
      shear: true,
    }),
    detail({
      name: 'Hub weld toe',
      kind: 'weld_toe',
      member: 'parent',
      component: 'along',
      categoryMPa: 80,
      gammaMf: 1.35,
      damageLimit: 0.5,
    }),
  ];
  const design = { fatigue: { rideCycleS: 180, stopsPerRideCycle: 2, details } };
  const out = fatigueOfLoadCases(design, lc.cases);
  const T = 60 / rpm;

  it('gives one entry per detail with its factor, category and limit', () => {
    expect(out.map((d) => d.name)).toEqual(['Pin shear', 'Hub weld toe']);
    expect(out[0].stressPerKnMPa).toBeCloseTo(1000 / 4000, 12);
    expect(out[0].shear).toBe(true);
    expect(out[0].damageLimit).toBe(1);
    expect(out[1].damageLimit).toBe(0.5);
    expect(out.map((d) => d.cases.map((c) => c.kind))).toEqual([
      ['operating', 'service_stop', 'emergency_stop'],
      ['operating', 'service_stop', 'emergency_stop'],
    ]);
  });

  it('the pin’s operating range is 2·m·g across the arm times its factor (textbook), m = 5 for shear', () => {
    const op = out[0].cases[0];
    const range = (0.25 * 2 * m * g) / 1000; // 1.96 MPa: far below Δτ_L = 0.457 × 100 → no damage
    expect(op.maxRangeMPa).toBeCloseTo(range, 6);
    expect(op.damage).toBe(0);
  });

  it('sums the operating cycle scaled to the ride and the service stops; the emergency stop stays per event', () => {
    for (const d of out) {
      const [op, service, emergency] = d.cases;
      expect(d.damagePerRideCycle).toBeCloseTo(op.damage * (180 / T) + 2 * service.damage, 18);
      expect(op.perRideCycle).toBeCloseTo(op.damage * (180 / T), 18);
      expect(service.perRideCycle).toBeCloseTo(2 * service.damage, 18);
      expect(emergency.perRideCycle).toBe(0);
    }
    // The weld toe (80 MPa, γMf 1.35) sees the ground-frame reaction: 2·m·ω²·r_G = 2193 N × 40 MPa/kN = 87.7 MPa.
    const weld = out[1];
    const w = (rpm * 2 * Math.PI) / 60;
    expect(weld.cases[0].maxRangeMPa).toBeCloseTo((40 * 2 * m * w * w * rG) / 1000, 5);
    const hand = ((((40 * 2 * m * w * w * rG) / 1000) * 1.35) / 80) ** 3 / 2e6;
    expect(weld.cases[0].damage / hand).toBeCloseTo(1, 5);
    expect(weld.cases[2].damage).toBeGreaterThan(weld.cases[1].damage);
    expect(governingFatigueCase(weld)).toBe(
      weld.cases[0].perRideCycle > weld.cases[1].perRideCycle ? 'operating' : 'service_stop',
    );
    expect(governingFatigueCase(out[0])).toBe(out[0].cases[1].damage > 0 ? 'service_stop' : null);
  });

  it('counts no stops when the design has no service stop, and nothing without fatigue data', () => {
    const noService = analyseLoadCases(input, [{ joint: 0, emergencyDecelRadS2: 1.2 }]);
    const [weld] = fatigueOfLoadCases(
      { fatigue: { rideCycleS: 180, details: [details[1]] } },
      noService.cases,
    );
    expect(weld.damagePerRideCycle).toBeCloseTo(weld.cases[0].damage * (180 / T), 18);
    expect(fatigueOfLoadCases({}, lc.cases)).toEqual([]);
    expect(() => fatigueOfLoadCases(design, lc.cases.slice(1))).toThrow(/operating cycle/);
  });
});
