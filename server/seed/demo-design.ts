import type { DesignData } from '@/features/loads/design-schema';
import { withLife } from '@/server/seed/demo-design-life';

/*
 * Design data for the six demo rides, as if copied from each maker's (invented) design document. Every
 * value is made up for the demo, in SI units, with plausible magnitudes: arms of 4–20 m, bodies of
 * 0.5–25 t. The limits (force, stresses, rider g) are chosen so that the design motion uses about 60–85 %
 * of most allowances, with one pivot (Tidebreaker's sub-arm pivot) near its limit, so every envelope
 * status shows up in the demo. Nothing here is a real ride's data: never use it for a real ride.
 *
 * Conventions (features/loads/README.md): each body's frame has its origin at its inboard pivot; a joint
 * angle of 0 puts the body's x-axis along global +x. Pendulum arms are drawn along the body's −y axis, so
 * a swing centred on 0 hangs straight down. A rider's spine angle is the seat-to-head direction in the
 * body frame (π/2 = the body's +y).
 *
 * Each ride's pin-check data, NDT plans and fatigue details are in demo-design-life.ts (`withLife`).
 */

const deg = (d: number) => (d * Math.PI) / 180;
/** An adult rider with restraint allowance, as the demo documents assume. */
const RIDER_KG = 85;

/**
 * Skylark — pendulum swing, 15 m arm, 24-seat ring gondola at the tip that also turns on its own axis.
 *
 * Two bodies: the arm, and the gondola on its slewing bearing at the arm tip. The gondola turns about the
 * arm's axis, which lies in the swing plane, so that spin is out of the plane the engine solves: joint 1 is
 * modelled as fixed (angle 0) and carries the bearing's force and moment. A balanced ring turning about its
 * own centre adds no force at either pivot, so the pivot forces hold; the riders' small extra acceleration
 * from the spin (ω²R ≈ 0.16 g at 6 rpm and 4 m) is not in the seat results.
 */
export const skylarkDesign: DesignData = withLife('ORW-PX15-0412', {
  source: { document: 'Orrin Ride Works PX-15 design report DR-PX15-004', revision: 'C' },
  bodies: [{ name: 'Main arm', tipM: [0, -15] }, { name: 'Ring gondola' }],
  parts: [
    { kind: 'rod', body: 0, name: 'Arm tube', massKg: 6000, fromM: [0, 0], toM: [0, -15] },
    {
      kind: 'counterweight',
      body: 0,
      name: 'Counterweight',
      massKg: 4500,
      centreM: [0, 3.2],
      widthM: 2.4,
      heightM: 1.2,
    },
    {
      kind: 'disc',
      body: 0,
      name: 'Main hub and shaft housing',
      massKg: 1800,
      centreM: [0, 0],
      radiusM: 0.9,
    },
    /*
     * The ring's own axis lies along the arm, so its inertia about the swing axis (a diameter) is mR²/2,
     * not the in-plane ring value mR²: given as a custom part.
     */
    {
      kind: 'custom',
      body: 1,
      name: 'Gondola ring and seats',
      massKg: 7200,
      cgM: [0, -0.6],
      inertiaCgKgM2: 57600,
    },
    { kind: 'point', body: 1, name: 'Riders (24 × 85 kg)', massKg: 24 * RIDER_KG, atM: [0, -0.9] },
  ],
  pivots: [
    {
      joint: 0,
      name: 'Main pivot shaft',
      shear: 'double',
      bearingLengthM: 0.4,
      nominalDiameterM: 0.16,
      minimumDiameterM: 0.1588,
      maxClearanceM: 0.0006,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 25e6,
      maxForceN: 620e3,
      maxTorqueNm: 1.0e6,
    },
    {
      joint: 1,
      name: 'Gondola slewing bearing spindle',
      shear: 'single',
      bearingLengthM: 0.4,
      nominalDiameterM: 0.14,
      minimumDiameterM: 0.139,
      maxClearanceM: 0.0004,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 25e6,
      maxForceN: 420e3,
    },
  ],
  seats: [
    { body: 1, name: 'Seat 1 (leading edge)', positionM: [-3.8, -0.9], spineAngleRad: Math.PI / 2 },
    { body: 1, name: 'Seat 7 (on the swing plane)', positionM: [0, -0.9], spineAngleRad: Math.PI / 2 },
    { body: 1, name: 'Seat 13 (trailing edge)', positionM: [3.8, -0.9], spineAngleRad: Math.PI / 2 },
  ],
  motion: [
    {
      joint: 0,
      kind: 'swing',
      amplitudeRad: deg(110),
      // A free pin between drive pushes: analysed as the free swing from rest at its amplitude (the engine
      // finds 10.4 s at 110°; the document's 9.5 s is what the plausibility check compares readings with).
      freeSwing: true,
      periodS: 9.5,
      maxRateRadS: 1.6,
      maxAmplitudeRad: deg(130),
      // Demo values: the brake shoes at the bottom of the swing, service and emergency.
      serviceDecelRadS2: 0.5,
      emergencyDecelRadS2: 0.65,
    },
    { joint: 1, kind: 'fixed', angleRad: 0 },
  ],
  rider: { gx: { min: -2, max: 2 }, gz: { min: -1, max: 5 } },
  nearMargin: 0.9,
});

/**
 * Twin Comet — one rotating arm, 2 × 10 m, a four-seat gondola rigidly fixed at each tip, turning in a
 * vertical plane. One body: the gondolas are parts of the arm. The design load case is one gondola full
 * and the other empty, which puts the arm out of balance by four riders.
 */
export const twinCometDesign: DesignData = withLife('BME-TA2-0097', {
  source: { document: 'Brede Motion Engineering TA-2 structural calculation SC-TA2-11', revision: '4' },
  bodies: [{ name: 'Arm with gondolas' }],
  parts: [
    { kind: 'rod', body: 0, name: 'Arm girder', massKg: 8000, fromM: [-10, 0], toM: [10, 0] },
    { kind: 'plate', body: 0, name: 'Gondola A', massKg: 2600, centreM: [10, 0], widthM: 1.8, heightM: 2.2 },
    { kind: 'plate', body: 0, name: 'Gondola B', massKg: 2600, centreM: [-10, 0], widthM: 1.8, heightM: 2.2 },
    { kind: 'point', body: 0, name: 'Riders in gondola A (4 × 85 kg)', massKg: 4 * RIDER_KG, atM: [10.2, 0] },
    { kind: 'disc', body: 0, name: 'Hub', massKg: 2200, centreM: [0, 0], radiusM: 1.1 },
  ],
  pivots: [
    {
      joint: 0,
      name: 'Main axle',
      shear: 'double',
      bearingLengthM: 0.3,
      nominalDiameterM: 0.12,
      minimumDiameterM: 0.1192,
      maxClearanceM: 0.0005,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 20e6,
      maxForceN: 220e3,
      maxTorqueNm: 45e3,
    },
  ],
  seats: [
    // Riders sit with their heads toward the hub, so the centripetal push reads as +Gz ("eyes down").
    { body: 0, name: 'Gondola A, seat 1', positionM: [10.2, 0.4], spineAngleRad: Math.PI },
    { body: 0, name: 'Gondola A, seat 3', positionM: [10.2, -0.4], spineAngleRad: Math.PI },
  ],
  // Demo stop decelerations: 5 s service stop, about 2 s on the emergency brake.
  motion: [
    {
      joint: 0,
      kind: 'constant',
      rpm: 12,
      maxRateRadS: 1.4,
      serviceDecelRadS2: 0.25,
      emergencyDecelRadS2: 0.6,
    },
  ],
  rider: { gx: { min: -2, max: 2 }, gz: { min: -1.2, max: 4 } },
});

/**
 * Lantern Wheel — 32 m observation wheel, 18 enclosed gondolas. Two bodies: the wheel (rim, spokes, hub
 * and 17 gondolas as masses on the rim), and one gondola on its hanger pin, modelled on its own so its
 * hanger pin and its riders are checked. The gondola turns against the wheel at the same speed, so it
 * stays level (its hanger joint's relative motion is −1.2 rpm).
 */
export const lanternWheelDesign: DesignData = withLife('MFW-LW18-0031', {
  source: { document: 'Marrow & Finch LW-18 design file DF-18-02', revision: 'B' },
  bodies: [{ name: 'Wheel', tipM: [16, 0] }, { name: 'Gondola 1' }],
  parts: [
    { kind: 'ring', body: 0, name: 'Rim', massKg: 8000, centreM: [0, 0], radiusM: 16 },
    { kind: 'disc', body: 0, name: 'Hub and spokes', massKg: 6000, centreM: [0, 0], radiusM: 7 },
    // 17 other gondolas, 550 kg each with riders, spread evenly round the rim: a ring of their mass.
    {
      kind: 'ring',
      body: 0,
      name: 'Gondolas 2–18 with riders',
      massKg: 17 * 550,
      centreM: [0, 0],
      radiusM: 16,
    },
    {
      kind: 'plate',
      body: 1,
      name: 'Gondola cabin',
      massKg: 380,
      centreM: [0, -1.3],
      widthM: 1.6,
      heightM: 2,
    },
    { kind: 'point', body: 1, name: 'Riders (2 × 85 kg)', massKg: 2 * RIDER_KG, atM: [0, -1.6] },
  ],
  pivots: [
    {
      joint: 0,
      name: 'Wheel axle',
      shear: 'double',
      bearingLengthM: 0.5,
      nominalDiameterM: 0.22,
      minimumDiameterM: 0.2185,
      maxClearanceM: 0.0008,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 20e6,
      maxForceN: 300e3,
      maxTorqueNm: 110e3,
    },
    {
      joint: 1,
      name: 'Gondola hanger pin',
      shear: 'double',
      bearingLengthM: 0.05,
      nominalDiameterM: 0.03,
      minimumDiameterM: 0.0295,
      maxClearanceM: 0.0003,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 25e6,
      maxForceN: 7e3,
    },
  ],
  seats: [{ body: 1, name: 'Gondola 1, bench seat', positionM: [0.3, -1.6], spineAngleRad: Math.PI / 2 }],
  motion: [
    // Demo stop decelerations; the gondola stops with the wheel, so it stays level.
    {
      joint: 0,
      kind: 'constant',
      rpm: 1.2,
      maxRateRadS: 0.15,
      serviceDecelRadS2: 0.02,
      emergencyDecelRadS2: 0.05,
    },
    { joint: 1, kind: 'constant', rpm: -1.2, serviceDecelRadS2: 0.02, emergencyDecelRadS2: 0.05 },
  ],
  rider: { gx: { min: -0.5, max: 0.5 }, gz: { min: 0, max: 1.5 } },
});

/**
 * Tidebreaker — main arm (14 m with a counterweight) turning at 6 rpm, a 4 m powered sub-arm on its tip
 * turning at −12 rpm relative to it, and a gondola locked to the sub-arm. Three bodies. The sub-arm
 * pivot's force limit is close to what the design motion gives: the demo's near-limit pivot.
 */
export const tidebreakerDesign: DesignData = withLife('ORW-RX30-0158', {
  source: { document: 'Orrin Ride Works RX-30 design report DR-RX30-011', revision: 'E' },
  bodies: [{ name: 'Main arm', tipM: [14, 0] }, { name: 'Sub-arm', tipM: [4, 0] }, { name: 'Gondola' }],
  parts: [
    { kind: 'rod', body: 0, name: 'Main arm girder', massKg: 9000, fromM: [-7, 0], toM: [14, 0] },
    {
      kind: 'counterweight',
      body: 0,
      name: 'Counterweight',
      massKg: 14000,
      centreM: [-6.5, 0],
      widthM: 1.8,
      heightM: 1.5,
    },
    { kind: 'disc', body: 0, name: 'Sub-arm drive housing', massKg: 1500, centreM: [14, 0], radiusM: 0.8 },
    { kind: 'rod', body: 1, name: 'Sub-arm beam', massKg: 1800, fromM: [-2, 0], toM: [4, 0] },
    { kind: 'counterweight', body: 1, name: 'Sub-arm counterweight', massKg: 2200, centreM: [-1.8, 0] },
    {
      kind: 'plate',
      body: 2,
      name: 'Gondola shell',
      massKg: 1700,
      centreM: [0, -0.8],
      widthM: 2.4,
      heightM: 1.8,
    },
    { kind: 'point', body: 2, name: 'Riders (8 × 85 kg)', massKg: 8 * RIDER_KG, atM: [0, -0.9] },
  ],
  pivots: [
    {
      joint: 0,
      name: 'Main arm shaft',
      shear: 'double',
      bearingLengthM: 0.55,
      nominalDiameterM: 0.25,
      minimumDiameterM: 0.2485,
      maxClearanceM: 0.0006,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 25e6,
      maxForceN: 400e3,
      maxTorqueNm: 720e3,
    },
    {
      joint: 1,
      name: 'Sub-arm pivot',
      shear: 'double',
      bearingLengthM: 0.22,
      nominalDiameterM: 0.12,
      minimumDiameterM: 0.119,
      maxClearanceM: 0.0004,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 25e6,
      // At the design motion this pivot uses about 93 % of its force limit: the demo's near-limit pivot.
      maxForceN: 102e3,
      maxTorqueNm: 135e3,
    },
    {
      joint: 2,
      name: 'Gondola mounting pin',
      shear: 'double',
      bearingLengthM: 0.16,
      nominalDiameterM: 0.09,
      minimumDiameterM: 0.0893,
      maxClearanceM: 0.0003,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 25e6,
      maxForceN: 44e3,
      maxTorqueNm: 36e3,
    },
  ],
  seats: [
    { body: 2, name: 'Gondola, outer seat', positionM: [0.9, -0.9], spineAngleRad: Math.PI / 2 },
    { body: 2, name: 'Gondola, inner seat', positionM: [-0.9, -0.9], spineAngleRad: Math.PI / 2 },
  ],
  motion: [
    // Demo stop decelerations: both arms brake together, each from its own speed.
    {
      joint: 0,
      kind: 'constant',
      rpm: 6,
      maxRateRadS: 0.75,
      serviceDecelRadS2: 0.1,
      emergencyDecelRadS2: 0.25,
    },
    {
      joint: 1,
      kind: 'constant',
      rpm: -12,
      maxRateRadS: 1.5,
      serviceDecelRadS2: 0.2,
      emergencyDecelRadS2: 0.5,
    },
    { joint: 2, kind: 'fixed', angleRad: 0 },
  ],
  rider: { gx: { min: -2.5, max: 2.5 }, gz: { min: -1.5, max: 5 } },
});

/*
 * Whirligig Chairs — swing carousel: crown of radius 7 m turning at 10 rpm about a vertical axis, chain
 * hangers of 6 m, single seats. The engine solves motion in one vertical plane, and a carousel's crown
 * turns about a vertical axis, out of that plane. So this is an approximation of ONE hanger, in the
 * vertical plane through the axis that turns with the crown:
 *  - at steady speed a seat hangs where tan φ = ω²r/g with r = 7 + 6·sin φ (the conical pendulum); at
 *    10 rpm φ ≈ 52.8°, r ≈ 11.8 m, and the field the seat feels is g/cos φ ≈ 16.2 m/s² (1.65 g) along
 *    the chain;
 *  - that field is given as the analysis gravity and the hanger hangs "down" along it (joint 0 angle 0);
 *  - the tilting crown rocks the hanger ±12° about that line once per revolution (joint 0 swing, 6 s).
 *    The model drives that swing, so it reports a torque at the hanger pin that a real chain cannot
 *    carry; no torque limit is given for it.
 * The crown's own slewing ring is not in this model; its loads come from the maker's calculation. The
 * field is taken at the seat's radius; the chain's upper part feels less, which errs on the safe side.
 */
const whirligigRpm = 10;
const whirligigOmega = (whirligigRpm * 2 * Math.PI) / 60;
export const whirligigHanger = {
  crownRadiusM: 7,
  chainLengthM: 6,
  rpm: whirligigRpm,
  omegaRadS: whirligigOmega,
};

export const whirligigDesign: DesignData = withLife('QCW-SC32-0264', {
  source: { document: 'Quillon Carousel Works SC-32 type test file TT-SC32', revision: '7' },
  gravityMS2: 16.2,
  bodies: [{ name: 'Hanger chain', tipM: [0, -6] }, { name: 'Seat with rider' }],
  parts: [
    { kind: 'rod', body: 0, name: 'Chain pair and swivel', massKg: 28, fromM: [0, 0], toM: [0, -6] },
    {
      kind: 'plate',
      body: 1,
      name: 'Seat shell and restraint bar',
      massKg: 32,
      centreM: [0, -0.3],
      widthM: 0.5,
      heightM: 0.6,
    },
    { kind: 'point', body: 1, name: 'Rider', massKg: RIDER_KG, atM: [0, -0.35] },
  ],
  pivots: [
    {
      joint: 0,
      name: 'Crown hanger pin',
      shear: 'double',
      bearingLengthM: 0.03,
      nominalDiameterM: 0.02,
      minimumDiameterM: 0.0194,
      maxClearanceM: 0.0005,
      maxShearStressPa: 35e6,
      maxBearingPressurePa: 40e6,
      maxForceN: 3e3,
    },
    {
      joint: 1,
      name: 'Seat hanger shackle pin',
      shear: 'double',
      bearingLengthM: 0.025,
      nominalDiameterM: 0.016,
      minimumDiameterM: 0.0155,
      maxClearanceM: 0.0004,
      maxShearStressPa: 40e6,
      maxBearingPressurePa: 45e6,
      maxForceN: 2.5e3,
    },
  ],
  seats: [{ body: 1, name: 'Chair', positionM: [0, -0.35], spineAngleRad: Math.PI / 2 }],
  motion: [
    { joint: 0, kind: 'swing', amplitudeRad: deg(12), periodS: 60 / whirligigRpm, maxAmplitudeRad: deg(18) },
    { joint: 1, kind: 'fixed', angleRad: 0 },
  ],
  rider: { gx: { min: -1, max: 1 }, gz: { min: 0, max: 2.5 } },
});

/**
 * Little Kite — small pendulum for younger riders: a 6 m arm with a 12-seat gondola and a counterweight,
 * swinging ±75°. One body: the gondola is fixed to the arm.
 */
export const littleKiteDesign: DesignData = withLife('ORW-PX6-0733', {
  source: { document: 'Orrin Ride Works PX-6 design report DR-PX6-002', revision: 'A' },
  bodies: [{ name: 'Arm and gondola' }],
  parts: [
    { kind: 'rod', body: 0, name: 'Arm tube', massKg: 900, fromM: [0, 0], toM: [0, -6] },
    { kind: 'plate', body: 0, name: 'Gondola', massKg: 1400, centreM: [0, -6.3], widthM: 3.2, heightM: 1.2 },
    { kind: 'point', body: 0, name: 'Riders (12 × 50 kg)', massKg: 600, atM: [0, -6.2] },
    {
      kind: 'counterweight',
      body: 0,
      name: 'Counterweight',
      massKg: 700,
      centreM: [0, 1.6],
      widthM: 1,
      heightM: 0.6,
    },
  ],
  pivots: [
    {
      joint: 0,
      name: 'Main pivot pin',
      shear: 'double',
      bearingLengthM: 0.2,
      nominalDiameterM: 0.09,
      minimumDiameterM: 0.0893,
      maxClearanceM: 0.0004,
      maxShearStressPa: 80e6,
      maxBearingPressurePa: 25e6,
      maxForceN: 75e3,
      maxTorqueNm: 40e3,
    },
  ],
  seats: [
    { body: 0, name: 'Front row, end seat', positionM: [-1.4, -6.2], spineAngleRad: Math.PI / 2 },
    { body: 0, name: 'Back row, centre seat', positionM: [0.2, -6.2], spineAngleRad: Math.PI / 2 },
  ],
  motion: [
    {
      joint: 0,
      kind: 'swing',
      amplitudeRad: deg(75),
      periodS: 6.5,
      maxRateRadS: 1.5,
      maxAmplitudeRad: deg(85),
      // Demo values: driven swing braked by its drive wheels.
      serviceDecelRadS2: 0.9,
      emergencyDecelRadS2: 1.5,
    },
  ],
  rider: { gx: { min: -1.5, max: 1.5 }, gz: { min: 0, max: 3.5 } },
});

/** Design data by the demo ride's serial (serials are unique in the demo). */
export const demoDesigns: Record<string, DesignData> = {
  'ORW-PX15-0412': skylarkDesign,
  'BME-TA2-0097': twinCometDesign,
  'MFW-LW18-0031': lanternWheelDesign,
  'ORW-RX30-0158': tidebreakerDesign,
  'QCW-SC32-0264': whirligigDesign,
  'ORW-PX6-0733': littleKiteDesign,
};
