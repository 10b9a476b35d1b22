/**
 * The demo's running log: a year of each demo ride's running, as its operator would have imported it, so
 * the demo opens with pivots that have used some of their fatigue life and a projected date for the limit.
 * Open every day from May to September and at weekends otherwise; busier at weekends; a travelling ride
 * runs in hours (its operator counts hours, not cycles). Invented figures, deterministic (no randomness,
 * so every seed gives the same log). Added only to rides without any log, so it is safe to run again.
 */
import { eq, inArray } from 'drizzle-orm';

import { runningLog } from '@/db/server/life';
import { rides, users } from '@/db/server/schema';
import { addDays, isoDay } from '@/lib/dates';
import type { Db } from '@/server/db';

/** Days of history before today. */
const HISTORY_DAYS = 365;

/** A small deterministic wobble in [0, 1) from a ride's and a day's numbers. */
const wobble = (a: number, b: number) => {
  const x = Math.sin(a * 12.9898 + b * 78.233) * 43758.5453;
  return x - Math.floor(x);
};

export function topUpDemoRunningLog(
  tx: Pick<Db, 'select' | 'insert'>,
  rideIds: string[],
  authorId: string,
  now: Date,
) {
  if (rideIds.length === 0) return;
  const logged = new Set(
    tx
      .select({ rideId: runningLog.rideId })
      .from(runningLog)
      .where(inArray(runningLog.rideId, rideIds))
      .all()
      .map((r) => r.rideId),
  );
  const today = isoDay(now);
  const enteredAt = now.toISOString();
  rideIds.forEach((rideId, r) => {
    if (logged.has(rideId)) return;
    const ride = tx
      .select({ operator: rides.operatorCompanyId })
      .from(rides)
      .where(eq(rides.id, rideId))
      .get();
    // The operator's own person enters the log where the demo has one for that company.
    const enteredBy =
      (ride &&
        tx.select({ id: users.id }).from(users).where(eq(users.companyId, ride.operator)).limit(1).get()
          ?.id) ??
      authorId;
    const inHours = r % 3 === 2;
    const rows = [];
    for (let back = HISTORY_DAYS; back >= 1; back--) {
      const day = addDays(today, -back);
      const date = new Date(`${day}T00:00:00Z`);
      const month = date.getUTCMonth() + 1;
      const weekend = date.getUTCDay() === 0 || date.getUTCDay() === 6;
      const season = month >= 5 && month <= 9;
      if (!season && !weekend) continue;
      const w = wobble(r + 1, back);
      // A closed day now and then (weather, a private hire).
      if (w < 0.06) continue;
      const busy = (season ? 1 : 0.6) * (weekend ? 1.3 : 1) * (0.75 + 0.5 * w);
      rows.push({
        rideId,
        day,
        cycles: inHours ? null : Math.round((90 + 25 * (r % 4)) * busy),
        hours: inHours ? Math.round(7 * busy * 4) / 4 : null,
        note: null,
        enteredBy,
        enteredAt,
        source: 'csv' as const,
      });
    }
    for (let i = 0; i < rows.length; i += 200)
      tx.insert(runningLog)
        .values(rows.slice(i, i + 200))
        .run();
  });
}
