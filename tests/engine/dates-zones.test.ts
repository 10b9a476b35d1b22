/**
 * lib/dates' time zones against published facts of the IANA tz database (tzdata, file `northamerica`
 * for the US rule since 2007: daylight time from 02:00 on the second Sunday in March to 02:00 on the first
 * Sunday in November, so in 2026 from 8 March to 1 November; file `australasia` for New Zealand: NZDT,
 * UTC+13, from 02:00 on the last Sunday in September to 03:00 on the first Sunday in April, so 5 April and
 * 27 September 2026; file `southamerica` for Chile: clocks go from 24:00 to 01:00 on the first Sunday in
 * September, so 6 September 2026 has no midnight in America/Santiago).
 */
import {
  dayInZone,
  formatDate,
  formatDateTime,
  formatWhen,
  hourInZone,
  isTimeZone,
  startOfDayInZone,
  timeZoneProblem,
  zoneOffsetLabel,
} from '@/lib/dates';

const LA = 'America/Los_Angeles';
const AKL = 'Pacific/Auckland';

describe('US daylight time 2026 (second Sunday in March, first Sunday in November)', () => {
  test('8 March 2026 starts at 08:00 UTC (PST, UTC−8) and is 23 hours long', () => {
    const start = startOfDayInZone('2026-03-08', LA);
    const next = startOfDayInZone('2026-03-09', LA);
    expect(start.toISOString()).toBe('2026-03-08T08:00:00.000Z');
    expect(next.toISOString()).toBe('2026-03-09T07:00:00.000Z'); // PDT, UTC−7
    expect((next.getTime() - start.getTime()) / 3_600_000).toBe(23);
  });

  test('1 November 2026 is 25 hours long (PDT back to PST)', () => {
    const start = startOfDayInZone('2026-11-01', LA);
    const next = startOfDayInZone('2026-11-02', LA);
    expect(start.toISOString()).toBe('2026-11-01T07:00:00.000Z');
    expect((next.getTime() - start.getTime()) / 3_600_000).toBe(25);
  });

  test('offsets either side of the change at 02:00 local, 8 March (10:00 UTC)', () => {
    expect(zoneOffsetLabel('2026-03-08T09:59:00Z', LA)).toBe('UTC−08:00');
    expect(zoneOffsetLabel('2026-03-08T10:00:00Z', LA)).toBe('UTC−07:00');
    // The local clock jumps from 01:59 to 03:00.
    expect(hourInZone('2026-03-08T09:59:00Z', LA)).toBe(1);
    expect(hourInZone('2026-03-08T10:00:00Z', LA)).toBe(3);
  });
});

describe('day boundaries far from UTC', () => {
  test('the Pacific coast rolls over at 08:00 UTC in winter, not at midnight UTC', () => {
    expect(dayInZone('2026-12-04T07:59:59Z', LA)).toBe('2026-12-03');
    expect(dayInZone('2026-12-04T08:00:00Z', LA)).toBe('2026-12-04');
  });

  test('Auckland (NZDT, UTC+13 in December) is a day ahead from 11:00 UTC', () => {
    expect(dayInZone('2026-12-03T10:59:59Z', AKL)).toBe('2026-12-03');
    expect(dayInZone('2026-12-03T11:00:00Z', AKL)).toBe('2026-12-04');
    expect(startOfDayInZone('2026-12-04', AKL).toISOString()).toBe('2026-12-03T11:00:00.000Z');
    // NZST (UTC+12) after the first Sunday in April: 5 April 2026 is 25 hours long.
    const len = startOfDayInZone('2026-04-06', AKL).getTime() - startOfDayInZone('2026-04-05', AKL).getTime();
    expect(len / 3_600_000).toBe(25);
  });

  test('a day whose midnight does not exist starts at 01:00 (Santiago, 6 September 2026)', () => {
    // 01:00 local at UTC−3 (the new offset) = 04:00 UTC.
    expect(startOfDayInZone('2026-09-06', 'America/Santiago').toISOString()).toBe('2026-09-06T04:00:00.000Z');
  });
});

describe('zone names', () => {
  test.each([
    ['Pacific/Auckland', true],
    ['America/Argentina/Buenos_Aires', true],
    ['UTC', true],
    ['Mars/Olympus_Mons', false],
    ['+02:00', false], // a fixed offset follows no daylight-saving rule
    ['', false],
  ])('%s is a zone: %s', (zone, known) => {
    expect(isTimeZone(zone)).toBe(known);
    expect(timeZoneProblem(zone) === null).toBe(known);
  });
});

describe('one date format and one date-time format', () => {
  test('a calendar date is never shifted; an instant is shown on the given clock', () => {
    expect(formatDate('2026-12-08')).toBe('8 Dec 2026');
    expect(formatDate('2026-12-03T03:56:55Z', LA)).toBe('2 Dec 2026');
    expect(formatDateTime('2026-12-03T03:56:55Z', LA)).toBe('2 Dec 2026, 19:56');
    expect(formatDateTime('2026-12-03T03:56:55Z', AKL)).toBe('3 Dec 2026, 16:56');
  });

  test('documents write the zone after the time', () => {
    expect(formatWhen('2026-12-03T03:56:55Z')).toBe('3 Dec 2026, 03:56 UTC');
    expect(formatWhen('2026-12-03T03:56:55Z', AKL)).toBe('3 Dec 2026, 16:56 Pacific/Auckland (UTC+13:00)');
    expect(formatWhen('2026-07-03T03:56:55Z', LA)).toBe('2 Jul 2026, 20:56 America/Los_Angeles (UTC−07:00)');
  });
});
