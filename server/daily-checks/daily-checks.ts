/**
 * Reading operators' daily pre-opening checks (features/daily-checks/schema.ts). They are stored as
 * inspections of type `daily_pre_opening`, pushed like any record (server/sync/ingest.ts); this module
 * only reads: a ride's checks for its page, the operator's home and the logbook, and the days it ran
 * without one.
 */
import { and, desc, eq, gte, min } from 'drizzle-orm';

import { runningLog } from '@/db/server/life';
import { inspections } from '@/db/server/inspections';
import { users } from '@/db/server/schema';
import {
  DAILY_CHECK_TYPE,
  MISSED_WINDOW_DAYS,
  missedDays,
  type DailyCheckSummary,
  type RideDailyChecks,
} from '@/features/daily-checks/schema';
import type { RideStatus } from '@/lib/vocabulary';
import { addDays, dayInZone } from '@/lib/dates';
import type { Db } from '@/server/db';
import { rideTimeZone } from '@/server/schedule-due';

type Reader = Pick<Db, 'select'>;

/**
 * A ride's daily checks, newest first: the day (on its site's clock), the result and who did it. `since`
 * (YYYY-MM-DD, compared with the submission time) keeps to recent ones. For the logbook and the ride page.
 */
export function dailyChecksOfRide(
  db: Reader,
  rideId: string,
  opts: { since?: string; limit?: number } = {},
): DailyCheckSummary[] {
  const zone = rideTimeZone(db, rideId);
  return db
    .select({
      id: inspections.id,
      rideId: inspections.rideId,
      submittedAt: inspections.submittedAt,
      failedItems: inspections.failedItems,
      record: inspections.record,
      byId: inspections.inspectorId,
      byName: users.name,
    })
    .from(inspections)
    .innerJoin(users, eq(users.id, inspections.inspectorId))
    .where(
      and(
        eq(inspections.rideId, rideId),
        eq(inspections.type, DAILY_CHECK_TYPE),
        opts.since ? gte(inspections.submittedAt, opts.since) : undefined,
      ),
    )
    .orderBy(desc(inspections.submittedAt), desc(inspections.id))
    .limit(opts.limit ?? 400)
    .all()
    .map(({ record, ...row }) => {
      const runs = record.testRuns ?? [];
      return {
        ...row,
        day: dayInZone(row.submittedAt, zone),
        result: row.failedItems > 0 ? 'fail' : 'pass',
        testCycles: runs.length ? runs.reduce((n, t) => n + t.cycles, 0) : null,
      };
    });
}

/** A ride expects a daily check today only while it may run. */
const mayRun = (status: RideStatus) => status !== 'out_of_service';

/**
 * Where a ride stands with its daily checks at `now`: its recent checks, the days of the last
 * MISSED_WINDOW_DAYS it ran without one (features/daily-checks `missedDays`), and today's state.
 */
export function rideDailyChecks(
  db: Reader,
  ride: { id: string; status: RideStatus },
  now: Date,
): RideDailyChecks {
  const zone = rideTimeZone(db, ride.id);
  const today = dayInZone(now, zone);
  const from = addDays(today, -MISSED_WINDOW_DAYS);
  // A day back further for the query: a check's UTC time may fall on the day before its site's date.
  const checks = dailyChecksOfRide(db, ride.id, { since: addDays(from, -1) });
  const ran = db
    .select({ day: runningLog.day, cycles: runningLog.cycles, hours: runningLog.hours })
    .from(runningLog)
    .where(and(eq(runningLog.rideId, ride.id), gte(runningLog.day, from)))
    .all();
  const checkedDays = new Set(checks.map((c) => c.day));
  const first = db
    .select({ at: min(inspections.submittedAt) })
    .from(inspections)
    .where(and(eq(inspections.rideId, ride.id), eq(inspections.type, DAILY_CHECK_TYPE)))
    .get()?.at;
  return {
    checks: checks.filter((c) => c.day >= from),
    today,
    missedDays: missedDays({ ran, checkedDays, firstCheckDay: first ? dayInZone(first, zone) : null, today }),
    todayState: checkedDays.has(today) ? 'done' : mayRun(ride.status) ? 'not_done_yet' : 'not_in_service',
  };
}
