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
              }
            : undefined,
        };
      }),
      rider: d.rider,
    },
  };
}
