/**
 * Dates in one place, pure. Two kinds of value travel through Pivotwatch: calendar dates ("ISO days",
 * YYYY-MM-DD, e.g. a due date) and instants (ISO 8601 UTC, e.g. when a record was submitted).
 * - ISO days and their arithmetic are UTC: the day of an instant is its UTC day, and a day plus n days
 *   never meets a daylight-saving change.
 * - The app shows dates in the person's own time zone (`formatDate`, `formatDateTime`).
 * - The server's documents (notices, e-mails, reports) have no reader's time zone, so they print in UTC
 *   and say so (`formatCalendarDate`, `formatWhen`). Their month words are fixed, where the app's come
 *   from the platform's locale data.
 */

/** One day in milliseconds (UTC days have no daylight-saving change). */
export const DAY_MS = 86_400_000;
const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

/** True for a YYYY-MM-DD string (its shape only; see `isRealIsoDay`). */
export const isIsoDay = (value: string) => ISO_DAY.test(value);

/** The UTC calendar date of an instant, YYYY-MM-DD. */
export const isoDay = (at: Date | string | number) => new Date(at).toISOString().slice(0, 10);

/** Today as a calendar date in this device's own time zone, to compare with due dates on screen. */
export function localDay(now = new Date()): string {
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

// ——— on screen ———

/** Dates as people read them here: 3 Mar 2025. Calendar dates (YYYY-MM-DD) are not shifted by time zone. */
export function formatDate(iso: string): string {
  const calendar = isIsoDay(iso);
  const d = new Date(calendar ? `${iso}T12:00:00Z` : iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleDateString('en-GB', {
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    ...(calendar ? { timeZone: 'UTC' } : {}),
  });
}

export function formatDateTime(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${formatDate(iso)}, ${d.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit' })}`;
}

/** An instant as the phone's own lists stamp it, to the second: "03/12/2026, 14:05:09" (local time). */
export const formatLocalStamp = (iso: string) => new Date(iso).toLocaleString('en-GB');

/** An instant in short, day and minute: "03/12/2026, 14:05" (local time). */
export const formatShortStamp = (iso: string) =>
  new Date(iso).toLocaleString('en-GB', { dateStyle: 'short', timeStyle: 'short' });

/** Today written out in full, as a heading says it: "Thursday 3 December 2026". */
export function longDate(date: Date = new Date()): string {
  return date.toLocaleDateString('en-GB', {
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
  });
}

/**
 * A chart's time-axis label (UTC, like the instants it plots): "3 Dec" while the axis spans under
 * 120 days, "Dec 26" beyond, so the labels stay short and still tell the ticks apart.
 */
export function formatAxisDate(ms: number, spanMs: number): string {
  const short = spanMs < 120 * DAY_MS;
  return new Date(ms).toLocaleDateString('en-GB', {
    day: short ? 'numeric' : undefined,
    month: 'short',
    year: short ? undefined : '2-digit',
    timeZone: 'UTC',
  });
}

// ——— in documents (UTC) ———

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "2026-03-20" → "20 Mar 2026": day, month word, year, which reads the same on both sides of the ocean. */
export function formatCalendarDate(date: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return date;
  return `${Number(m[3])} ${MONTHS[Number(m[2]) - 1] ?? m[2]} ${m[1]}`;
}

/** A calendar date as above; an instant as its date and time in UTC ("3 Dec 2026, 14:05 UTC"). */
export function formatWhen(value: string): string {
  if (isIsoDay(value)) return formatCalendarDate(value);
  const d = new Date(value);
  if (Number.isNaN(d.getTime())) return value;
  const iso = d.toISOString();
  return `${formatCalendarDate(iso.slice(0, 10))}, ${iso.slice(11, 16)} UTC`;
}

/** `formatWhen` without the time: the UTC date of an instant, or the calendar date itself. */
export const formatWhenDay = (value: string) => formatWhen(value).replace(/, \d{2}:\d{2} UTC$/, '');
