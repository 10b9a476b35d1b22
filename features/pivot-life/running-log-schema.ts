/**
 * The running log's API answers (`GET /api/rides/:id/running-log`, the day and CSV writes). The entry
 * itself is in features/pivot-life/schema.ts. Pure zod, no React.
 */
import { z } from 'zod';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/);

export const runningLogRowSchema = z.object({
  id: z.string(),
  rideId: z.string(),
  day: isoDate,
  cycles: z.number().optional(),
  hours: z.number().optional(),
  note: z.string().optional(),
  enteredBy: z.string(),
  enteredByName: z.string(),
  enteredAt: z.string(),
  source: z.enum(['typed', 'csv']),
});

export const runningLogTotalsSchema = z.object({
  days: z.number().int(),
  /** Cycles as logged, and hours as logged. */
  cycles: z.number(),
  hours: z.number(),
  /** Ride cycles with hours converted at the ride cycle time; null when hours cannot be converted. */
  rideCycles: z.number().nullable(),
  /** The design's ride cycle time the hours are converted at; null without fatigue design data. */
  rideCycleS: z.number().nullable(),
  /** Ride cycles per calendar day over the last 90 days of the log. */
  cyclesPerDay: z.number().nullable(),
});
export type RunningLogTotals = z.infer<typeof runningLogTotalsSchema>;

export const runningLogResponseSchema = z.object({
  rideId: z.string(),
  rideName: z.string(),
  entries: z.array(runningLogRowSchema),
  totals: runningLogTotalsSchema,
});
export type RunningLogResponse = z.infer<typeof runningLogResponseSchema>;

export const runningLogSaveResponseSchema = z.object({ entry: runningLogRowSchema, replaced: z.boolean() });
export type RunningLogSaveResponse = z.infer<typeof runningLogSaveResponseSchema>;

export const runningLogImportResponseSchema = z.object({
  saved: z.number().int(),
  replaced: z.number().int(),
});
export type RunningLogImportResponse = z.infer<typeof runningLogImportResponseSchema>;

/** A CSV upload as JSON (the file's text), for clients that cannot send text/csv. */
export const runningLogImportBodySchema = z.object({ csv: z.string().max(1_000_000) });
