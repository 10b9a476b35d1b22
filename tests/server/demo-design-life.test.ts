/**
 * The demo rides' pin-check data, NDT plans and fatigue details (server/seed/demo-design-life.ts): present
 * for every ride and pivot, valid, and giving a damage per ride cycle that shows in the demo without being
 * absurd. One ride is checked by hand: Twin Comet's arm turns at constant speed, so in the arm's own frame
 * its weight turns once per revolution and the force across the arm at the axle ranges over 2·M·g (rigid-
 * body statics; the centripetal pull of its out-of-balance riders lies along the arm). The EN 1993-1-9 §7
 * curve is then applied by hand: Δσ_D = (2/5)^(1/3)·Δσ_C/γMf, N = 5×10⁶·(Δσ_D/Δσ)⁵ between Δσ_D and Δσ_L.
 */
import { designDataSchema, designToCycleInput } from '@/features/loads/design-schema';
import { analyseLoadCases, designStops } from '@/features/loads/load-cases';
import { fatigueOfLoadCases } from '@/features/fatigue';
import { demoRides } from '@/server/seed/demo';
import { demoDesigns, twinCometDesign } from '@/server/seed/demo-design';

const fatigueOf = (serial: string) => {
  const design = demoDesigns[serial];
  const cases = analyseLoadCases(designToCycleInput(design), designStops(design));
  return { design, cases, details: fatigueOfLoadCases(design, cases.cases) };
};

describe.each(demoRides.map((r) => [r.name, r.serial] as const))('%s', (_name, serial) => {
  const design = demoDesigns[serial];

  test('every pivot has pin-check data and at least one NDT plan; the ride has fatigue details; all valid', () => {
    expect(designDataSchema.safeParse(design).success).toBe(true);
    for (const pivot of design.pivots) {
      expect(pivot.pinCheck).toBeDefined();
      expect(pivot.ndt?.length).toBeGreaterThan(0);
      // A pin's ultimate strength lies above its yield strength (any steel).
      expect(pivot.pinCheck!.pinFuPa).toBeGreaterThan(pivot.pinCheck!.pinFyPa);
    }
    expect(design.fatigue?.details.length).toBeGreaterThan(0);
    expect(design.fatigue?.rideCycleS).toBeGreaterThanOrEqual(60);
  });

  test('the most used detail takes 2×10⁻⁷ to 3×10⁻⁶ of its life per ride cycle; no detail more', () => {
    const { details } = fatigueOf(serial);
    const damages = details.map((d) => d.damagePerRideCycle);
    for (const d of damages) expect(Number.isFinite(d) && d >= 0).toBe(true);
    const most = Math.max(...damages);
    // At a few hundred ride cycles a day over a few seasons (some 10⁵ ride cycles): a few % to some 40 %.
    expect(most).toBeGreaterThan(2e-7);
    expect(most).toBeLessThan(3e-6);
  });
});

test('the pins in shear stay below the shear cut-off Δτ_L = (2/100)^(1/5)·Δτ_C = 45.7 MPa: no damage', () => {
  for (const ride of demoRides) {
    const { details } = fatigueOf(ride.serial);
    for (const d of details.filter((x) => x.shear)) {
      for (const c of d.cases) expect(c.maxRangeMPa).toBeLessThan(0.457 * d.categoryMPa);
      expect(d.damagePerRideCycle).toBe(0);
    }
  }
});

test('Twin Comet’s hub weld toe, by hand: stress range 2·M·g × factor, one per turn, on the m = 5 branch', () => {
  const { details, cases } = fatigueOf('BME-TA2-0097');
  const weld = details.find((d) => d.name === 'Weld toe at the hub');
  const detail = twinCometDesign.fatigue?.details.find((d) => d.name === 'Weld toe at the hub');
  if (!weld || !detail?.stressPerKnMPa) throw new Error('Twin Comet needs its hub weld toe');
  const mass = twinCometDesign.parts.reduce((sum, p) => sum + p.massKg, 0);
  const rangeMPa = ((2 * mass * 9.80665) / 1000) * detail.stressPerKnMPa;
  const operating = weld.cases.find((c) => c.kind === 'operating');
  expect(operating?.maxRangeMPa).toBeCloseTo(rangeMPa, 1);
  const sigmaC = detail.categoryMPa / (detail.gammaMf ?? 1);
  const sigmaD = (2 / 5) ** (1 / 3) * sigmaC;
  const sigmaL = (5 / 100) ** (1 / 5) * sigmaD;
  expect(rangeMPa).toBeLessThan(sigmaD);
  expect(rangeMPa).toBeGreaterThan(sigmaL);
  const perTurn = 1 / (5e6 * (sigmaD / rangeMPa) ** 5);
  // 12 rpm: one turn in 5 s; a 150 s ride cycle holds 30 turns.
  const turns = (twinCometDesign.fatigue?.rideCycleS ?? 0) / cases.operating.durationS;
  expect(turns).toBeCloseTo(30, 6);
  expect(operating?.perRideCycle).toBeCloseTo(turns * perTurn, 9);
  expect(operating!.perRideCycle / (turns * perTurn)).toBeCloseTo(1, 2);
});
