import { and, asc, count, eq, or, sql } from 'drizzle-orm';
import type { z } from 'zod';

import { companies, rides, sites } from '@/db/server/schema';
import { setups, siteEvents } from '@/db/server/setups';
import type { Site, SiteInput } from '@/features/registry/schema';
import { siteListQuerySchema, sitePatchSchema } from '@/features/registry/schema';
import type { Db } from '@/server/db';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { assertOperatorCompany } from '@/server/registry/companies';
import { contains, offsetOf, orderBy } from '@/server/registry/query';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { siteZoneSql } from '@/server/schedule-due';

type ListQuery = z.output<typeof siteListQuerySchema>;
type Patch = z.output<typeof sitePatchSchema>;

const siteColumns = {
  id: sites.id,
  name: sites.name,
  kind: sites.kind,
  address: sites.address,
  locality: sites.locality,
  timeZone: sites.timeZone,
  // The site's zone, else the inspection body's default (server/schedule-due.ts), else UTC.
  effectiveTimeZone: siteZoneSql,
  operatorCompanyId: sites.operatorCompanyId,
  operatorName: companies.name,
  createdAt: sites.createdAt,
  // Written out in full: drizzle drops the table name from columns inside a select's sql.
  rideCount: sql<number>`(SELECT count(*) FROM "rides" r WHERE r."site_id" = "sites"."id")`,
};

function siteQuery(db: Pick<Db, 'select'>) {
  return db.select(siteColumns).from(sites).innerJoin(companies, eq(companies.id, sites.operatorCompanyId));
}

export function listSites(db: Db, query: ListQuery) {
  const where = and(
    query.operatorId ? eq(sites.operatorCompanyId, query.operatorId) : undefined,
    query.kind ? eq(sites.kind, query.kind) : undefined,
    query.q
      ? or(
          contains(sites.name, query.q),
          contains(sites.locality, query.q),
          contains(sites.address, query.q),
          contains(companies.name, query.q),
        )
      : undefined,
  );
  const total =
    db
      .select({ n: count() })
      .from(sites)
      .innerJoin(companies, eq(companies.id, sites.operatorCompanyId))
      .where(where)
      .get()?.n ?? 0;
  const rows = siteQuery(db)
    .where(where)
    .orderBy(
      ...orderBy(
        query.sort,
        { name: sites.name, kind: sites.kind, operator: companies.name, locality: sites.locality },
        [asc(sites.name)],
        [sites.id],
      ),
    )
    .limit(query.pageSize)
    .offset(offsetOf(query))
    .all();
  return { sites: rows, total, page: query.page, pageSize: query.pageSize };
}

export function findSite(db: Pick<Db, 'select'>, id: string): Site | null {
  return siteQuery(db).where(eq(sites.id, id)).get() ?? null;
}

function mustFindSite(db: Pick<Db, 'select'>, id: string): Site {
  const site = findSite(db, id);
  if (!site) throw notFound('No such site.');
  return site;
}

export function createSite(db: Db, userId: string, input: SiteInput): Site {
  return db.transaction((tx) => {
    assertOperatorCompany(tx, input.operatorCompanyId);
    const { id } = tx
      .insert(sites)
      .values({
        name: input.name,
        kind: input.kind,
        address: input.address ?? null,
        locality: input.locality ?? null,
        timeZone: input.timeZone ?? null,
        operatorCompanyId: input.operatorCompanyId,
      })
      .returning({ id: sites.id })
      .get();
    const site = mustFindSite(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'site',
      entityId: id,
      action: 'create',
      summary: `Site ${site.name} added`,
      after: site,
    });
    return site;
  });
}

export function updateSite(db: Db, userId: string, id: string, patch: Patch): Site {
  return db.transaction((tx) => {
    const before = mustFindSite(tx, id);
    if (patch.operatorCompanyId !== undefined) assertOperatorCompany(tx, patch.operatorCompanyId);
    tx.update(sites)
      .set({
        ...(patch.name !== undefined && { name: patch.name }),
        ...(patch.kind !== undefined && { kind: patch.kind }),
        ...(patch.address !== undefined && { address: patch.address }),
        ...(patch.locality !== undefined && { locality: patch.locality }),
        ...(patch.timeZone !== undefined && { timeZone: patch.timeZone }),
        ...(patch.operatorCompanyId !== undefined && { operatorCompanyId: patch.operatorCompanyId }),
      })
      .where(eq(sites.id, id))
      .run();
    const after = mustFindSite(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'site',
      entityId: id,
      action: 'update',
      summary: `Site ${after.name} changed`,
      before,
      after,
    });
    // The review queue shows (and searches) the site's name on each of its rides' items.
    // A new zone moves the day its rides' overdue items are judged on.
    if (after.name !== before.name || after.effectiveTimeZone !== before.effectiveTimeZone)
      refreshQueue(tx, queueDay(db), ridesOfSite(tx, id));
    return after;
  });
}

const ridesOfSite = (db: Pick<Db, 'select'>, siteId: string) =>
  db
    .select({ id: rides.id })
    .from(rides)
    .where(eq(rides.siteId, siteId))
    .all()
    .map((r) => r.id);

/** A site with rides on it stays: move the rides (or clear their site) first. */
export function deleteSite(db: Db, userId: string, id: string): void {
  db.transaction((tx) => {
    const before = mustFindSite(tx, id);
    if (before.rideCount > 0)
      throw conflict(
        `${before.name} still has ${before.rideCount} ride(s). Move them to another site first.`,
        'in_use',
      );
    // A travelling ride's history names the site: its set-ups and events stay, and so does the site.
    const history =
      (tx.select({ n: count() }).from(setups).where(eq(setups.siteId, id)).get()?.n ?? 0) +
      (tx.select({ n: count() }).from(siteEvents).where(eq(siteEvents.siteId, id)).get()?.n ?? 0);
    if (history > 0)
      throw conflict(
        `${before.name} has ${history} set-up(s) or event(s) on record; it stays in the register.`,
        'in_use',
      );
    tx.delete(sites).where(eq(sites.id, id)).run();
    recordAudit(tx, {
      userId,
      entity: 'site',
      entityId: id,
      action: 'delete',
      summary: `Site ${before.name} removed`,
      before,
    });
  });
}

/** 400 naming `siteId` unless the site exists. */
export function assertSite(db: Pick<Db, 'select'>, id: string): void {
  const row = db.select({ id: sites.id }).from(sites).where(eq(sites.id, id)).get();
  if (!row)
    throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
      { path: 'siteId', message: 'No site with this id' },
    ]);
}
