/**
 * Each ride's pivot-life flags (`ride_life_flags`): the earliest NDT due date over its pivots and planned
 * methods, and the earliest cautious wear-limit date that falls before the next scheduled inspection with
 * the earlier inspection date suggested for it. The review queue sits below this layer, so it reads these
 * in SQL; whatever changes them calls `refreshRideLifeFlags`, which then refreshes the ride's queue rows.
 *
 * Called after an NDT record is added, an analysis is stored, a running-log day is entered or imported,
 * design data is stored, and a schedule changes — inside the same transaction as the change.
 */
import { eq, notExists, sql } from 'drizzle-orm';

import { rideLifeFlags } from '@/db/server/ndt';
import { rides } from '@/db/server/schema';
import { earliestNdtDue } from '@/features/pivot-life/ndt-due';
import type { Db } from '@/server/db';
import type { WearTrend } from '@/features/pivot-life/schema';
import { rideNdtDue } from '@/server/pivot-life/ndt';
import { rideWearTrends } from '@/server/pivot-life/wear';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { rideDay } from '@/server/schedule-due';

type Tx = Pick<Db, 'select' | 'insert' | 'delete' | 'run' | 'get' | 'all'>;

export type RideLifeFlags = {
  ndtDueOn: string | null;
  wearLimitOn: string | null;
  wearSuggestedOn: string | null;
};

const earlier = (a: string | null, b: string | null) => (a === null ? b : b === null || a <= b ? a : b);

/**
 * The cautious date a trend reaches its limit, as its flag was decided: the prediction bound's date (the
 * line's own when the readings leave no interval), or the logged-cycles date when that comes first.
 */
const cautiousOn = (t: WearTrend) => earlier(t.earliestOn ?? t.projectedOn, t.projectedByCyclesOn);

/** What the flags of a ride are on `today`, without writing them. */
export function rideLifeFlagsOf(db: Tx, rideId: string, today: string): RideLifeFlags {
  const ndtDueOn = earliestNdtDue([...rideNdtDue(db, rideId, today).values()].flat());
  let wearLimitOn: string | null = null;
  let wearSuggestedOn: string | null = null;
  for (const trend of [...rideWearTrends(db, rideId, today).values()].flat()) {
    if (!trend.flagged) continue;
    wearLimitOn = earlier(wearLimitOn, cautiousOn(trend));
    wearSuggestedOn = earlier(wearSuggestedOn, trend.suggestedOn ?? today);
  }
  return { ndtDueOn, wearLimitOn, wearSuggestedOn };
}

/**
 * Writes the ride's flags for `today` (the queue's day: `queueDay(db, now)`) and refreshes its queue rows.
 * A ride with nothing to flag keeps a row of nulls, which says its flags have been worked out.
 */
export function refreshRideLifeFlags(db: Tx, rideId: string, today: string, now: Date = new Date()): void {
  // `today` is the queue's clock: an instant, whose date at the ride's site is the ride's day.
  const values = { ...rideLifeFlagsOf(db, rideId, rideDay(db, rideId, today)), updatedAt: now.toISOString() };
  db.insert(rideLifeFlags)
    .values({ rideId, ...values })
    .onConflictDoUpdate({ target: rideLifeFlags.rideId, set: values })
    .run();
  refreshQueue(db, today, [rideId]);
}

/**
 * Works out the flags of every ride that has none yet (data stored before the flags existed), one ride per
 * transaction so requests are never held for long. Run at start, before the queue is first built.
 */
export function backfillRideLifeFlags(db: Db, today: string, now: Date = new Date()): number {
  const missing = db
    .select({ id: rides.id })
    .from(rides)
    .where(
      notExists(
        db
          .select({ one: sql`1` })
          .from(rideLifeFlags)
          .where(eq(rideLifeFlags.rideId, rides.id)),
      ),
    )
    .all();
  for (const { id } of missing) db.transaction((tx) => refreshRideLifeFlags(tx, id, today, now));
  return missing.length;
}

/** The same in a transaction of its own, for a route to call after a write that may move the flags. */
export function refreshRideLifeFlagsAfter(db: Db, rideId: string, now: Date): void {
  db.transaction((tx) => refreshRideLifeFlags(tx, rideId, queueDay(db, now), now));
}
