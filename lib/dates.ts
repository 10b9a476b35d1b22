/**
 * Dates in one place, pure. Two kinds of value travel through Pivotwatch: calendar dates ("ISO days",
 * YYYY-MM-DD, e.g. a due date) and instants (ISO 8601 UTC, e.g. when a record was submitted).
 * - ISO days and their arithmetic carry no time zone: a day plus n days never meets a daylight-saving change.
 * - Which day it is depends on where: each site has an IANA time zone (else the inspection body's default),
 *   and "today", due and overdue, the reminder hour and every time shown are taken in it (`dayInZone`,
 *   `hourInZone`, `startOfDayInZone`), through date-fns and @date-fns/tz, which read the platform's tz data.
 * - One date format ("3 Dec 2026", `formatDate`) and one date-time format ("3 Dec 2026, 14:05",
 *   `formatDateTime`) everywhere, with fixed English month words whatever the platform's locale. Where the
 *   reader may be elsewhere (notices, PDFs, e-mails, audit) the zone is written after the time (`formatWhen`).
 */
import { tz, tzOffset } from '@date-fns/tz';
// The function's own module: the package index would put all of date-fns (45 KB) in the entry bundle.
import { format } from 'date-fns/format';

/** One day in milliseconds (UTC days have no daylight-saving change). */
export const DAY_MS = 86_400_000;
const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

/** True for a YYYY-MM-DD string (its shape only; see `isRealIsoDay`). */
export const isIsoDay = (value: string) => ISO_DAY.test(value);

/** The UTC calendar date of an instant, YYYY-MM-DD. */
export const isoDay = (at: Date | string | number) => new Date(at).toISOString().slice(0, 10);

/** Today as a calendar date in this device's own time zone (or in `zone` when given). */
export function localDay(now = new Date(), zone?: string | null): string {
  if (zone) return dayInZone(now, zone);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

/** A YYYY-MM-DD that names a day that exists (not 2026-02-30). */
export function isRealIsoDay(value: string): boolean {
  const d = new Date(`${value}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && isoDay(d) === value;
}

/** A calendar date moved by whole days. */
export const addDays = (day: string, days: number) => isoDay(Date.parse(`${day}T00:00:00Z`) + days * DAY_MS);

/** Whole days from one calendar date to another (negative when `to` is earlier). */
export const daysBetween = (from: string, to: string) =>
  Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);

// ——— time zones ———

/** The zone a site falls back to when neither it nor the inspection body names one. */
export const FALLBACK_TIME_ZONE = 'UTC';

// An IANA name: Area/Location (with sub-locations), or one of the bare names the database keeps (UTC).
const ZONE_NAME = /^[A-Za-z][A-Za-z0-9_+-]*(\/[A-Za-z0-9_+-]+)*$/;

/** isTimeZone's answers by name (bounded: names come from stored settings and requests). */
const zoneAnswers = new Map<string, boolean>();

/**
 * True for an IANA time zone name this platform's Intl knows ("Pacific/Auckland", "UTC"). Offsets such as
 * "+02:00" are refused: a fixed offset never follows a site's daylight-saving rules.
 */
export function isTimeZone(zone: string): boolean {
  // Building a formatter to ask costs about a third of a millisecond, and the server asks for every site
  // zone on each review-queue refresh (a push's): the answer for a name never changes, so it is kept.
  const known = zoneAnswers.get(zone);
  if (known !== undefined) return known;
  let answer = ZONE_NAME.test(zone);
  if (answer)
    try {
      new Intl.DateTimeFormat('en-GB', { timeZone: zone });
    } catch {
      answer = false;
    }
  if (zoneAnswers.size >= 1000) zoneAnswers.clear();
  zoneAnswers.set(zone, answer);
  return answer;
}

/** Why a zone is refused, in words for a form or an API error; null when it is a zone Intl knows. */
export function timeZoneProblem(zone: string): string | null {
  return isTimeZone(zone)
    ? null
    : `"${zone}" is not a time zone this system knows. Use an IANA name such as Europe/London, ` +
        'America/Los_Angeles or Pacific/Auckland.';
}

/** This device's own zone (the browser's or the phone's setting). */
export function deviceTimeZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || FALLBACK_TIME_ZONE;
  } catch {
    return FALLBACK_TIME_ZONE;
  }
}

/** Every zone the platform lists, for pickers (the fallback and the device's zone at least). */
export function knownTimeZones(): string[] {
  const listed = (Intl as { supportedValuesOf?: (key: string) => string[] }).supportedValuesOf?.('timeZone');
  return [...new Set([FALLBACK_TIME_ZONE, ...(listed ?? [deviceTimeZone()])])].sort();
}

const zoneOr = (zone: string | null | undefined) => (zone && isTimeZone(zone) ? zone : deviceTimeZone());

/** The calendar date of an instant in a zone, YYYY-MM-DD. */
export const dayInZone = (at: Date | string | number, zone: string) =>
  format(new Date(at), 'yyyy-MM-dd', { in: tz(zone) });

/** The hour (0–23) on a clock in the zone at an instant. */
export const hourInZone = (at: Date | string | number, zone: string) =>
  Number(format(new Date(at), 'H', { in: tz(zone) }));

/**
 * The instant a calendar day begins in a zone (its first moment: midnight, or the first minute after a
 * daylight-saving gap that swallows midnight).
 */
export function startOfDayInZone(day: string, zone: string): Date {
  const [y, m, d] = day.split('-').map(Number);
  // Midnight local = midnight UTC minus the zone's offset then; the offset is read twice so a change on
  // that day (the offset at UTC midnight differs from the one at local midnight) lands right.
  const utcMidnight = Date.UTC(y, m - 1, d);
  const first = utcMidnight - tzOffset(zone, new Date(utcMidnight)) * 60_000;
  const second = utcMidnight - tzOffset(zone, new Date(first)) * 60_000;
  return new Date(dayInZone(second, zone) === day ? second : first);
}

/** An instant as a wall-clock stamp on the zone's clock, "YYYY-MM-DDTHH:MM" (what a person types). */
export const localStampInZone = (at: Date | string | number, zone: string) =>
  format(new Date(at), "yyyy-MM-dd'T'HH:mm", { in: tz(zone) });

/**
 * The instant a wall-clock stamp ("YYYY-MM-DDTHH:MM") names on the zone's clock. A time that a
 * daylight-saving change skips is taken at the offset before the change; a repeated hour, its first time.
 */
export function instantOfLocalStamp(stamp: string, zone: string): Date {
  const [day, time] = stamp.split('T');
  const [y, m, d] = day.split('-').map(Number);
  const [hh, mm] = time.split(':').map(Number);
  const asUtc = Date.UTC(y, m - 1, d, hh, mm);
  const first = asUtc - tzOffset(zone, new Date(asUtc)) * 60_000;
  const second = asUtc - tzOffset(zone, new Date(first)) * 60_000;
  return new Date(localStampInZone(second, zone) === stamp ? second : first);
}

/** The zone's offset from UTC at an instant, as "UTC+13:00" / "UTC−08:00" (a true minus sign). */
export function zoneOffsetLabel(at: Date | string | number, zone: string): string {
  const minutes = tzOffset(zone, new Date(at));
  const sign = minutes < 0 ? '−' : '+';
  const abs = Math.abs(minutes);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `UTC${sign}${pad(Math.floor(abs / 60))}:${pad(abs % 60)}`;
}

// ——— the one date and one date-time format ———

const DATE = 'd MMM yyyy';
const TIME = 'HH:mm';

/**
 * A date as people read it here: "3 Dec 2026". A calendar date (YYYY-MM-DD) is not shifted; an instant
 * shows its day in `zone` (the site's), else the device's own zone. Anything unreadable comes back as given.
 */
export function formatDate(value: string, zone?: string | null): string {
  if (isIsoDay(value)) {
    return isRealIsoDay(value) ? format(new Date(`${value}T12:00:00Z`), DATE, { in: tz('UTC') }) : value;
  }
  const d = new Date(value);
  if (Number.isNaN(d.getTime())) return value;
  return format(d, DATE, { in: tz(zoneOr(zone)) });
}

/** An instant as a date and a 24-hour time in `zone` (else the device's zone): "3 Dec 2026, 14:05". */
export function formatDateTime(value: string, zone?: string | null): string {
  if (isIsoDay(value)) return formatDate(value);
  const d = new Date(value);
  if (Number.isNaN(d.getTime())) return value;
  return format(d, `${DATE}, ${TIME}`, { in: tz(zoneOr(zone)) });
}

/** The same format for the phone's own lists (drafts, sent records), in the device's zone. */
export const formatLocalStamp = (iso: string) => formatDateTime(iso);

/** The same format again; kept for screens that asked for a short stamp. */
export const formatShortStamp = (iso: string) => formatDateTime(iso);

/** A day written out in full, as a heading says it: "Thursday 3 December 2026" (in `zone` when given). */
export function longDate(date: Date = new Date(), zone?: string | null): string {
  return format(date, 'EEEE d MMMM yyyy', { in: tz(zoneOr(zone)) });
}

/**
 * A chart's time-axis label (UTC, like the instants it plots): "3 Dec" while the axis spans under
 * 120 days, "Dec 26" beyond, so the labels stay short and still tell the ticks apart.
 */
export function formatAxisDate(ms: number, spanMs: number): string {
  return format(new Date(ms), spanMs < 120 * DAY_MS ? 'd MMM' : 'MMM yy', { in: tz('UTC') });
}

// ——— with the zone written out (documents, audit) ———

/** "2026-03-20" → "20 Mar 2026", the one date format, for a calendar date. */
export const formatCalendarDate = (date: string) => formatDate(date);

/**
 * A calendar date as above; an instant as its date and time in `zone` followed by the zone, so a reader
 * elsewhere knows which clock: "3 Dec 2026, 14:05 UTC", "3 Dec 2026, 06:05 America/Los_Angeles (UTC−08:00)".
 */
export function formatWhen(value: string, zone: string = FALLBACK_TIME_ZONE): string {
  if (isIsoDay(value)) return formatCalendarDate(value);
  const d = new Date(value);
  if (Number.isNaN(d.getTime())) return value;
  const z = isTimeZone(zone) ? zone : FALLBACK_TIME_ZONE;
  return `${formatDateTime(value, z)} ${zoneLabel(d, z)}`;
}

/** The zone as `formatWhen` writes it: "UTC", or "Pacific/Auckland (UTC+13:00)" at that instant. */
export function zoneLabel(at: Date | string | number, zone: string): string {
  return zone === 'UTC' || zone === 'Etc/UTC' ? 'UTC' : `${zone} (${zoneOffsetLabel(at, zone)})`;
}

/** `formatWhen` without the time: the day of an instant in `zone`, or the calendar date itself. */
export function formatWhenDay(value: string, zone: string = FALLBACK_TIME_ZONE): string {
  if (isIsoDay(value)) return formatCalendarDate(value);
  const d = new Date(value);
  if (Number.isNaN(d.getTime())) return value;
  return formatDate(value, isTimeZone(zone) ? zone : FALLBACK_TIME_ZONE);
}
