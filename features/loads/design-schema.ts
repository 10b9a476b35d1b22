/**
 * A ride's design data: the body chain (from parts), its pivots and pins, seats, the design motion and
 * the design envelope — everything the load engine needs, in SI units, as the design documents give it.
 * Pure TypeScript (no React): the server, the app's offline preview, import/export and the demo seed all
 * use this one schema. Flat lists (parts, pivots, seats, motion) map one-to-one onto CSV rows.
 */
import { z } from 'zod';

import {
  type ChainBody,
  type CycleInput,
  type MotionProfile,
  type Part,
  bodyFromParts,
} from '@/features/loads/engine';
import { MAX_BODIES } from '@/features/loads/schema';

const num = () =>
  z.number({ error: (i) => (i.input === undefined ? 'Required' : 'Must be a finite number') });
const positive = (what: string) => num().positive(`${what} must be greater than 0`);
const vec2 = () => z.tuple([num(), num()], { error: 'Must be [x, y] in metres' });
const index = () => z.int({ error: 'Must be a whole number' }).min(0, 'Must be 0 or more');
const name = () => z.string({ error: 'Required' }).trim().min(1, 'Required').max(80);

export const partKinds = [
  'rod',
  'point',
  'disc',
  'ring',
  'sphere',
  'plate',
  'counterweight',
  'custom',
] as const;

/** One part of a body, positioned in that body's frame (origin at the body's inboard pivot). */
export const designPartSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('rod'),
      body: index(),
      name: name(),
      massKg: positive('Mass'),
      fromM: vec2(),
      toM: vec2(),
    }),
    z.object({
      kind: z.literal('point'),
      body: index(),
      name: name(),
      massKg: positive('Mass'),
      atM: vec2(),
    }),
    ...(['disc', 'ring', 'sphere'] as const).map((kind) =>
      z.object({
        kind: z.literal(kind),
        body: index(),
        name: name(),
        massKg: positive('Mass'),
        centreM: vec2(),
        radiusM: positive('Radius'),
      }),
    ),
    z.object({
      kind: z.literal('plate'),
      body: index(),
      name: name(),
      massKg: positive('Mass'),
      centreM: vec2(),
      widthM: positive('Width'),
      heightM: positive('Height'),
    }),
    z.object({
      kind: z.literal('counterweight'),
      body: index(),
      name: name(),
      massKg: positive('Mass'),
      centreM: vec2(),
      widthM: positive('Width').optional(),
      heightM: positive('Height').optional(),
    }),
    z.object({
      kind: z.literal('custom'),
      body: index(),
      name: name(),
      massKg: positive('Mass'),
      cgM: vec2(),
      inertiaCgKgM2: num().min(0, 'Inertia cannot be negative'),
    }),
  ],
  { error: `Needs kind: ${partKinds.join(', ')}` },
);
export type DesignPart = z.infer<typeof designPartSchema>;

/** Non-destructive test methods (EN ISO 9712 abbreviations, used across the trade). */
export const ndtMethods = ['VT', 'MT', 'PT', 'UT', 'ET'] as const;
export type NdtMethod = (typeof ndtMethods)[number];

/** Each method's name in words (EN ISO 9712's method names). */
export const NDT_METHOD_WORDS: Record<NdtMethod, string> = {
  VT: 'Visual testing',
  MT: 'Magnetic particle testing',
  PT: 'Penetrant testing',
  UT: 'Ultrasonic testing',
  ET: 'Eddy current testing',
};

/** One NDT the maker requires at a pivot: the method and how often, from the maker's manual. */
export const ndtPlanSchema = z.object({
  method: z.enum(ndtMethods, { error: `One of ${ndtMethods.join(', ')}` }),
  intervalDays: z
    .int({ error: 'Must be a whole number of days' })
    .min(1, 'At least 1 day')
    .max(3660, 'At most 3660 days'),
  /** Where on the pivot, or the manual's reference. */
  note: z.string().trim().max(200).optional(),
});
export type NdtPlan = z.infer<typeof ndtPlanSchema>;

/**
 * A pivot's pin and plates for EN 1993-1-8 §3.13 Table 3.10. Geometry of a clevis (double shear): the
 * inner plate (the lug) `b` thick, the two outer plates (the cheeks) `a` thick each, a gap `c` between
 * each cheek and the lug. Single shear: one plate `a` and one `b`. Steel strengths in Pa. The pin's
 * diameter is the pivot's (the measured one when an inspection measured it). Partial factors default to
 * EN 1993-1-8's recommended values (γM0 = 1.0, γM2 = 1.25, γM6,ser = 1.0) and the load factor γF to 1.0
 * (the peak is checked as computed); a National Annex or the ride's design standard may set others.
 */
export const pinCheckSchema = z.object({
  /** The pin's steel, by name (e.g. "S355", "42CrMo4+QT"), for the record. */
  pinGrade: z.string().trim().min(1, 'Required').max(40),
  pinFyPa: positive('Pin yield strength'),
  pinFuPa: positive('Pin ultimate strength'),
  plateGrade: z.string().trim().min(1, 'Required').max(40),
  plateFyPa: positive('Plate yield strength'),
  innerPlateM: positive('Inner plate thickness'),
  outerPlateM: positive('Outer plate thickness'),
  gapM: num().min(0, 'Cannot be negative'),
  /** The pin can be replaced in service: the serviceability limits of Table 3.10 apply too. */
  replaceable: z.boolean({ error: 'Must be true or false' }).optional(),
  gammaM0: num().min(1, 'At least 1').max(3).optional(),
  gammaM2: num().min(1, 'At least 1').max(3).optional(),
  gammaM6ser: num().min(1, 'At least 1').max(3).optional(),
  gammaF: num().min(1, 'At least 1').max(3).optional(),
});
export type PinCheckData = z.infer<typeof pinCheckSchema>;

/**
 * Where on a pivot fatigue is checked: a pin in shear, a lug's net section, a weld toe… The stress there
 * follows one component of the pivot's force (or its torque) in the frame of the member that carries the
 * detail: `member` 'body' is the body hanging on the pivot (body `joint`, its x-axis along the body),
 * 'parent' the body (or, for joint 0, the ground, whose frame is the global one: 'along' is global x,
 * 'across' global y, up) that holds the pivot and carries the reaction. The stress per unit load is given
 * (MPa per kN, or per kN·m for torque) or derived from a section area (stress = load / (area × shear
 * planes)). Category and curve per EN 1993-1-9 §7 (Δσ_C, or Δτ_C for `shear`, at 2×10⁶).
 */
export const fatigueDetailKinds = ['pin_shear', 'lug_net_section', 'weld_toe', 'bolt', 'other'] as const;
export type FatigueDetailKind = (typeof fatigueDetailKinds)[number];
export const fatigueComponents = ['along', 'across', 'torque'] as const;
export type FatigueComponent = (typeof fatigueComponents)[number];

export const fatigueDetailSchema = z
  .object({
    joint: index(),
    name: name(),
    kind: z.enum(fatigueDetailKinds, { error: `One of ${fatigueDetailKinds.join(', ')}` }),
    member: z.enum(['body', 'parent'], { error: 'body or parent' }),
    component: z.enum(fatigueComponents, { error: `One of ${fatigueComponents.join(', ')}` }),
    stressPerKnMPa: positive('Stress per kN').optional(),
    sectionAreaMm2: positive('Section area').optional(),
    shearPlanes: z.union([z.literal(1), z.literal(2)], { error: '1 or 2' }).optional(),
    categoryMPa: positive('Detail category').max(200, 'At most 200 MPa'),
    shear: z.boolean({ error: 'Must be true or false' }).optional(),
    gammaFf: num().min(1, 'At least 1').max(3).optional(),
    gammaMf: num().min(1, 'At least 1').max(3).optional(),
    /** The Miner sum the design accepts for this detail (EN 1993-1-9: 1.0). */
    damageLimit: num().gt(0, 'Must be greater than 0').max(1, 'At most 1').optional(),
  })
  .superRefine((f, ctx) => {
    if ((f.stressPerKnMPa === undefined) === (f.sectionAreaMm2 === undefined))
      ctx.addIssue({
        code: 'custom',
        path: ['stressPerKnMPa'],
        message:
          f.stressPerKnMPa === undefined
            ? 'Give the stress per kN or the section area it comes from'
            : 'Give either the stress per kN or the section area, not both',
      });
    if (f.component === 'torque' && f.sectionAreaMm2 !== undefined)
      ctx.addIssue({
        code: 'custom',
        path: ['sectionAreaMm2'],
        message: 'A torque needs the stress per kN·m, not an area',
      });
    if (f.shearPlanes !== undefined && f.sectionAreaMm2 === undefined)
      ctx.addIssue({ code: 'custom', path: ['shearPlanes'], message: 'Only with a section area' });
  });
export type FatigueDetail = z.infer<typeof fatigueDetailSchema>;

/**
 * How the ride runs, for fatigue: one ride cycle (a programme, start to stop) is `rideCycleS` seconds of
 * the design motion followed by `stopsPerRideCycle` service stops (default 1).
 */
export const fatigueDataSchema = z.object({
  rideCycleS: positive('Ride cycle time').max(86400, 'At most a day'),
  stopsPerRideCycle: z.int({ error: 'Must be a whole number' }).min(0).max(100).optional(),
  details: z.array(fatigueDetailSchema).max(100),
});
export type FatigueData = z.infer<typeof fatigueDataSchema>;

/** The pivot at body `joint`'s inboard end: its pin, wear limits and design load limits. */
export const designPivotSchema = z
  .object({
    joint: index(),
    name: name(),
    shear: z.enum(['single', 'double'], { error: 'single or double' }),
    bearingLengthM: positive('Bearing length'),
    nominalDiameterM: positive('Nominal diameter'),
    minimumDiameterM: positive('Minimum diameter'),
    maxClearanceM: positive('Clearance limit'),
    maxShearStressPa: positive('Shear limit').optional(),
    maxBearingPressurePa: positive('Bearing limit').optional(),
    maxForceN: positive('Force limit').optional(),
    maxTorqueNm: positive('Torque limit').optional(),
    /** The pin and its plates for the EN 1993-1-8 §3.13 (Table 3.10) checks; absent: no pin check. */
    pinCheck: pinCheckSchema.optional(),
    /** The NDT the maker's manual asks for at this pivot: methods and intervals. */
    ndt: z.array(ndtPlanSchema).max(10).optional(),
  })
  .superRefine((p, ctx) => {
    if (!(p.minimumDiameterM < p.nominalDiameterM))
      ctx.addIssue({
        code: 'custom',
        path: ['minimumDiameterM'],
        message: 'Must be below the nominal diameter',
      });
  });
export type DesignPivot = z.infer<typeof designPivotSchema>;

export const designSeatSchema = z.object({
  body: index(),
  name: name(),
  positionM: vec2(),
  /** Direction of the rider's spine (seat to head) relative to the body's x-axis. */
  spineAngleRad: num(),
  facing: z.enum(['cw', 'ccw']).optional(),
});
export type DesignSeat = z.infer<typeof designSeatSchema>;

/** The design (maximum) motion of one joint, and its motion limits. */
export const designMotionSchema = z
  .object({
    joint: index(),
    kind: z.enum(['constant', 'swing', 'fixed']),
    /** constant: design speed. */
    rpm: num().min(-1000).max(1000).optional(),
    /** swing: design amplitude (each side of centre) and period. */
    amplitudeRad: num()
      .min(0)
      .max(2 * Math.PI)
      .optional(),
    periodS: positive('Period').optional(),
    /** fixed: the joint's set angle. */
    angleRad: num().optional(),
    maxRateRadS: positive('Rate limit').optional(),
    maxAmplitudeRad: positive('Amplitude limit').optional(),
    /**
     * swing: the joint is a free pin while it swings (no drive torque), so a swing is analysed as the free
     * swing from rest at its amplitude, not as a harmonic.
     */
    freeSwing: z.boolean({ error: 'Must be true or false' }).optional(),
    /** constant and swing: the service-stop deceleration (the design value), rad/s². */
    serviceDecelRadS2: positive('Service-stop deceleration').max(1000, 'At most 1000 rad/s²').optional(),
    /** constant and swing: the emergency-stop deceleration (the maker's value), rad/s². */
    emergencyDecelRadS2: positive('Emergency-stop deceleration').max(1000, 'At most 1000 rad/s²').optional(),
  })
  .superRefine((m, ctx) => {
    const need = (key: 'rpm' | 'amplitudeRad' | 'periodS' | 'angleRad') => {
      if (m[key] === undefined)
        ctx.addIssue({ code: 'custom', path: [key], message: `Required for ${m.kind} motion` });
    };
    if (m.kind === 'constant') need('rpm');
    if (m.kind === 'swing') {
      need('amplitudeRad');
      need('periodS');
    }
    if (m.kind === 'fixed') need('angleRad');
    if (m.freeSwing && m.kind !== 'swing')
      ctx.addIssue({ code: 'custom', path: ['freeSwing'], message: 'Only a swing motion can swing freely' });
    for (const key of ['serviceDecelRadS2', 'emergencyDecelRadS2'] as const)
      if (m[key] !== undefined && m.kind === 'fixed')
        ctx.addIssue({
          code: 'custom',
          path: [key],
          message: 'A fixed joint does not move, so it has no stop: leave empty',
        });
  });
export type DesignMotion = z.infer<typeof designMotionSchema>;

const axisLimit = z
  .object({ min: num().optional(), max: num().optional() })
  .refine((a) => a.min === undefined || a.max === undefined || a.min < a.max, {
    message: 'max must be above min',
    path: ['max'],
  });

export const designDataSchema = z
  .object({
    /** The design document these values come from. */
    source: z.object({ document: name(), revision: z.string().trim().min(1, 'Required').max(40) }),
    gravityMS2: num().min(0).max(100).optional(),
    bodies: z
      .array(z.object({ name: name(), tipM: vec2().optional() }))
      .min(1, 'Give at least one body')
      .max(MAX_BODIES),
    parts: z.array(designPartSchema).min(1, 'Give at least one part').max(500),
    pivots: z.array(designPivotSchema).max(MAX_BODIES),
    seats: z.array(designSeatSchema).max(200),
    motion: z.array(designMotionSchema).max(MAX_BODIES),
    rider: z.object({ gx: axisLimit.optional(), gz: axisLimit.optional() }),
    nearMargin: num().gt(0).lt(1).optional(),
    /** Fatigue details and how the ride runs; absent: no fatigue assessment. */
    fatigue: fatigueDataSchema.optional(),
  })
  .superRefine((d, ctx) => {
    const n = d.bodies.length;
    d.bodies.forEach((b, i) => {
      if (i < n - 1 && !b.tipM)
        ctx.addIssue({
          code: 'custom',
          path: ['bodies', i, 'tipM'],
          message: 'Needed: the next body’s pivot',
        });
    });
    const inRange = (list: 'parts' | 'seats', key: 'body') =>
      d[list].forEach((row, k) => {
        if (row[key] >= n)
          ctx.addIssue({ code: 'custom', path: [list, k, key], message: `No body ${row[key]} in the chain` });
      });
    inRange('parts', 'body');
    inRange('seats', 'body');
    for (let i = 0; i < n; i++)
      if (!d.parts.some((p) => p.body === i))
        ctx.addIssue({
          code: 'custom',
          path: ['parts'],
          message: `Body ${i} (${d.bodies[i].name}) has no parts`,
        });
    const onePerJoint = (list: 'pivots' | 'motion', required: boolean) => {
      const seen = new Set<number>();
      d[list].forEach((row, k) => {
        if (row.joint >= n)
          ctx.addIssue({
            code: 'custom',
            path: [list, k, 'joint'],
            message: `No joint ${row.joint} in the chain`,
          });
        if (seen.has(row.joint))
          ctx.addIssue({
            code: 'custom',
            path: [list, k, 'joint'],
            message: `Joint ${row.joint} is listed twice`,
          });
        seen.add(row.joint);
      });
      if (required)
        for (let i = 0; i < n; i++)
          if (!seen.has(i))
            ctx.addIssue({
              code: 'custom',
              path: [list],
              message: `Joint ${i} has no ${list === 'motion' ? 'motion' : 'pivot'}`,
            });
    };
    onePerJoint('pivots', true);
    onePerJoint('motion', true);
    d.fatigue?.details.forEach((f, k) => {
      if (f.joint >= n)
        ctx.addIssue({
          code: 'custom',
          path: ['fatigue', 'details', k, 'joint'],
          message: `No joint ${f.joint} in the chain`,
        });
    });
  });
export type DesignData = z.infer<typeof designDataSchema>;

function toPart(p: DesignPart): Part {
  switch (p.kind) {
    case 'rod':
      return { kind: 'rod', massKg: p.massKg, fromM: p.fromM, toM: p.toM };
    case 'point':
      return { kind: 'point', massKg: p.massKg, atM: p.atM };
    case 'plate':
      return { kind: 'plate', massKg: p.massKg, centreM: p.centreM, widthM: p.widthM, heightM: p.heightM };
    case 'counterweight':
      return {
        kind: 'counterweight',
        massKg: p.massKg,
        centreM: p.centreM,
        widthM: p.widthM,
        heightM: p.heightM,
      };
    case 'custom':
      return { kind: 'custom', massKg: p.massKg, cgM: p.cgM, inertiaCgKgM2: p.inertiaCgKgM2 };
    default:
      return { kind: p.kind, massKg: p.massKg, centreM: p.centreM, radiusM: p.radiusM };
  }
}

/** The chain the engine solves: each body's mass, CG and inertia combined from its parts. */
export function designBodies(d: DesignData): ChainBody[] {
  return d.bodies.map((b, i) =>
    bodyFromParts(
      b.name,
      d.parts.filter((p) => p.body === i).map(toPart),
      i < d.bodies.length - 1 ? b.tipM : undefined,
    ),
  );
}

/**
 * A joint's design motion as an engine profile. A free swing is the swing released from rest at its
 * amplitude (its period then follows from the chain, not from the design period).
 */
function designProfile(m: DesignMotion): MotionProfile {
  if (m.kind === 'constant') return { kind: 'constant', rpm: m.rpm ?? 0 };
  if (m.kind === 'swing' && m.freeSwing) return { kind: 'free', angleRad: m.amplitudeRad ?? 0 };
  if (m.kind === 'swing')
    return { kind: 'swing', amplitudeRad: m.amplitudeRad ?? 0, periodS: m.periodS ?? 1 };
  return { kind: 'fixed', angleRad: m.angleRad ?? 0 };
}

/** What an inspection measured, to check against the envelope in place of the design values. */
export type MeasuredInputs = {
  /** Per joint: a measured motion profile replacing the design motion. */
  profiles?: (MotionProfile | null | undefined)[];
  /** Per joint: measured pin diameter and bushing clearance. */
  wear?: ({ diameterM?: number; clearanceM?: number } | null | undefined)[];
};

/** The cycle-analysis input for a ride: design chain, design (or measured) motion, seats and envelope. */
export function designToCycleInput(d: DesignData, measured: MeasuredInputs = {}, samples = 360): CycleInput {
  const n = d.bodies.length;
  const motionOf = (i: number) => d.motion.find((m) => m.joint === i);
  const pivotOf = (i: number) => d.pivots.find((p) => p.joint === i);
  const profiles = Array.from({ length: n }, (_, i) => {
    const m = motionOf(i);
    return (
      measured.profiles?.[i] ?? (m ? designProfile(m) : ({ kind: 'fixed', angleRad: 0 } as MotionProfile))
    );
  });
  return {
    gravityMS2: d.gravityMS2,
    bodies: designBodies(d),
    profiles,
    samples,
    seats: d.seats.map((s) => ({ ...s })),
    limits: {
      nearMargin: d.nearMargin,
      joints: Array.from({ length: n }, (_, i) => {
        const m = motionOf(i);
        const p = pivotOf(i);
        const wear = measured.wear?.[i] ?? undefined;
        return {
          maxRateRadS: m?.maxRateRadS,
          maxAmplitudeRad: m?.maxAmplitudeRad,
          maxForceN: p?.maxForceN,
          maxTorqueNm: p?.maxTorqueNm,
          pin: p
            ? {
                shear: p.shear,
                bearingLengthM: p.bearingLengthM,
                nominalDiameterM: p.nominalDiameterM,
                minimumDiameterM: p.minimumDiameterM,
                measuredDiameterM: wear?.diameterM,
                maxShearStressPa: p.maxShearStressPa,
                maxBearingPressurePa: p.maxBearingPressurePa,
                measuredClearanceM: wear?.clearanceM,
                maxClearanceM: p.maxClearanceM,
                en1993: p.pinCheck,
              }
            : undefined,
        };
      }),
      rider: d.rider,
    },
  };
}
