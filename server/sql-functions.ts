/**
 * SQLite functions the server's statements call, registered on every connection `openDb` opens. They are
 * deterministic, so SQLite may use them in indexes and constant folding.
 *
 * - `day_in_zone(at, zone, fallback)`: the calendar day (YYYY-MM-DD) of `at` on the clock of `zone`, else
 *   of `fallback` when `zone` is null or not a zone this platform knows, else UTC. A bare YYYY-MM-DD `at`
 *   is already a day and comes back as it is; null or unreadable text gives null. The review queue stores
 *   each item's day on its site's clock with it, so its From/To filters mean the site's days.
 */
import type Database from 'better-sqlite3';

import { FALLBACK_TIME_ZONE, isIsoDay, isTimeZone } from '@/lib/dates';

/** One formatter per zone ("en-CA" writes YYYY-MM-DD); building one costs far more than using it. */
const dayFormats = new Map<string, Intl.DateTimeFormat>();

function dayFormat(zone: string): Intl.DateTimeFormat {
  let f = dayFormats.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', {
      timeZone: zone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
    });
    if (dayFormats.size >= 1000) dayFormats.clear();
    dayFormats.set(zone, f);
  }
  return f;
}

const usable = (zone: unknown): zone is string => typeof zone === 'string' && isTimeZone(zone);

export function dayInZoneSql(at: unknown, zone: unknown, fallback: unknown): string | null {
  if (typeof at !== 'string') return null;
  if (isIsoDay(at)) return at;
  const ms = Date.parse(at);
  if (Number.isNaN(ms)) return null;
  const z = usable(zone) ? zone : usable(fallback) ? fallback : FALLBACK_TIME_ZONE;
  return dayFormat(z).format(ms);
}

export function registerSqlFunctions(sqlite: Database.Database): void {
  sqlite.function('day_in_zone', { deterministic: true, varargs: false }, (at, zone, fallback) =>
    dayInZoneSql(at, zone, fallback),
  );
}
