import { zoneOffsetLabel } from '@/lib/dates';

export type ZoneOption = { value: string; label: string; hint?: string };

/**
 * The IANA zones this platform's Intl knows (`Intl.supportedValuesOf('timeZone')`), with UTC first (the
 * list leaves it out) and `keep` added when it is not among them: a zone saved before, or one another
 * platform knows, is shown as it is and never silently replaced. Without the Intl call (an older engine)
 * the list is UTC and `keep` only; the server still checks whatever is saved.
 */
export function timeZoneNames(keep?: string | null): string[] {
  let listed: string[] = [];
  try {
    listed = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  } catch {
    listed = [];
  }
  const names = ['UTC', ...listed.filter((z) => z !== 'UTC')];
  if (keep && !names.includes(keep)) names.unshift(keep);
  return names;
}

/** The zones as choices, each with its offset from UTC now ("UTC−08:00"), so a city need not be known. */
export function timeZoneOptions(keep?: string | null, at: Date = new Date()): ZoneOption[] {
  return timeZoneNames(keep).map((zone) => {
    let offset = '';
    try {
      offset = zone === 'UTC' ? '' : zoneOffsetLabel(at, zone);
    } catch {
      offset = '';
    }
    return { value: zone, label: zone, ...(offset ? { hint: offset } : {}) };
  });
}
