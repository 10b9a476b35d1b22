/**
 * A ride's pivot life as the server answers it (`GET /api/rides/:id/life`), and the operators' running
 * log. Per pivot: fatigue life used and the date its damage limit is projected (from the running log and
 * the latest analysis), pin and bushing wear trends with projected dates, NDT due dates and the EN 1993-1-8
 * pin utilisations. Pure zod, no React: the server builds it, the app parses it.
 */
import { z } from 'zod';

import { ndtMethods } from '@/features/loads/design-schema';
import { loadCaseKinds, storedPinCheckSchema } from '@/features/records/analysis-schema';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'A date as YYYY-MM-DD');

/** One day of a ride's running, as an operator logs it: cycles run, or hours run (at least one). */
export const runningLogEntrySchema = z
  .object({
    day: isoDate,
    cycles: z.int({ error: 'Must be a whole number' }).min(0, 'Cannot be negative').max(100_000).optional(),
    hours: z
      .number({ error: 'Must be a number' })
      .min(0, 'Cannot be negative')
      .max(24, 'At most 24')
      .optional(),
    note: z.string().trim().max(200).optional(),
  })
  .refine((e) => e.cycles !== undefined || e.hours !== undefined, {
    message: 'Give the cycles or the hours run',
    path: ['cycles'],
  });
export type RunningLogEntry = z.infer<typeof runningLogEntrySchema>;

export type RunningLogRow = RunningLogEntry & {
  id: string;
  rideId: string;
  enteredBy: string;
  enteredByName: string;
  enteredAt: string;
  source: 'typed' | 'csv';
};

/** A fatigue detail's life: damage so far from the log, the rate, and the date the limit is reached. */
export const detailLifeSchema = z.object({
  detail: z.number().int(),
  name: z.string(),
  kind: z.string(),
  categoryMPa: z.number(),
  damagePerRideCycle: z.number(),
  governingCase: z.enum(loadCaseKinds).nullable(),
  /** Ride cycles logged (hours converted at the ride cycle time). */
  cyclesLogged: z.number(),
  damage: z.number(),
  damageLimit: z.number(),
  /** damage ÷ damageLimit. */
  lifeUsed: z.number(),
  /** Null when the log gives no running rate, or the detail takes no damage. */
  projectedLimitOn: isoDate.nullable(),
});
export type DetailLife = z.infer<typeof detailLifeSchema>;

/** A least-squares straight line through a wear quantity, against days or against logged cycles. */
export const wearTrendSchema = z.object({
  quantity: z.enum(['pin_diameter', 'clearance']),
  /** The limit (minimum diameter or maximum clearance), m. */
  limitM: z.number().nullable(),
  points: z.array(z.object({ on: isoDate, valueM: z.number(), cycles: z.number().nullable() })),
  /** Change per day (m/day), null with fewer than two readings on different days. */
  slopePerDay: z.number().nullable(),
  /** Change per 1000 logged ride cycles (m), null without a log covering the readings. */
  slopePer1000Cycles: z.number().nullable(),
  /** Where the fitted line reaches the limit; null when it never does (or cannot be fitted). */
  projectedOn: isoDate.nullable(),
  /** Where the 95 % prediction interval first reaches it: the earlier, cautious date. */
  earliestOn: isoDate.nullable(),
  /** The same by logged cycles, turned into a date at the recent running rate. */
  projectedByCyclesOn: isoDate.nullable(),
  /** The next scheduled inspection this is compared with. */
  nextInspectionOn: isoDate.nullable(),
  /** The limit may be reached before the next scheduled inspection. */
  flagged: z.boolean(),
  /** An earlier inspection date to suggest when flagged. */
  suggestedOn: isoDate.nullable(),
});
export type WearTrend = z.infer<typeof wearTrendSchema>;

export const ndtDueStates = ['overdue', 'due', 'upcoming', 'never_tested'] as const;
export type NdtDueState = (typeof ndtDueStates)[number];

export const ndtDueSchema = z.object({
  method: z.enum(ndtMethods),
  intervalDays: z.number().int(),
  lastOn: isoDate.nullable(),
  lastResult: z.string().nullable(),
  /** Last test + interval; for a pivot never tested, the date the plan took effect. */
  dueOn: isoDate.nullable(),
  state: z.enum(ndtDueStates),
});
export type NdtDue = z.infer<typeof ndtDueSchema>;

/** A pivot's EN 1993-1-8 utilisations, as the analysis stores them (without the pivot's joint and name). */
export const pinUtilisationSchema = storedPinCheckSchema.omit({ joint: true, name: true });
export type PinUtilisation = z.infer<typeof pinUtilisationSchema>;

export const pivotLifeSchema = z.object({
  joint: z.number().int(),
  name: z.string(),
  details: z.array(detailLifeSchema),
  wear: z.array(wearTrendSchema),
  ndt: z.array(ndtDueSchema),
  pin: pinUtilisationSchema.nullable(),
});
export type PivotLife = z.infer<typeof pivotLifeSchema>;

export const rideLifeSchema = z.object({
  rideId: z.string(),
  asOf: isoDate,
  /** The analysis the damage rates come from: the latest analysed inspection, else the design motion. */
  basis: z.object({
    source: z.enum(['inspection', 'design', 'none']),
    inspectionId: z.string().nullable(),
    submittedAt: z.string().nullable(),
    designVersion: z.number().nullable(),
    rideCycleS: z.number().nullable(),
  }),
  log: z.object({
    entries: z.number().int(),
    firstDay: isoDate.nullable(),
    lastDay: isoDate.nullable(),
    cyclesLogged: z.number(),
    /** Ride cycles per calendar day over the last 90 days of the log (the projection's rate). */
    cyclesPerDay: z.number().nullable(),
  }),
  pivots: z.array(pivotLifeSchema),
});
export type RideLife = z.infer<typeof rideLifeSchema>;
