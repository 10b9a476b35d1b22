/**
 * The time-zone pick-list (features/registry/time-zone-options.ts) against ECMA-402's
 * `Intl.supportedValuesOf('timeZone')` (the canonical IANA names this runtime knows) and the IANA
 * database's offsets: America/Los_Angeles is UTC−08:00 in January and UTC−07:00 in July (Pacific time,
 * daylight saving from the second Sunday of March), Pacific/Auckland UTC+13:00 in January (NZDT).
 */
import { timeZoneNames, timeZoneOptions } from '@/features/registry/time-zone-options';

test('every zone the runtime knows, UTC first, each once', () => {
  const names = timeZoneNames();
  expect(names[0]).toBe('UTC');
  expect(new Set(names).size).toBe(names.length);
  expect(names.slice(1).sort()).toEqual(
    Intl.supportedValuesOf('timeZone')
      .filter((z) => z !== 'UTC')
      .sort(),
  );
});

test('a saved zone not in the list is kept, first, and a listed one is not doubled', () => {
  // "US/Pacific" is an IANA backward-compatible alias: Intl accepts it but does not list it.
  expect(Intl.supportedValuesOf('timeZone')).not.toContain('US/Pacific');
  const kept = timeZoneNames('US/Pacific');
  expect(kept[0]).toBe('US/Pacific');
  expect(timeZoneNames('Europe/London').filter((z) => z === 'Europe/London')).toHaveLength(1);
});

test('each choice shows its offset from UTC at the given instant', () => {
  const hint = (zone: string, at: string) =>
    timeZoneOptions(null, new Date(at)).find((o) => o.value === zone)?.hint;
  expect(hint('America/Los_Angeles', '2026-01-15T12:00:00Z')).toBe('UTC−08:00');
  expect(hint('America/Los_Angeles', '2026-07-15T12:00:00Z')).toBe('UTC−07:00');
  expect(hint('Pacific/Auckland', '2026-01-15T12:00:00Z')).toBe('UTC+13:00');
  expect(hint('UTC', '2026-01-15T12:00:00Z')).toBeUndefined();
});
