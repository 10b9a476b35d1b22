/**
 * Invented makers' safety bulletins for the demo's rides (the makers are the demo's own, made up). Dates
 * count from the seed day so the demo always shows one bulletin open with a deadline ahead, one overdue
 * and one piece of advice without a deadline. No PDF: a demo database has none of the makers' files.
 */
import { count } from 'drizzle-orm';

import { bulletinModels, bulletins } from '@/db/server/bulletins';
import { type BulletinSeverity, matchKey } from '@/features/bulletins/schema';
import type { Db } from '@/server/db';
import { addDays, isoDay } from '@/lib/dates';

type DemoBulletin = {
  maker: string;
  models: string[];
  reference: string;
  title: string;
  issuedDaysAgo: number;
  severity: BulletinSeverity;
  requiredAction: string;
  /** Days from the seed day to the deadline (negative: past); absent for none. */
  deadlineInDays?: number;
};

export const demoBulletins: DemoBulletin[] = [
  {
    maker: 'Orrin Ride Works',
    models: ['PX-15', 'PX-6'],
    reference: 'ORW-SB-26-04',
    title: 'Gondola hanger pin retaining plates: larger bolts',
    issuedDaysAgo: 40,
    severity: 'safety',
    requiredAction:
      'Replace the two M10 bolts of each hanger pin retaining plate with M12 grade 10.9 bolts (kit K-118), torque to 85 N·m and paint witness marks',
    deadlineInDays: 20,
  },
  {
    maker: 'Orrin Ride Works',
    models: ['RX-30'],
    reference: 'ORW-SB-26-07',
    title: 'Arm hub clamp bolts: check after transport',
    issuedDaysAgo: 30,
    severity: 'stop_ride',
    requiredAction:
      'After every build-up, check the eight arm hub clamp bolts at 410 N·m and record any bolt that turned before the wrench clicked',
    deadlineInDays: -5,
  },
  {
    maker: 'Quillon Carousel Works',
    models: ['SC-32'],
    reference: 'QCW-TN-118',
    title: 'Chain swivels: shorter greasing interval',
    issuedDaysAgo: 90,
    severity: 'advice',
    requiredAction: 'Grease the seat chain swivels every 40 running hours instead of 60',
  },
];

/** Adds the demo bulletins when the register has none. */
export function topUpDemoBulletins(tx: Pick<Db, 'select' | 'insert'>, authorId: string, now: Date): void {
  if ((tx.select({ n: count() }).from(bulletins).get()?.n ?? 0) > 0) return;
  const today = isoDay(now);
  for (const b of demoBulletins) {
    const { id } = tx
      .insert(bulletins)
      .values({
        maker: b.maker,
        makerKey: matchKey(b.maker),
        reference: b.reference,
        title: b.title,
        issuedOn: addDays(today, -b.issuedDaysAgo),
        severity: b.severity,
        requiredAction: b.requiredAction,
        deadlineOn: b.deadlineInDays === undefined ? null : addDays(today, b.deadlineInDays),
        createdAt: now.toISOString(),
        createdBy: authorId,
        updatedAt: now.toISOString(),
      })
      .returning({ id: bulletins.id })
      .get();
    tx.insert(bulletinModels)
      .values(
        b.models.map((model, position) => ({ bulletinId: id, position, model, modelKey: matchKey(model) })),
      )
      .run();
  }
}
