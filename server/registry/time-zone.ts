/**
 * The inspection body's default time zone: the zone of every site that names none of its own, and so of
 * those sites' "today", due dates, reminder hour and shown times. An admin setting (`settings.time_zone`),
 * audited like the others; UTC until one is chosen. Reading it is `defaultTimeZone` (server/schedule-due.ts),
 * which the queue and the reminders sit above.
 */
import { eq } from 'drizzle-orm';

import { settings } from '@/db/server/instruments';
import { users } from '@/db/server/schema';
import type { TimeZoneSetting } from '@/features/registry/schema';
import { timeZoneProblem } from '@/lib/dates';
import type { Db } from '@/server/db';
import { HttpError } from '@/server/http/errors';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { recordAudit } from '@/server/registry/audit';
import { defaultTimeZone, TIME_ZONE_KEY } from '@/server/schedule-due';

export function getTimeZoneSetting(db: Pick<Db, 'select'>): TimeZoneSetting {
  const row = db
    .select({ updatedAt: settings.updatedAt, updatedByName: users.name })
    .from(settings)
    .leftJoin(users, eq(users.id, settings.updatedBy))
    .where(eq(settings.key, TIME_ZONE_KEY))
    .get();
  return {
    zone: defaultTimeZone(db),
    updatedAt: row?.updatedAt ?? null,
    updatedByName: row?.updatedByName ?? null,
  };
}

export function setDefaultTimeZone(db: Db, userId: string, zone: string, now = new Date()): TimeZoneSetting {
  // The route's schema checks it too; this guard keeps scripts and other callers to the same rule.
  const problem = timeZoneProblem(zone);
  if (problem)
    throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
      { path: 'zone', message: problem },
    ]);
  return db.transaction((tx) => {
    const before = getTimeZoneSetting(tx);
    const at = now.toISOString();
    tx.insert(settings)
      .values({ key: TIME_ZONE_KEY, value: { zone }, updatedAt: at, updatedBy: userId })
      .onConflictDoUpdate({
        target: settings.key,
        set: { value: { zone }, updatedAt: at, updatedBy: userId },
      })
      .run();
    recordAudit(tx, {
      userId,
      entity: 'setting',
      entityId: TIME_ZONE_KEY,
      action: before.updatedAt === null ? 'create' : 'update',
      summary: `Default time zone for sites set to ${zone}`,
      before: { zone: before.zone },
      after: { zone },
    });
    // Sites without a zone of their own now count their days on this clock.
    if (before.zone !== zone) refreshQueue(tx, queueDay(db, now));
    return getTimeZoneSetting(tx);
  });
}
