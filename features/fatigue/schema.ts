/**
 * The fatigue service's contract: request bodies of `POST /api/fatigue/rainflow` and
 * `POST /api/fatigue/damage`, and their answers. Shared by the server (validation) and any client.
 */
import { z } from 'zod';

/** Series length bounds of both routes. */
export const MIN_SERIES_POINTS = 2;
export const MAX_SERIES_POINTS = 1_000_000;
/** Longest list of cycles `POST /api/fatigue/damage` takes. */
export const MAX_CYCLES = 1_000_000;

/** Largest magnitude a value may have, so that every range between two values is still finite. */
export const MAX_ABS_VALUE = Number.MAX_VALUE / 2;

/** Bad values named one by one up to this many; a whole series of bad values must not make a huge 400. */
const MAX_NAMED_VALUES = 5;

/**
 * A series of finite numbers, checked in one loop instead of one zod schema per element: a million-point
 * series is validated quickly, and a million bad values give a short list of issues, not a million.
 */
const seriesSchema = z
  .custom<number[]>(() => true)
  .superRefine((value, ctx) => {
    if (!Array.isArray(value)) {
      ctx.addIssue({
        code: 'custom',
        message: `Send the series as an array of ${MIN_SERIES_POINTS} to ${MAX_SERIES_POINTS.toLocaleString('en')} numbers.`,
      });
      return;
    }
    if (value.length < MIN_SERIES_POINTS || value.length > MAX_SERIES_POINTS) {
      ctx.addIssue({
        code: 'custom',
        message: `The series has ${value.length.toLocaleString('en')} values; it needs ${MIN_SERIES_POINTS} to ${MAX_SERIES_POINTS.toLocaleString('en')}.`,
      });
      return;
    }
    let bad = 0;
    for (let i = 0; i < value.length; i++) {
      const v: unknown = value[i];
      if (typeof v === 'number' && Math.abs(v) <= MAX_ABS_VALUE) continue;
      if (bad < MAX_NAMED_VALUES) {
        const message =
          typeof v === 'number' && Number.isFinite(v)
            ? 'Too large: the range between two values must stay finite (at most ±8.9e307).'
            : 'Must be a finite number.';
        ctx.addIssue({ code: 'custom', message, path: [i] });
      }
      bad++;
    }
    if (bad > MAX_NAMED_VALUES) {
      ctx.addIssue({
        code: 'custom',
        message: `${bad.toLocaleString('en')} values of the series are not finite numbers (the first ${MAX_NAMED_VALUES} are listed).`,
      });
    }
  });

/** `POST /api/fatigue/rainflow`: a history in any unit. */
export const rainflowRequestSchema = z.object({ series: seriesSchema });
export type RainflowRequest = z.output<typeof rainflowRequestSchema>;

export const rainflowCycleSchema = z.object({ range: z.number(), mean: z.number(), count: z.number() });
export const rainflowResponseSchema = z.object({ cycles: z.array(rainflowCycleSchema) });
export type RainflowResponse = z.output<typeof rainflowResponseSchema>;

const partialFactor = (name: string) =>
  z
    .number({ error: `${name} must be a number of at least 1.` })
    .min(1, { error: `${name} must be at least 1.` })
    .default(1);

export const countedRangeSchema = z.object({
  rangeMPa: z
    .number({ error: 'Give the stress range in MPa.' })
    .min(0, { error: 'A stress range cannot be negative.' }),
  count: z.number({ error: 'Give the number of cycles.' }).min(0, { error: 'A count cannot be negative.' }),
});

/**
 * `POST /api/fatigue/damage`: exactly one of `series` (a stress history in MPa, rainflow-counted) or
 * `cycles` (ranges in MPa with their counts), and the detail's EN 1993-1-9 category with its factors.
 */
export const damageRequestSchema = z
  .object({
    series: seriesSchema.optional(),
    cycles: z
      .array(countedRangeSchema, { error: 'Send the cycles as an array of { rangeMPa, count }.' })
      .max(MAX_CYCLES, { error: `At most ${MAX_CYCLES.toLocaleString('en')} cycles.` })
      .optional(),
    detailCategoryMPa: z
      .number({ error: 'Give the detail category (Δσ_C, or Δτ_C for shear) in MPa.' })
      .positive({ error: 'The detail category must be above 0 MPa.' }),
    gammaFf: partialFactor('γ_Ff'),
    gammaMf: partialFactor('γ_Mf'),
    shear: z.boolean({ error: 'shear is true or false.' }).default(false),
  })
  .superRefine((body, ctx) => {
    const hasSeries = body.series !== undefined;
    const hasCycles = body.cycles !== undefined;
    if (hasSeries === hasCycles) {
      const message = hasSeries
        ? 'Send either a series or cycles, not both.'
        : 'Send either a series (stress history in MPa) or cycles ([{ rangeMPa, count }]).';
      ctx.addIssue({ code: 'custom', message, path: ['series'] });
      ctx.addIssue({ code: 'custom', message, path: ['cycles'] });
    }
  });
export type DamageRequest = z.output<typeof damageRequestSchema>;

export const damageResponseSchema = z.object({
  damage: z.number(),
  cycles: z.array(
    z.object({
      rangeMPa: z.number(),
      count: z.number(),
      cyclesToFailure: z.number().nullable(),
      damage: z.number(),
    }),
  ),
  curve: z.object({
    deltaSigmaCMPa: z.number(),
    deltaSigmaDMPa: z.number().nullable(),
    deltaSigmaLMPa: z.number(),
  }),
});
export type DamageResponse = z.output<typeof damageResponseSchema>;
