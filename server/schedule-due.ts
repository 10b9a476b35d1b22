/**
 * When a schedule falls due: the next due date and its due status, in TypeScript for one schedule and in
 * SQL for whole lists; and which day it is at a ride, in its site's time zone. The schedules service, the
 * reminders and the review queue's overdue rows all use them, so they sit below all three.
 *
 * A site's zone is `sites.time_zone`, else the inspection body's default (the `time_zone` setting), else
 * UTC. "Today" for a ride is the calendar date on its site's clock. Work over many rides takes a "clock":
 * an instant (ISO 8601), from which each zone's day is worked out (`zoneDays`), or, as before zones, a
 * plain YYYY-MM-DD that every ride shares (tests and callers that pin a day).
 */
import { eq, isNotNull, sql, type SQL } from 'drizzle-orm';

import { settings } from '@/db/server/instruments';
import { inspectionSchedules, rides, sites } from '@/db/server/schema';
import { dueStatusOn, dueWindowDays, inspectionTypes, type DueStatus } from '@/features/registry/schema';
import { addDays, dayInZone, FALLBACK_TIME_ZONE, isIsoDay, isTimeZone } from '@/lib/dates';
import type { Db } from '@/server/db';

type Reader = Pick<Db, 'select'>;

/** The settings key of the inspection body's default time zone (`{ zone }`). */
export const TIME_ZONE_KEY = 'time_zone';

/** The inspection body's default zone for sites that name none: the setting when valid, else UTC. */
export function defaultTimeZone(db: Reader): string {
  const row = db
    .select({ value: settings.value })
    .from(settings)
    .where(eq(settings.key, TIME_ZONE_KEY))
    .get();
  const zone = (row?.value as { zone?: unknown } | undefined)?.zone;
  return typeof zone === 'string' && isTimeZone(zone) ? zone : FALLBACK_TIME_ZONE;
}

/** A site's zone as stored (null = the default), resolved against the default. */
export const resolveZone = (zone: string | null | undefined, fallback: string) =>
  zone && isTimeZone(zone) ? zone : fallback;

/** The zone a ride's days are counted in: its site's, else the inspection body's default. */
export function rideTimeZone(db: Reader, rideId: string): string {
  const row = db
    .select({ zone: sites.timeZone })
    .from(rides)
    .leftJoin(sites, eq(sites.id, rides.siteId))
    .where(eq(rides.id, rideId))
    .get();
  return resolveZone(row?.zone, defaultTimeZone(db));
}

/**
 * In a select that joins `sites`: the site's zone, else the default (the setting, validated when written),
 * else UTC. Written out in full: drizzle drops table names from columns inside a select's sql.
 */
export const siteZoneSql = sql<string>`COALESCE("sites"."time_zone", (SELECT json_extract(st."value", '$.zone') FROM "settings" st WHERE st."key" = 'time_zone'), 'UTC')`;

/** The key under which `zoneDays` keeps the default zone's day (rides with no site, or a site with no zone). */
const DEFAULT_KEY = '*';

/**
 * Each zone's calendar day at `clock`, as the JSON object the SQL below reads: `{"*": day at the default,
 * "<zone>": day, …}` for every zone a site names; a plain YYYY-MM-DD clock gives `{"*": that day}`.
 * Keys are sorted, so equal days give equal text (the queue compares it to know when to rebuild).
 */
export function zoneDays(db: Reader | null, clock: string): string {
  if (isIsoDay(clock)) return JSON.stringify({ [DEFAULT_KEY]: clock });
  // Without a way to read the sites (a bare statement runner), every ride is on UTC's day.
  if (!db) return JSON.stringify({ [DEFAULT_KEY]: dayInZone(new Date(clock), FALLBACK_TIME_ZONE) });
  const at = new Date(clock);
  const fallback = defaultTimeZone(db);
  const zones = db
    .select({ zone: sites.timeZone })
    .from(sites)
    .where(isNotNull(sites.timeZone))
    .groupBy(sites.timeZone)
    .all()
    .map((r) => r.zone)
    .filter((z): z is string => z !== null && isTimeZone(z))
    .sort();
  const days: Record<string, string> = { [DEFAULT_KEY]: dayInZone(at, fallback) };
  for (const zone of zones) days[zone] = dayInZone(at, zone);
  return JSON.stringify(days);
}

/** The calendar day at one ride for a clock (an instant or a pinned day). */
export function rideDay(db: Reader, rideId: string, clock: string): string {
  return isIsoDay(clock) ? clock : dayInZone(new Date(clock), rideTimeZone(db, rideId));
}

/**
 * In SQL: today at the ride `rideId` names, from `days` (the JSON text of `zoneDays`): its site's zone's
 * day, else the default's.
 */
export const rideTodaySql = (days: SQL | string, rideId: SQL | { name: string }) =>
  sql<string>`COALESCE(json_extract(${days}, '$."' || (SELECT zs.time_zone FROM ${rides} zr JOIN ${sites} zs ON zs.id = zr.site_id WHERE zr.id = ${rideId}) || '"'), json_extract(${days}, '$."*"'))`;

/** The next due date: the explicit one, else last done + interval; null when neither gives one. */
export function nextDueOn(s: {
  dueOn: string | null;
  lastDoneOn: string | null;
  intervalDays: number | null;
}) {
  if (s.dueOn) return s.dueOn;
  if (s.lastDoneOn && s.intervalDays) return addDays(s.lastDoneOn, s.intervalDays);
  return null;
}

export const dueStatusOf = (
  type: keyof typeof dueWindowDays,
  next: string | null,
  today: string,
): DueStatus => dueStatusOn(type, next, today);

// The same two rules in SQL, for filtering and sorting whole lists in the database.
export const nextDueSql = sql`COALESCE(${inspectionSchedules.dueOn}, CASE WHEN ${inspectionSchedules.lastDoneOn} IS NOT NULL AND ${inspectionSchedules.intervalDays} IS NOT NULL THEN date(${inspectionSchedules.lastDoneOn}, '+' || ${inspectionSchedules.intervalDays} || ' days') END)`;
const windowSql = sql.raw(
  `CASE "inspection_schedules"."inspection_type" ${inspectionTypes.map((t) => `WHEN '${t}' THEN ${dueWindowDays[t]}`).join(' ')} END`,
);
/** The due status in SQL against `today`: a YYYY-MM-DD, or an expression such as `rideTodaySql`. */
export const dueStatusSql = (today: string | SQL) =>
  sql<DueStatus>`CASE WHEN ${nextDueSql} IS NULL THEN 'unscheduled' WHEN ${nextDueSql} < ${today} THEN 'overdue' WHEN ${nextDueSql} <= date(${today}, '+' || (${windowSql}) || ' days') THEN 'due' ELSE 'upcoming' END`;
