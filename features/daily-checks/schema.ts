/**
 * Operators' daily checks (issue #19): the pre-opening checklist and test runs an operator's staff record
 * on a phone before a ride opens. A daily check travels and is stored as an inspection record of type
 * `daily_pre_opening` (features/records/schema.ts), through the same drafts, outbox, signing and push as
 * an inspector's; it is never decided at the review desk. This contract holds what the server answers
 * about them and the one rule for a missed day, shared by the server and the phone.
 */
import { z } from 'zod';

import { addDays, daysBetween } from '@/lib/dates';

/** The inspection type a daily check is recorded as. */
export const DAILY_CHECK_TYPE = 'daily_pre_opening' as const;

/** How far back the missed days are listed on the ride page, the operator's home and the queue. */
export const MISSED_WINDOW_DAYS = 14;

/** One daily check as the logbook, the ride page and the operator's home list it. */
export const dailyCheckSummarySchema = z.object({
  id: z.string(),
  rideId: z.string(),
  /** The day it was done on the ride's site's clock (YYYY-MM-DD). */
  day: z.string(),
  submittedAt: z.string(),
  /** `fail` when any item or test run failed: the ride must not open on it. */
  result: z.enum(['pass', 'fail']),
  failedItems: z.number().int(),
  /** Empty test cycles run before opening, summed over the test runs recorded; null when none recorded. */
  testCycles: z.number().int().nullable(),
  byId: z.string(),
  byName: z.string(),
});
export type DailyCheckSummary = z.infer<typeof dailyCheckSummarySchema>;

/** `GET /api/rides/:id/daily-checks`: the checks (newest first) and where the ride stands today. */
export const rideDailyChecksResponseSchema = z.object({
  checks: z.array(dailyCheckSummarySchema),
  /** Today on the ride's site's clock. */
  today: z.string(),
  /** Days the running log shows the ride ran with no daily check, newest first (within MISSED_WINDOW_DAYS). */
  missedDays: z.array(z.string()),
  /** `done` (a check today), `not_done_yet` (none yet today), or `not_in_service` (no check expected). */
  todayState: z.enum(['done', 'not_done_yet', 'not_in_service']),
});
export type RideDailyChecks = z.infer<typeof rideDailyChecksResponseSchema>;

/**
 * The days that were missed. A day is missed when the ride ran on it (its running log shows cycles or
 * hours above zero) and no daily check was done on it, both on the ride's site's calendar. Today is never
 * missed: until the day is over it is "not done yet today". Only days from `today − windowDays` to
 * yesterday count, and only from the ride's first daily check kept here (`firstCheckDay`): before it the
 * operator kept them elsewhere, and a ride with none here has nothing to compare with. Newest first.
 */
export function missedDays(args: {
  ran: readonly { day: string; cycles: number | null; hours: number | null }[];
  checkedDays: ReadonlySet<string>;
  firstCheckDay: string | null;
  today: string;
  windowDays?: number;
}): string[] {
  const first = args.firstCheckDay;
  if (first === null) return [];
  const from = addDays(args.today, -(args.windowDays ?? MISSED_WINDOW_DAYS));
  const days = new Set<string>();
  for (const r of args.ran) {
    const ran = (r.cycles ?? 0) > 0 || (r.hours ?? 0) > 0;
    if (!ran || args.checkedDays.has(r.day) || r.day < first) continue;
    if (daysBetween(r.day, args.today) <= 0 || r.day < from) continue;
    days.add(r.day);
  }
  return [...days].sort().reverse();
}

/** One ride in `GET /api/daily-checks/overview`: today's state, the latest check and the missed days. */
export const dailyOverviewRideSchema = z.object({
  rideId: z.string(),
  rideName: z.string(),
  siteName: z.string().nullable(),
  today: z.string(),
  todayState: rideDailyChecksResponseSchema.shape.todayState,
  latest: dailyCheckSummarySchema.nullable(),
  missedDays: z.array(z.string()),
});
export type DailyOverviewRide = z.infer<typeof dailyOverviewRideSchema>;
export const dailyOverviewResponseSchema = z.object({ rides: z.array(dailyOverviewRideSchema) });
