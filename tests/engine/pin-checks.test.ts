/**
 * Pin checks against EN 1993-1-8:2005 §3.13.2, Table 3.10 (design criteria for pin connections), worked by
 * hand below, and the steady-rotation closed form for the peak pivot force (rigid-body rotation about a
 * fixed axis: F = m·g + m·ω²·r_G at the bottom of the turn; any dynamics textbook, from memory).
 */
import {
  analyseCycle,
  checkPin,
  pinChecksAtPeak,
  pinUtilisations,
  type PinCheckInput,
} from '@/features/loads/engine';
import { designToCycleInput, type DesignData } from '@/features/loads/design-schema';
import { analyseLoadCases, designStops, withLoadCases } from '@/features/loads/load-cases';

import { rodDesign } from '@/tests/support/rod-design';

const MPa = 1e6;
const mm = 1e-3;

/** A clevis: lug b = 40 mm, cheeks a = 25 mm, gaps c = 5 mm; pin f_yp 460 / f_up 600 MPa, plates 355. */
const clevis: PinCheckInput = {
  pinGrade: 'pin steel',
  pinFyPa: 460 * MPa,
  pinFuPa: 600 * MPa,
  plateGrade: 'S355',
  plateFyPa: 355 * MPa,
  innerPlateM: 40 * mm,
  outerPlateM: 25 * mm,
  gapM: 5 * mm,
};

describe('EN 1993-1-8 Table 3.10, a clevis (double shear), worked by hand', () => {
  /*
   * F = 400 kN, d = 60 mm, γM0 = 1.0, γM2 = 1.25, γM6,ser = 1.0, γF = 1.0 (EN 1993-1-8 Table 2.1
   * recommended values).
   * A = π·60²/4 = 2827.43 mm²; W_el = π·60³/32 = 21 205.75 mm³.
   * Shear:   F_v,Ed = F/2 = 200 kN; F_v,Rd = 0.6·2827.43·600/1.25 = 814 300.8 N → 0.245609.
   * Bearing: f_y = min(460, 355) = 355 MPa.
   *          lug:    F_b,Ed = 400 kN, F_b,Rd = 1.5·40·60·355/1.0 = 1 278 000 N → 0.312989 (governs)
   *          cheek:  F_b,Ed = 200 kN, F_b,Rd = 1.5·25·60·355/1.0 =   798 750 N → 0.250391
   * Bending: M_Ed = 400 000·(40 + 4·5 + 2·25)/8 = 5 500 000 N·mm;
   *          M_Rd = 1.5·21 205.75·460/1.0 = 14 631 968 N·mm → 0.375889.
   * Combined: 0.375889² + 0.245609² = 0.141293 + 0.060324 = 0.201617.
   * Serviceability (replaceable pin, at the same 400 kN):
   *          lug: F_b,Rd,ser = 0.6·40·60·355/1.0 = 511 200 N → 0.782473 (governs); cheek 319 500 N → 0.625978
   *          M_Rd,ser = 0.8·21 205.75·460/1.0 = 7 803 716 N·mm → 0.704792.
   */
  const r = checkPin(400_000, 60 * mm, 'double', { ...clevis, replaceable: true });

  it('shear per plane: 0.6·A·f_up/γM2', () => {
    expect(r.shearCheck.effect).toBeCloseTo(200_000, 6);
    expect(r.shearCheck.resistance).toBeCloseTo(814_300.8, 0);
    expect(r.shearCheck.utilisation).toBeCloseTo(0.245609, 5);
  });

  it('bearing with the lower yield strength, the lug with F and each cheek with F/2: 1.5·t·d·f_y/γM0', () => {
    expect(r.bearingCheck.plate).toBe('inner');
    expect(r.bearingCheck.resistance).toBeCloseTo(1_278_000, 3);
    expect(r.bearingCheck.utilisation).toBeCloseTo(0.312989, 5);
  });

  it('bending M_Ed = F(b + 4c + 2a)/8 against 1.5·W_el·f_yp/γM0', () => {
    expect(r.bendingCheck.effect).toBeCloseTo(5_500, 6); // N·m
    expect(r.bendingCheck.resistance).toBeCloseTo(14_631.968, 2);
    expect(r.bendingCheck.utilisation).toBeCloseTo(0.375889, 5);
  });

  it('combined (M/M_Rd)² + (F_v/F_v,Rd)²', () => {
    expect(r.combined).toBeCloseTo(0.201617, 5);
    // The force that brings the left side to 1 (both terms ∝ F²): 400 kN / √0.201617 = 890.83 kN.
    expect(r.combinedResistanceN).toBeCloseTo(890_833.7, 0);
  });

  it('replaceable pin: 0.6·t·d·f_y/γM6,ser and 0.8·W_el·f_yp/γM6,ser at the serviceability load', () => {
    expect(r.bearingServiceCheck?.plate).toBe('inner');
    expect(r.bearingServiceCheck?.utilisation).toBeCloseTo(0.782473, 5);
    expect(r.bendingServiceCheck?.utilisation).toBeCloseTo(0.704792, 5);
  });

  it('a pin not meant to be replaced has no serviceability checks', () => {
    const u = pinUtilisations(checkPin(400_000, 60 * mm, 'double', clevis));
    expect(u.bearingService).toBeNull();
    expect(u.bendingService).toBeNull();
  });

  it('thin cheeks govern bearing when 2a < b: the cheek carries F/2 on a', () => {
    // a = 15 mm: cheek F_b,Rd = 1.5·15·60·355 = 479 250 N, 200 kN → 0.417319 > lug 0.312989.
    const thin = checkPin(400_000, 60 * mm, 'double', { ...clevis, outerPlateM: 15 * mm });
    expect(thin.bearingCheck.plate).toBe('outer');
    expect(thin.bearingCheck.utilisation).toBeCloseTo(0.417319, 5);
  });
});

describe('load and partial factors', () => {
  it('γF scales the ultimate checks, not the serviceability ones; γM2 and γM0 divide the resistances', () => {
    const base = checkPin(400_000, 60 * mm, 'double', { ...clevis, replaceable: true });
    const f = checkPin(400_000, 60 * mm, 'double', {
      ...clevis,
      replaceable: true,
      gammaF: 1.35,
      gammaM0: 1.1,
      gammaM2: 1.5,
    });
    expect(f.designForceN).toBeCloseTo(540_000, 6);
    expect(f.shearCheck.utilisation).toBeCloseTo(base.shearCheck.utilisation * 1.35 * (1.5 / 1.25), 9);
    expect(f.bearingCheck.utilisation).toBeCloseTo(base.bearingCheck.utilisation * 1.35 * 1.1, 9);
    expect(f.bendingCheck.utilisation).toBeCloseTo(base.bendingCheck.utilisation * 1.35 * 1.1, 9);
    expect(f.bearingServiceCheck?.utilisation).toBeCloseTo(base.bearingServiceCheck!.utilisation, 12);
    expect(f.bendingServiceCheck?.utilisation).toBeCloseTo(base.bendingServiceCheck!.utilisation, 12);
  });
});

describe('single shear (common practice, from memory: outside the Table’s clevis figure)', () => {
  /*
   * F = 100 kN, γF = 1.5 → 150 kN; d = 40 mm; plates a = 20, b = 30 mm, gap c = 2 mm; pin 355/510 MPa,
   * plates f_y 275 MPa.
   * A = 1256.64 mm², W_el = 6283.19 mm³.
   * Shear, one plane: F_v,Rd = 0.6·1256.64·510/1.25 = 307 624.8 N → 150 000/307 624.8 = 0.487607.
   * Bearing, each plate the whole force, f_y = 275: b: 1.5·30·40·275 = 495 000 N → 0.303030;
   *          a: 1.5·20·40·275 = 330 000 N → 0.454545 (governs).
   * Bending, lever arm a/2 + c + b/2 = 10 + 2 + 15 = 27 mm: M_Ed = 150 000·27 = 4 050 000 N·mm;
   *          M_Rd = 1.5·6283.19·355 = 3 345 796 N·mm → 1.210474 (fails).
   * Combined 1.210474² + 0.487607² = 1.703008.
   */
  const r = checkPin(100_000, 40 * mm, 'single', {
    pinGrade: 'S355',
    pinFyPa: 355 * MPa,
    pinFuPa: 510 * MPa,
    plateGrade: 'S275',
    plateFyPa: 275 * MPa,
    innerPlateM: 30 * mm,
    outerPlateM: 20 * mm,
    gapM: 2 * mm,
    gammaF: 1.5,
  });
  it('one shear plane, both plates in full bearing, cantilever moment over the mid-thicknesses', () => {
    expect(r.shearCheck.utilisation).toBeCloseTo(0.487607, 5);
    expect(r.bearingCheck.plate).toBe('outer');
    expect(r.bearingCheck.utilisation).toBeCloseTo(0.454545, 5);
    expect(r.bendingCheck.effect).toBeCloseTo(4_050, 6);
    expect(r.bendingCheck.utilisation).toBeCloseTo(1.210474, 5);
    expect(r.combined).toBeCloseTo(1.703008, 5);
  });
});

describe('in the cycle envelope', () => {
  // Rod 400 kg × 5 m at 6 rpm: peak force at the bottom = m·g + m·ω²·L/2 (closed form).
  const m = 400;
  const L = 5;
  const g = 9.80665;
  const w = (6 * 2 * Math.PI) / 60;
  const peak = m * g + m * w * w * (L / 2);
  const design = (): DesignData => {
    const d = rodDesign(m, L);
    d.gravityMS2 = g;
    d.pivots[0] = { ...d.pivots[0], pinCheck: { ...clevis, replaceable: true } } as DesignData['pivots'][0];
    return d;
  };

  it('items per check, labelled with the standard, each ratio the hand formula at the peak force', () => {
    const r = analyseCycle(designToCycleInput(design()));
    // Sampled at 360 instants, the bottom of the turn is caught to within a part in 10⁵.
    expect(Math.abs(r.joints[0].peakForce.value - peak) / peak).toBeLessThan(1e-5);
    const ids = r.envelope.filter((e) => e.id.includes('.pin.en1993.')).map((e) => e.id);
    expect(ids).toEqual([
      'joints.0.pin.en1993.shear',
      'joints.0.pin.en1993.bearing',
      'joints.0.pin.en1993.bending',
      'joints.0.pin.en1993.combined',
      'joints.0.pin.en1993.bearing_ser',
      'joints.0.pin.en1993.bending_ser',
    ]);
    const item = (k: string) => r.envelope.find((e) => e.id === `joints.0.pin.en1993.${k}`)!;
    for (const k of ['shear', 'bearing', 'bending', 'combined'])
      expect(item(k).label).toContain('EN 1993-1-8 Table 3.10');
    // No measured diameter: the nominal 60 mm. Shear per plane: (F/2) / 814 300.8 N (hand value above).
    const F = r.joints[0].peakForce.value;
    expect(item('shear').ratio).toBeCloseTo(F / 2 / 814_300.8158, 9);
    expect(item('bending').ratio).toBeCloseTo((F * 0.11) / 8 / 14_631.9678, 9);
    // The combined item holds the load against the load at which the interaction reaches 1: √(left side).
    const c = r.pins[0].check!;
    expect(item('combined').ratio).toBeCloseTo(Math.sqrt(c.combined), 12);
    expect(item('combined').status).toBe('within');
  });

  it('a measured (worn) diameter is the one checked', () => {
    const r = analyseCycle(designToCycleInput(design(), { wear: [{ diameterM: 0.058 }] }));
    expect(r.pins[0].check!.diameterM).toBe(0.058);
  });

  it('merged with the stops, every check is at the peak force over all cases, the bending moment too', () => {
    const d = design();
    // A hard emergency stop raises the pivot force above the operating peak.
    d.motion[0] = { ...d.motion[0], serviceDecelRadS2: 0.3, emergencyDecelRadS2: 2 };
    const cases = analyseLoadCases(designToCycleInput(d), designStops(d));
    const result = { ...withLoadCases(cases), loadCases: cases.cases };
    const peakOverCases = Math.max(...cases.cases.flatMap((c) => c.joints.map((j) => j.peakForceN)));
    expect(peakOverCases).toBeGreaterThan(cases.operating.joints[0].peakForce.value * 1.01);
    const bending = cases.envelope.find((e) => e.id === 'joints.0.pin.en1993.bending')!;
    expect(bending.loadCase).toBe('emergency_stop');
    expect(bending.value).toBeCloseTo((peakOverCases * 0.11) / 8, 6);
    const [stored] = pinChecksAtPeak(result);
    expect(stored.forceN).toBeCloseTo(peakOverCases, 6);
    const combined = cases.envelope.find((e) => e.id === 'joints.0.pin.en1993.combined')!;
    expect(combined.ratio).toBeCloseTo(Math.sqrt(stored.combined), 9);
    expect(stored.bending).toBeCloseTo(bending.ratio, 9);
  });
});
