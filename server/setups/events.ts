/** Events at shared sites (a fair on a fairground): a site and a range of days (issue #19). */
import { asc, eq, gte } from 'drizzle-orm';

import { sites } from '@/db/server/schema';
import { siteEvents } from '@/db/server/setups';
import type { SiteEvent, SiteEventInput } from '@/features/registry/schema';
import type { Db } from '@/server/db';
import { HttpError } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { findSite } from '@/server/registry/sites';

function eventRows(db: Pick<Db, 'select'>) {
  return db
    .select({
      id: siteEvents.id,
      siteId: siteEvents.siteId,
      siteName: sites.name,
      name: siteEvents.name,
      fromDate: siteEvents.fromDate,
      toDate: siteEvents.toDate,
    })
    .from(siteEvents)
    .innerJoin(sites, eq(sites.id, siteEvents.siteId));
}

/** Events not over before `since` (YYYY-MM-DD), soonest first. */
export function listEvents(db: Pick<Db, 'select'>, since: string): SiteEvent[] {
  return eventRows(db)
    .where(gte(siteEvents.toDate, since))
    .orderBy(asc(siteEvents.fromDate), asc(siteEvents.name))
    .all();
}

export function createEvent(db: Db, userId: string, input: SiteEventInput, now: Date): SiteEvent {
  return db.transaction((tx) => {
    const site = findSite(tx, input.siteId);
    if (!site)
      throw new HttpError(400, 'validation_failed', 'No such site', [
        { path: 'siteId', message: 'No such site' },
      ]);
    const { id } = tx
      .insert(siteEvents)
      .values({ ...input, createdAt: now.toISOString() })
      .returning({ id: siteEvents.id })
      .get();
    const event = eventRows(tx).where(eq(siteEvents.id, id)).get() as SiteEvent;
    recordAudit(tx, {
      userId,
      entity: 'site_event',
      entityId: id,
      action: 'create',
      rideId: null,
      summary: `${input.name} at ${site.name} from ${input.fromDate} to ${input.toDate} added`,
      after: event,
    });
    return event;
  });
}
