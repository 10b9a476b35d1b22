import type { DesignData, FatigueData, NdtPlan, PinCheckData } from '@/features/loads/design-schema';

/*
 * The demo rides' pin-check data, NDT plans and fatigue details, as if copied from each maker's (invented)
 * design document and manual. Nothing here is a real ride's data.
 *
 * Materials (values recalled from EN 10083-3 and EN 10025-2 for the thickness or diameter range, demo use
 * only): pins in 42CrMo4+QT, whose strength falls with the bar's diameter; plates in S355, whose yield falls
 * with the plate's thickness (one value per pivot: that of the thicker plate). The pins of these rides are
 * sized for bearing pressure and wear, so their EN 1993-1-8 Table 3.10 utilisations at the peak load are low.
 *
 * Fatigue details: a pin in double shear (EN 1993-1-9 Table 8.1's Δτ_C = 100 MPa for bolts in shear, from
 * memory — used here for a pin in a fitted hole), a lug's net section (Δσ_C 90 or 112) and a weld toe at a hub or bracket
 * (Δσ_C 71, γMf 1.15 for a detail whose failure matters, inspected). The stress per kN of a weld toe or a
 * bracket stands for the document's section analysis; the demo values were chosen so that, with the design
 * motion and its service stop, the most loaded detail of each ride uses a few per cent to a few tens of per
 * cent of its life over three seasons at a few hundred ride cycles a day (2×10⁻⁷ to 3×10⁻⁶ per ride cycle,
 * checked by tests/server/demo-design-life.test.ts). The pins' shear stays below the cut-off: no damage, as on
 * most real pins.
 */

const area = (diameterM: number) => Math.round((Math.PI * (diameterM * 1000) ** 2) / 4);

/** 42CrMo4+QT by bar diameter (EN 10083-3, from memory): yield and ultimate strength, Pa. */
function crMoPin(diameterM: number): Pick<PinCheckData, 'pinGrade' | 'pinFyPa' | 'pinFuPa'> {
  const [fy, fu] =
    diameterM <= 0.04
      ? [750e6, 1000e6]
      : diameterM <= 0.1
        ? [650e6, 900e6]
        : diameterM <= 0.16
          ? [550e6, 800e6]
          : [500e6, 750e6];
  return { pinGrade: '42CrMo4+QT', pinFyPa: fy, pinFuPa: fu };
}

/** S355 by plate thickness (EN 10025-2, from memory): the yield strength of the thicker plate, Pa. */
function s355(innerPlateM: number, outerPlateM: number): Pick<PinCheckData, 'plateGrade' | 'plateFyPa'> {
  const t = Math.max(innerPlateM, outerPlateM);
  const fy = t <= 0.016 ? 355e6 : t <= 0.04 ? 345e6 : t <= 0.063 ? 335e6 : 325e6;
  return { plateGrade: 'S355', plateFyPa: fy };
}

/** A clevis: the lug `inner` thick between two cheeks `outer` thick, `gap` between each cheek and the lug. */
function clevis(
  diameterM: number,
  innerPlateM: number,
  outerPlateM: number,
  gapM: number,
  replaceable?: boolean,
): PinCheckData {
  return {
    ...crMoPin(diameterM),
    ...s355(innerPlateM, outerPlateM),
    innerPlateM,
    outerPlateM,
    gapM,
    ...(replaceable ? { replaceable } : {}),
  };
}

/** The pin checks per ride (by serial), per joint. */
export const demoPinChecks: Record<string, PinCheckData[]> = {
  'ORW-PX15-0412': [clevis(0.16, 0.06, 0.04, 0.004), clevis(0.14, 0.05, 0.035, 0.003)],
  'BME-TA2-0097': [clevis(0.12, 0.05, 0.03, 0.003)],
  'MFW-LW18-0031': [clevis(0.22, 0.08, 0.05, 0.005), clevis(0.03, 0.016, 0.012, 0.002, true)],
  'ORW-RX30-0158': [
    clevis(0.25, 0.08, 0.06, 0.005),
    // The near-limit pivot: the maker's gap is wide here (a thrust washer each side).
    clevis(0.12, 0.04, 0.03, 0.008),
    clevis(0.09, 0.03, 0.025, 0.003, true),
  ],
  'QCW-SC32-0264': [
    { ...clevis(0.02, 0.01, 0.008, 0.002, true), pinGrade: 'C45+QT', pinFyPa: 430e6, pinFuPa: 650e6 },
    { ...clevis(0.016, 0.008, 0.006, 0.002, true), pinGrade: 'C45+QT', pinFyPa: 490e6, pinFuPa: 700e6 },
  ],
  'ORW-PX6-0733': [clevis(0.09, 0.035, 0.025, 0.003)],
};

/** A main shaft: magnetic particles on the hub welds and lugs yearly, ultrasound through the shaft every two years. */
const mainShaftNdt: NdtPlan[] = [
  { method: 'MT', intervalDays: 365, note: 'Hub welds and lug faces, both sides' },
  { method: 'UT', intervalDays: 730, note: 'Shaft, full volume from both end faces' },
];
/** A secondary pivot: the bracket welds yearly. */
const bracketNdt: NdtPlan[] = [{ method: 'MT', intervalDays: 365, note: 'Bracket welds and lug' }];
/** A small hanger pin: looked at every quarter, dye penetrant on the pin yearly. */
const hangerNdt: NdtPlan[] = [
  { method: 'VT', intervalDays: 90, note: 'Pin, keeper plate and split pin' },
  { method: 'PT', intervalDays: 365, note: 'Pin, after removal' },
];

/** The NDT plans per ride (by serial), per joint. */
export const demoNdtPlans: Record<string, NdtPlan[][]> = {
  'ORW-PX15-0412': [mainShaftNdt, bracketNdt],
  'BME-TA2-0097': [mainShaftNdt],
  'MFW-LW18-0031': [mainShaftNdt, hangerNdt],
  'ORW-RX30-0158': [mainShaftNdt, mainShaftNdt, bracketNdt],
  'QCW-SC32-0264': [hangerNdt, hangerNdt],
  'ORW-PX6-0733': [mainShaftNdt],
};

const pinShear = (joint: number, name: string, diameterM: number) =>
  ({
    joint,
    name,
    kind: 'pin_shear',
    member: 'body',
    component: 'across',
    sectionAreaMm2: area(diameterM),
    shearPlanes: 2,
    categoryMPa: 100,
    shear: true,
  }) as const;

/** The fatigue data per ride (by serial). */
export const demoFatigue: Record<string, FatigueData> = {
  // Pendulum: the arm's hub sees the force swing across the arm; the gondola spindle's flange on the arm.
  'ORW-PX15-0412': {
    rideCycleS: 180,
    stopsPerRideCycle: 1,
    details: [
      pinShear(0, 'Main shaft in double shear', 0.16),
      {
        joint: 0,
        name: 'Arm lug net section',
        kind: 'lug_net_section',
        member: 'body',
        component: 'along',
        sectionAreaMm2: 5000,
        categoryMPa: 90,
      },
      {
        joint: 0,
        name: 'Arm-to-hub weld toe',
        kind: 'weld_toe',
        member: 'body',
        component: 'across',
        stressPerKnMPa: 0.062,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
      {
        joint: 1,
        name: 'Spindle flange weld toe on the arm',
        kind: 'weld_toe',
        member: 'parent',
        component: 'across',
        stressPerKnMPa: 0.085,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
    ],
  },
  // Rotating arm: its weight turns through the arm's own frame once per turn, a full reversal at the hub.
  'BME-TA2-0097': {
    rideCycleS: 150,
    stopsPerRideCycle: 1,
    details: [
      pinShear(0, 'Main axle in double shear', 0.12),
      {
        joint: 0,
        name: 'Arm lug net section',
        kind: 'lug_net_section',
        member: 'body',
        component: 'along',
        sectionAreaMm2: 6000,
        categoryMPa: 112,
      },
      {
        joint: 0,
        name: 'Weld toe at the hub',
        kind: 'weld_toe',
        member: 'body',
        component: 'across',
        stressPerKnMPa: 0.12,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
    ],
  },
  // The wheel turns slowly, but its axle turns with it: one full reversal per turn, about 12 a ride.
  'MFW-LW18-0031': {
    rideCycleS: 600,
    stopsPerRideCycle: 1,
    details: [
      pinShear(0, 'Wheel axle in double shear', 0.22),
      {
        joint: 0,
        name: 'Hub flange weld toe',
        kind: 'weld_toe',
        member: 'body',
        component: 'across',
        stressPerKnMPa: 0.07,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
      {
        joint: 1,
        name: 'Hanger bracket weld toe on the rim',
        kind: 'weld_toe',
        member: 'parent',
        component: 'across',
        stressPerKnMPa: 3.6,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
    ],
  },
  'ORW-RX30-0158': {
    rideCycleS: 150,
    stopsPerRideCycle: 1,
    details: [
      pinShear(0, 'Main arm shaft in double shear', 0.25),
      {
        joint: 0,
        name: 'Main arm weld toe at the hub',
        kind: 'weld_toe',
        member: 'body',
        component: 'across',
        stressPerKnMPa: 0.07,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
      pinShear(1, 'Sub-arm pivot in double shear', 0.12),
      {
        joint: 1,
        name: 'Sub-arm lug net section',
        kind: 'lug_net_section',
        member: 'body',
        component: 'along',
        sectionAreaMm2: 3000,
        categoryMPa: 90,
      },
      {
        joint: 2,
        name: 'Gondola mount weld toe on the sub-arm',
        kind: 'weld_toe',
        member: 'parent',
        component: 'across',
        stressPerKnMPa: 0.6,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
    ],
  },
  // The hanger rocks with the crown's tilt: the bracket on the crown feels the sideways pull.
  'QCW-SC32-0264': {
    rideCycleS: 180,
    stopsPerRideCycle: 1,
    details: [
      { ...pinShear(0, 'Crown hanger pin in double shear', 0.02), component: 'along' },
      {
        joint: 0,
        name: 'Hanger bracket weld toe on the crown',
        kind: 'weld_toe',
        member: 'parent',
        component: 'along',
        stressPerKnMPa: 80,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
    ],
  },
  // The tower's hub (the ground side of the main pin) sees the swing's vertical force.
  'ORW-PX6-0733': {
    rideCycleS: 120,
    stopsPerRideCycle: 1,
    details: [
      pinShear(0, 'Main pin in double shear', 0.09),
      {
        joint: 0,
        name: 'Arm lug net section',
        kind: 'lug_net_section',
        member: 'body',
        component: 'along',
        sectionAreaMm2: 800,
        categoryMPa: 90,
      },
      {
        joint: 0,
        name: 'Weld toe at the tower hub',
        kind: 'weld_toe',
        member: 'parent',
        component: 'across',
        stressPerKnMPa: 0.8,
        categoryMPa: 71,
        gammaMf: 1.15,
      },
    ],
  },
};

/** A ride's design data with its pin checks, NDT plans and fatigue data added (by the ride's serial). */
export function withLife(serial: string, design: DesignData): DesignData {
  const pins = demoPinChecks[serial] ?? [];
  const ndt = demoNdtPlans[serial] ?? [];
  return {
    ...design,
    pivots: design.pivots.map((p) => ({
      ...p,
      ...(pins[p.joint] ? { pinCheck: pins[p.joint] } : {}),
      ...(ndt[p.joint] ? { ndt: ndt[p.joint] } : {}),
    })),
    ...(demoFatigue[serial] ? { fatigue: demoFatigue[serial] } : {}),
  };
}
