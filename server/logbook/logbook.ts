/**
 * One ride's logbook for one viewer: the ride (404 for an operator's request about another company's
 * ride, as everywhere), every source the viewer may see asked with the date range, then merged newest
 * first and filtered by text (features/logbook/merge.ts).
 */
import {
  logbookKinds,
  type LogbookEvent,
  type LogbookFilter,
  type LogbookPage,
  type LogbookRide,
} from '@/features/logbook/schema';
import { mergeLogbook, pageOf } from '@/features/logbook';
import type { SessionUser } from '@/features/session/schema';
import { addDays, startOfDayInZone } from '@/lib/dates';
import { companyScope } from '@/server/auth/scope';
import { logbookSources } from '@/server/logbook/sources';
import type { Reader, SourceQuery } from '@/server/logbook/source';
import { mustFindRide } from '@/server/registry/rides';
import { rideTimeZone } from '@/server/schedule-due';

export type LogbookRead = { ride: LogbookRide; events: LogbookEvent[] };

/** Every entry the viewer may see that the filter keeps, newest first (the exports take them all). */
export function readLogbook(
  db: Reader,
  viewer: SessionUser,
  rideId: string,
  filter: LogbookFilter,
): LogbookRead {
  const found = mustFindRide(db, rideId, companyScope(viewer));
  const zone = rideTimeZone(db, found.id);
  const ride: LogbookRide = {
    id: found.id,
    name: found.name,
    siteName: found.siteName,
    operatorName: found.operatorName,
    timeZone: zone,
  };
  const q: SourceQuery = {
    rideId: found.id,
    zone,
    viewer,
    // Site days to instants: from the start of `from` to the start of the day after `to`, on the site's clock.
    fromAt: filter.from ? startOfDayInZone(filter.from, zone).toISOString() : undefined,
    beforeAt: filter.to ? startOfDayInZone(addDays(filter.to, 1), zone).toISOString() : undefined,
  };
  const kinds = new Set(filter.kinds?.length ? filter.kinds : logbookKinds);
  const lists = logbookSources
    .filter((s) => kinds.has(s.kind) && s.shownTo(viewer))
    .map((s) => s.read(db, q));
  return { ride, events: mergeLogbook(lists, filter.q) };
}

export function logbookPage(
  db: Reader,
  viewer: SessionUser,
  rideId: string,
  query: LogbookFilter & { page: number },
  pageSize: number,
): LogbookPage {
  const { page, ...filter } = query;
  const { ride, events } = readLogbook(db, viewer, rideId, filter);
  const { items, total } = pageOf(events, page, pageSize);
  return { ride, events: items, total, page, pageSize };
}
