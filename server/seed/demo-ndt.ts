/**
 * The demo's NDT history: for every demo ride whose design in force plans NDT at a pivot, one earlier test
 * per planned method, so the demo opens with due dates spread over the coming months rather than every
 * plan "never tested". Invented technicians; added only to rides without any NDT record, so it is safe to
 * run again.
 */
import { and, asc, eq, inArray } from 'drizzle-orm';

import { ndtRecords } from '@/db/server/ndt';
import { designVersions } from '@/db/server/schema';
import type { NdtResult } from '@/features/pivot-life/ndt-schema';
import { addDays, isoDay } from '@/lib/dates';
import type { Db } from '@/server/db';

const technicians = [
  { name: 'Ines Harrowgate', level: 2 },
  { name: 'Caius Mellenby', level: 3 },
] as const;

/** Adds the history to the given demo rides (by id) that have NDT plans and no records yet. */
export function topUpDemoNdt(
  tx: Pick<Db, 'select' | 'insert'>,
  rideIds: string[],
  authorId: string,
  now: Date,
) {
  if (rideIds.length === 0) return;
  const today = isoDay(now);
  const withRecords = new Set(
    tx
      .select({ rideId: ndtRecords.rideId })
      .from(ndtRecords)
      .where(inArray(ndtRecords.rideId, rideIds))
      .all()
      .map((r) => r.rideId),
  );
  rideIds.forEach((rideId, r) => {
    if (withRecords.has(rideId)) return;
    const current = tx
      .select({ data: designVersions.data })
      .from(designVersions)
      .where(and(eq(designVersions.rideId, rideId), eq(designVersions.approvalState, 'in_force')))
      .orderBy(asc(designVersions.version))
      .all()
      .at(-1);
    let n = 0;
    for (const pivot of current?.data.pivots ?? [])
      for (const plan of pivot.ndt ?? []) {
        // Part-way through its interval and at least 45 days from due: the demo opens with nothing due
        // within the 30-day window, so its reminders and queue start quiet.
        const ago = Math.max(
          0,
          Math.min(Math.round(plan.intervalDays * (0.2 + 0.1 * ((r + n) % 4))), plan.intervalDays - 45),
        );
        const technician = technicians[(r + n) % technicians.length];
        const result: NdtResult = (r + n) % 5 === 3 ? 'acceptable_indications' : 'no_indications';
        tx.insert(ndtRecords)
          .values({
            rideId,
            joint: pivot.joint,
            testedOn: addDays(today, -ago),
            method: plan.method,
            technician: technician.name,
            level: technician.level,
            result,
            note:
              result === 'acceptable_indications'
                ? 'Small linear indication at the lug edge, within acceptance; recheck at the next test.'
                : null,
            reportSha256: null,
            createdBy: authorId,
            createdAt: now.toISOString(),
          })
          .run();
        n++;
      }
  });
}
