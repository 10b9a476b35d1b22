/**
 * lib/dates against the calendar itself: the Gregorian leap-year rule (a year divisible by 4 is a leap
 * year, except centuries, except centuries divisible by 400 — ISO 8601 uses the proleptic Gregorian
 * calendar), day counts from the Unix epoch, and the documents' UTC wording for instants given with an
 * offset (RFC 3339 §5.6 / ISO 8601 offsets).
 */
import {
  addDays,
  daysBetween,
  formatCalendarDate,
  formatWhen,
  formatWhenDay,
  isIsoDay,
  isoDay,
  isRealIsoDay,
  localDay,
} from '@/lib/dates';

describe('ISO days', () => {
  test('the UTC day of an instant, whatever offset it was written with', () => {
    expect(isoDay(new Date(Date.UTC(2026, 11, 3, 23, 59, 59)))).toBe('2026-12-03');
    // 01:30 at +02:00 is 23:30 UTC the day before.
    expect(isoDay('2026-12-03T01:30:00+02:00')).toBe('2026-12-02');
    expect(isoDay(0)).toBe('1970-01-01');
  });

  test('the device-local day is built from local fields (not the UTC day)', () => {
    const d = new Date(2026, 0, 9, 0, 5); // local midnight-ish, 9 Jan 2026
    expect(localDay(d)).toBe('2026-01-09');
  });

  test.each([
    ['2024-02-29', true], // 2024 divisible by 4
    ['2023-02-29', false],
    ['2000-02-29', true], // century divisible by 400
    ['1900-02-29', false], // century not divisible by 400
    ['2026-04-31', false], // April has 30 days
    ['2026-12-31', true],
  ])('%s is a real day: %s (Gregorian leap-year rule)', (day, real) => {
    expect(isIsoDay(day)).toBe(true);
    expect(isRealIsoDay(day)).toBe(real);
  });

  test('shape only: a date-time is not an ISO day', () => {
    expect(isIsoDay('2026-12-03T00:00:00Z')).toBe(false);
  });
});

describe('day arithmetic', () => {
  test('adding days crosses month, leap-day and year ends', () => {
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29');
    expect(addDays('2023-02-28', 1)).toBe('2023-03-01');
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
  });

  test('days between: 2024-01-01 is day 19 723 after the Unix epoch (54 × 365 + 13 leap days, 1972–2020)', () => {
    expect(daysBetween('1970-01-01', '2024-01-01')).toBe(54 * 365 + 13);
    expect(addDays('1970-01-01', 19_723)).toBe('2024-01-01');
  });

  test('a leap year has 366 days, a common year 365; negative when the second day is earlier', () => {
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366);
    expect(daysBetween('2025-01-01', '2026-01-01')).toBe(365);
    expect(daysBetween('2026-03-10', '2026-03-03')).toBe(-7);
  });

  test('a daylight-saving change is still a whole day (UTC days; EU clocks went forward 29 Mar 2026)', () => {
    expect(daysBetween('2026-03-28', '2026-03-30')).toBe(2);
    expect(addDays('2026-03-28', 2)).toBe('2026-03-30');
  });
});

describe('dates in documents (UTC, fixed month words)', () => {
  test('a calendar date reads day, month word, year', () => {
    expect(formatCalendarDate('2026-03-20')).toBe('20 Mar 2026');
    expect(formatCalendarDate('2026-09-05')).toBe('5 Sep 2026');
    expect(formatCalendarDate('not a date')).toBe('not a date');
  });

  test('an instant reads its UTC date and time and says UTC', () => {
    expect(formatWhen('2026-12-03T14:05:09.000Z')).toBe('3 Dec 2026, 14:05 UTC');
    expect(formatWhen('2026-12-03T01:30:00+02:00')).toBe('2 Dec 2026, 23:30 UTC');
    expect(formatWhen('2026-12-03')).toBe('3 Dec 2026');
    expect(formatWhen('whenever')).toBe('whenever');
  });

  test('the day alone of an instant or a calendar date', () => {
    expect(formatWhenDay('2026-12-03T01:30:00+02:00')).toBe('2 Dec 2026');
    expect(formatWhenDay('2026-12-03')).toBe('3 Dec 2026');
  });
});
