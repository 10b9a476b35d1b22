import { z } from 'zod';

import { zodIssues } from '@/lib/api-errors';
import {
  ENGINE_ASSUMPTIONS,
  ENGINE_VERSION,
  FreeMotionError,
  analyseCycle,
  cycleResultToJson,
  defaultCycleDurationS,
  measuredSampleRateHz,
  naturalDurationS,
  solveInstant,
  type CycleResultJson,
  type InstantResult,
  type MotionProfile,
} from '@/features/loads/engine';

/** Sane upper bounds: a ride chain is short, and a cycle's arrays must stay a reasonable response. */
export const MAX_BODIES = 10;
export const MAX_SAMPLES = 100_000;
const MAX_POINTS = 20;
const MAX_SEATS = 50;

const numberError = (issue: { input?: unknown }) =>
  issue.input === undefined ? 'Required' : 'Must be a finite number';

/** Any finite number (zod 4 already rejects NaN and ±Infinity); "Required" when missing. */
const num = () => z.number({ error: numberError });
const vec2 = () =>
  z.tuple([num(), num()], {
    error: (i) => (i.input === undefined ? 'Required' : 'Must be [x, y] in metres'),
  });
const count = () => z.int({ error: (i) => (i.input === undefined ? 'Required' : 'Must be a whole number') });

const chainBodySchema = z.object({
  name: z.string({ error: 'Required' }).trim().min(1, 'Give the body a name').max(80),
  massKg: num().positive('Mass must be greater than 0'),
  cgM: vec2(),
  inertiaCgKgM2: num().min(0, 'Inertia cannot be negative'),
  tipM: vec2().optional(),
});

const gravitySchema = num()
  .min(0, 'Gravity is a magnitude along −y: 0 or more')
  .max(100, 'Gravity above 100 m/s² is not a ride')
  .optional();

const bodiesSchema = z
  .array(chainBodySchema, { error: 'Required' })
  .min(1, 'Give at least one body')
  .max(MAX_BODIES, `At most ${MAX_BODIES} bodies`);

type Ctx = z.RefinementCtx;

/** Every body but the last carries the next one's pivot. */
function requireTips(bodies: readonly { tipM?: unknown }[], ctx: Ctx) {
  bodies.forEach((b, i) => {
    if (i < bodies.length - 1 && b.tipM === undefined)
      ctx.addIssue({
        code: 'custom',
        path: ['bodies', i, 'tipM'],
        message: `Body ${i + 1} needs tipM, the pivot of the body that follows it`,
      });
  });
}

function requireLength(actual: number, expected: number, path: (string | number)[], what: string, ctx: Ctx) {
  if (actual !== expected)
    ctx.addIssue({
      code: 'custom',
      path,
      message: `Needs ${expected} ${what}, one per body (got ${actual})`,
    });
}

const momentPointSchema = z.object({
  name: z.string().trim().max(80).optional(),
  pointM: vec2(),
  /** When given, pointM is in this body's own frame (e.g. [0, 0] is its pivot); else global. */
  body: count().min(0).optional(),
});

const stateArray = () =>
  z.array(num(), { error: 'Required' }).max(MAX_BODIES, `At most ${MAX_BODIES} values`);

export const loadsRequestSchema = z
  .object({
    gravityMS2: gravitySchema,
    bodies: bodiesSchema,
    state: z.object(
      { angleRad: stateArray(), rateRadS: stateArray(), accelRadS2: stateArray() },
      { error: 'Required' },
    ),
    points: z.array(momentPointSchema).max(MAX_POINTS, `At most ${MAX_POINTS} points`).optional(),
  })
  .superRefine((v, ctx) => {
    const n = v.bodies.length;
    requireTips(v.bodies, ctx);
    for (const key of ['angleRad', 'rateRadS', 'accelRadS2'] as const)
      requireLength(v.state[key].length, n, ['state', key], 'values', ctx);
    v.points?.forEach((p, k) => {
      if (p.body !== undefined && p.body >= n)
        ctx.addIssue({
          code: 'custom',
          path: ['points', k, 'body'],
          message: `No body ${p.body} in the chain`,
        });
    });
  });

const rpm = () =>
  num().min(-1000, 'Faster than 1000 rpm is not a ride').max(1000, 'Faster than 1000 rpm is not a ride');
const seconds = () => num().positive('Must be greater than 0').max(86_400, 'At most a day');

const measuredProfileSchema = z
  .object({
    kind: z.literal('measured'),
    timeS: z.array(num(), { error: 'Required' }).min(4, 'Give at least 4 samples').max(MAX_SAMPLES),
    angleRad: z.array(num()).max(MAX_SAMPLES).optional(),
    rateRadS: z.array(num()).max(MAX_SAMPLES).optional(),
    startAngleRad: num().optional(),
    /** Former callers: a Savitzky–Golay window in samples, used only when cutoffHz is absent. */
    windowPoints: count().min(4, 'At least 4 points').max(101, 'At most 101 points').optional(),
    /** Low-pass cut-off in Hz; when absent the engine chooses one from the record itself. */
    cutoffHz: num().positive('Must be greater than 0').optional(),
  })
  .superRefine((p, ctx) => {
    const values = p.angleRad ?? p.rateRadS;
    if ((p.angleRad === undefined) === (p.rateRadS === undefined)) {
      ctx.addIssue({
        code: 'custom',
        path: ['angleRad'],
        message: 'Give angleRad or rateRadS, not both or neither',
      });
      return;
    }
    const key = p.angleRad ? 'angleRad' : 'rateRadS';
    if (values && values.length !== p.timeS.length)
      ctx.addIssue({ code: 'custom', path: [key], message: `Needs ${p.timeS.length} values, one per time` });
    // A cubic fit to angles needs 5 points to smooth anything, a quadratic fit to rates 4.
    if (p.angleRad && p.timeS.length < 5)
      ctx.addIssue({ code: 'custom', path: ['timeS'], message: 'Give at least 5 angle samples' });
    let increasing = true;
    for (let k = 1; k < p.timeS.length; k++)
      if (!(p.timeS[k] > p.timeS[k - 1])) {
        ctx.addIssue({ code: 'custom', path: ['timeS', k], message: 'Times must increase' });
        increasing = false;
        break;
      }
    // The filter cannot pass what the sampling cannot hold: the cut-off must stay below Nyquist.
    if (increasing && p.cutoffHz !== undefined && p.timeS.length >= 2) {
      const nyquist = measuredSampleRateHz(p.timeS) / 2;
      if (!(p.cutoffHz < nyquist))
        ctx.addIssue({
          code: 'custom',
          path: ['cutoffHz'],
          message: `Must be below half the record's sample rate (${Number(nyquist.toPrecision(3))} Hz here): sample faster or lower the cut-off`,
        });
    }
  });

const motionProfileSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('fixed'), angleRad: num() }),
    z.object({ kind: z.literal('constant'), rpm: rpm(), startAngleRad: num().optional() }),
    z.object({
      kind: z.literal('ramp'),
      fromRpm: rpm().optional(),
      toRpm: rpm(),
      rampTimeS: seconds(),
      holdBeforeS: num().min(0).max(86_400).optional(),
      holdAfterS: num().min(0).max(86_400).optional(),
      startAngleRad: num().optional(),
      shape: z.enum(['linear', 'smooth']).optional(),
    }),
    z.object({
      kind: z.literal('swing'),
      amplitudeRad: num()
        .min(0, 'Amplitude cannot be negative')
        .max(2 * Math.PI, 'At most a full turn'),
      periodS: seconds(),
      centreRad: num().optional(),
      phaseRad: num().optional(),
    }),
    measuredProfileSchema,
    // A free pin's state at t = 0; whether the chain can move it is found when it is integrated.
    z.object({ kind: z.literal('free'), angleRad: num(), rateRadS: num().optional() }),
  ],
  { error: 'Needs kind: fixed, constant, ramp, swing, measured or free' },
);

const seatSchema = z.object({
  name: z.string({ error: 'Required' }).trim().min(1, 'Give the seat a name').max(80),
  body: count().min(0),
  positionM: vec2(),
  spineAngleRad: num(),
  facing: z.enum(['cw', 'ccw']).optional(),
});

const positive = (what: string) => num().positive(`${what} must be greater than 0`);

const pinSchema = z
  .object({
    shear: z.enum(['single', 'double'], { error: 'single or double' }),
    bearingLengthM: positive('Bearing length'),
    nominalDiameterM: positive('Nominal diameter'),
    minimumDiameterM: positive('Minimum diameter').optional(),
    measuredDiameterM: positive('Measured diameter').optional(),
    maxShearStressPa: positive('Shear limit').optional(),
    maxBearingPressurePa: positive('Bearing limit').optional(),
    measuredClearanceM: num().min(0, 'Clearance cannot be negative').optional(),
    maxClearanceM: positive('Clearance limit').optional(),
  })
  .superRefine((p, ctx) => {
    if (p.minimumDiameterM !== undefined && !(p.minimumDiameterM < p.nominalDiameterM))
      ctx.addIssue({
        code: 'custom',
        path: ['minimumDiameterM'],
        message: 'The minimum diameter must be below the nominal',
      });
  });

const jointLimitsSchema = z.object({
  maxRateRadS: positive('Rate limit').optional(),
  maxAmplitudeRad: positive('Amplitude limit').optional(),
  maxForceN: positive('Force limit').optional(),
  maxTorqueNm: positive('Torque limit').optional(),
  pin: pinSchema.optional(),
});

const axisLimitSchema = z.object({ min: num().optional(), max: num().optional() }).superRefine((a, ctx) => {
  if (a.min !== undefined && a.max !== undefined && !(a.min < a.max))
    ctx.addIssue({ code: 'custom', path: ['max'], message: 'max must be above min' });
  if (a.min === undefined && a.max === undefined)
    ctx.addIssue({ code: 'custom', path: [], message: 'Give min, max or both' });
});

const limitsSchema = z.object({
  nearMargin: num().gt(0, 'Between 0 and 1').lt(1, 'Between 0 and 1').optional(),
  joints: z.array(jointLimitsSchema.nullable()).max(MAX_BODIES).optional(),
  rider: z.object({ gx: axisLimitSchema.optional(), gz: axisLimitSchema.optional() }).optional(),
});

export const cycleRequestSchema = z
  .object({
    gravityMS2: gravitySchema,
    bodies: bodiesSchema,
    profiles: z.array(motionProfileSchema, { error: 'Required' }).max(MAX_BODIES),
    durationS: seconds().optional(),
    samples: count()
      .min(2, 'At least 2 samples')
      .max(MAX_SAMPLES, `At most ${MAX_SAMPLES.toLocaleString('en')} samples`)
      .optional(),
    seats: z.array(seatSchema).max(MAX_SEATS, `At most ${MAX_SEATS} seats`).optional(),
    limits: limitsSchema.optional(),
  })
  .superRefine((v, ctx) => {
    const n = v.bodies.length;
    requireTips(v.bodies, ctx);
    requireLength(v.profiles.length, n, ['profiles'], 'motion profiles', ctx);
    v.seats?.forEach((s, k) => {
      if (s.body >= n)
        ctx.addIssue({
          code: 'custom',
          path: ['seats', k, 'body'],
          message: `No body ${s.body} in the chain`,
        });
    });
    if (v.limits?.joints && v.limits.joints.length > n)
      ctx.addIssue({
        code: 'custom',
        path: ['limits', 'joints'],
        message: `At most ${n} entries, one per joint`,
      });
    const profiles: MotionProfile[] = v.profiles;
    const duration = v.durationS ?? defaultCycleDurationS(profiles);
    // A free joint's period, found by integration, is the cycle when nothing else gives one.
    if (duration === null && profiles.some((p) => p.kind === 'free')) return;
    if (duration === null) {
      ctx.addIssue({
        code: 'custom',
        path: ['durationS'],
        message: 'Give durationS: no profile has a cycle length of its own',
      });
      return;
    }
    // Measured motion is not extrapolated: the cycle must lie within every record.
    profiles.forEach((p, i) => {
      const span = p.kind === 'measured' ? naturalDurationS(p) : null;
      if (span !== null && duration > span * (1 + 1e-9))
        ctx.addIssue({
          code: 'custom',
          path: v.durationS !== undefined ? ['durationS'] : ['profiles', i, 'timeS'],
          message: `The cycle (${duration} s) is longer than the measured record of joint ${i + 1} (${span} s)`,
        });
    });
  });

type ValidationIssue = { path: string; message: string };
type ApiOutcome<T> = { ok: true; value: T } | { ok: false; issues: ValidationIssue[] };

type LoadsResponse = InstantResult & { engineVersion: string };
export type CycleResponse = CycleResultJson & { engineVersion: string; assumptions: readonly string[] };

/** POST /api/loads: validate, solve one instant. The response body is `value`. */
export function solveLoadsRequest(body: unknown): ApiOutcome<LoadsResponse> {
  const parsed = loadsRequestSchema.safeParse(body);
  if (!parsed.success) return { ok: false, issues: zodIssues(parsed.error) };
  const { bodies, state, gravityMS2, points } = parsed.data;
  const result = solveInstant(bodies, state, { gravityMS2, points });
  return { ok: true, value: { engineVersion: ENGINE_VERSION, ...result } };
}

/** Validate a cycle request and analyse the whole cycle, as the engine's typed arrays. */
export function analyseCycleBody(body: unknown): ApiOutcome<ReturnType<typeof analyseCycle>> {
  const parsed = cycleRequestSchema.safeParse(body);
  if (!parsed.success) return { ok: false, issues: zodIssues(parsed.error) };
  try {
    return { ok: true, value: analyseCycle(parsed.data) };
  } catch (error) {
    // A free joint the chain cannot move, or no period to take as the cycle: the request's fault.
    if (error instanceof FreeMotionError)
      return { ok: false, issues: [{ path: error.path.join('.'), message: error.message }] };
    throw error;
  }
}

/** POST /api/loads/cycle: validate, analyse the whole cycle. The response body is `value`. */
export function analyseCycleRequest(body: unknown): ApiOutcome<CycleResponse> {
  const analysed = analyseCycleBody(body);
  if (!analysed.ok) return analysed;
  return {
    ok: true,
    value: {
      engineVersion: ENGINE_VERSION,
      assumptions: ENGINE_ASSUMPTIONS,
      ...cycleResultToJson(analysed.value),
    },
  };
}
