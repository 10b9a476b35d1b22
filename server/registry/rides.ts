import { and, asc, count, eq, inArray, or, type SQL } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { notices } from '@/db/server/notices';
import { companies, designVersions, inspectionSchedules, rides, sites } from '@/db/server/schema';
import { setups } from '@/db/server/setups';
import type { RideInput, RideListQuery } from '@/features/registry/schema';
import type { RideSummary } from '@/features/rides/schema';
import type { Db } from '@/server/db';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { assertOperatorCompany } from '@/server/registry/companies';
import { contains, offsetOf, orderBy } from '@/server/registry/query';
import { assertSite } from '@/server/registry/sites';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { siteZoneSql } from '@/server/schedule-due';

const rideListColumns = {
  id: rides.id,
  name: rides.name,
  rideClass: rides.rideClass,
  description: rides.description,
  maker: rides.maker,
  model: rides.model,
  serial: rides.serial,
  year: rides.year,
  status: rides.status,
  statusReason: rides.statusReason,
  statusSince: rides.statusSince,
  siteId: rides.siteId,
  siteName: sites.name,
  // The site's zone, else the inspection body's default (server/schedule-due.ts), else UTC.
  siteTimeZone: siteZoneSql,
  operatorCompanyId: rides.operatorCompanyId,
  operatorName: companies.name,
};

function rideQuery(db: Pick<Db, 'select'>) {
  return db
    .select(rideListColumns)
    .from(rides)
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .leftJoin(sites, eq(sites.id, rides.siteId));
}

const sortColumns = {
  name: rides.name,
  status: rides.status,
  rideClass: rides.rideClass,
  operator: companies.name,
  site: sites.name,
  maker: rides.maker,
  year: rides.year,
  statusSince: rides.statusSince,
};

/**
 * One page of rides with their site and operator names, filtered, searched and sorted in SQL. `scope`
 * (an operator's company) is applied before anything else, so no filter can reach past it.
 */
export function listRides(db: Db, scope: string | null, query: RideListQuery) {
  const conditions: (SQL | undefined)[] = [
    scope === null ? undefined : eq(rides.operatorCompanyId, scope),
    query.status?.length ? inArray(rides.status, query.status) : undefined,
    query.rideClass?.length ? inArray(rides.rideClass, query.rideClass) : undefined,
    query.siteId ? eq(rides.siteId, query.siteId) : undefined,
    query.operatorId ? eq(rides.operatorCompanyId, query.operatorId) : undefined,
    query.q
      ? or(
          contains(rides.name, query.q),
          contains(rides.maker, query.q),
          contains(rides.model, query.q),
          contains(rides.serial, query.q),
          contains(rides.description, query.q),
          contains(sites.name, query.q),
          contains(companies.name, query.q),
        )
      : undefined,
  ];
  const where = and(...conditions);
  const total =
    db
      .select({ n: count() })
      .from(rides)
      .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
      .leftJoin(sites, eq(sites.id, rides.siteId))
      .where(where)
      .get()?.n ?? 0;
  const rows = rideQuery(db)
    .where(where)
    .orderBy(
      ...orderBy(query.sort, sortColumns, [asc(companies.name), asc(rides.name)], [rides.name, rides.id]),
    )
    .limit(query.pageSize)
    .offset(offsetOf(query))
    .all();
  return { rides: rows, total, page: query.page, pageSize: query.pageSize };
}

/**
 * One ride in the list shape, or null when it does not exist or lies outside `scope`: callers answer
 * both with the same 404, so an operator cannot learn that another company's ride exists.
 */
export function findRide(db: Pick<Db, 'select'>, id: string, scope: string | null): RideSummary | null {
  return (
    rideQuery(db)
      .where(scope === null ? eq(rides.id, id) : and(eq(rides.id, id), eq(rides.operatorCompanyId, scope)))
      .get() ?? null
  );
}

export function mustFindRide(db: Pick<Db, 'select'>, id: string, scope: string | null = null): RideSummary {
  const ride = findRide(db, id, scope);
  if (!ride) throw notFound('No such ride.');
  return ride;
}

/** The status rule on the ride as it would be stored: out of plain service needs a reason. */
export function statusFields(
  status: RideSummary['status'],
  reason: string | null,
  since: string,
): { status: RideSummary['status']; statusReason: string | null; statusSince: string } {
  if (status === 'in_service') return { status, statusReason: null, statusSince: since };
  if (!reason)
    throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
      { path: 'statusReason', message: 'Say why the ride is restricted or out of service' },
    ]);
  return { status, statusReason: reason, statusSince: since };
}

export function createRide(db: Db, userId: string, input: RideInput, now: Date): RideSummary {
  return db.transaction((tx) => {
    assertOperatorCompany(tx, input.operatorCompanyId);
    if (input.siteId) assertSite(tx, input.siteId);
    const { id } = tx
      .insert(rides)
      .values({
        name: input.name,
        rideClass: input.rideClass,
        description: input.description ?? null,
        maker: input.maker ?? null,
        model: input.model ?? null,
        serial: input.serial ?? null,
        year: input.year ?? null,
        siteId: input.siteId ?? null,
        operatorCompanyId: input.operatorCompanyId,
        ...statusFields(
          input.status ?? 'in_service',
          input.statusReason ?? null,
          input.statusSince ?? now.toISOString(),
        ),
      })
      .returning({ id: rides.id })
      .get();
    const ride = mustFindRide(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'ride',
      entityId: id,
      action: 'create',
      rideId: id,
      summary: `Ride ${ride.name} added`,
      after: ride,
    });
    refreshQueue(tx, queueDay(db, now), [id]);
    return ride;
  });
}

/** Extra checks a ride must pass before deletion; other modules (schedules…) add theirs. */
export type RideDeleteGuard = (db: Pick<Db, 'select'>, rideId: string) => string | null;

const hasDesignData: RideDeleteGuard = (db, rideId) => {
  const n =
    db.select({ n: count() }).from(designVersions).where(eq(designVersions.rideId, rideId)).get()?.n ?? 0;
  return n > 0 ? `${n} design data version(s), kept so old results can be reproduced` : null;
};

const hasSchedules: RideDeleteGuard = (db, rideId) => {
  const n =
    db.select({ n: count() }).from(inspectionSchedules).where(eq(inspectionSchedules.rideId, rideId)).get()
      ?.n ?? 0;
  return n > 0 ? `${n} inspection schedule(s)` : null;
};

const hasInspections: RideDeleteGuard = (db, rideId) => {
  const n = db.select({ n: count() }).from(inspections).where(eq(inspections.rideId, rideId)).get()?.n ?? 0;
  return n > 0 ? `${n} inspection(s) on record` : null;
};

const hasSetups: RideDeleteGuard = (db, rideId) => {
  const n = db.select({ n: count() }).from(setups).where(eq(setups.rideId, rideId)).get()?.n ?? 0;
  return n > 0 ? `${n} set-up(s) on record` : null;
};

const hasNotices: RideDeleteGuard = (db, rideId) => {
  const n = db.select({ n: count() }).from(notices).where(eq(notices.rideId, rideId)).get()?.n ?? 0;
  return n > 0 ? `${n} notice(s) issued to its operator` : null;
};

/**
 * A ride goes only while nothing refers to it. Design data versions are never deleted, so a ride that
 * has any stays: set it out of service instead.
 */
export function deleteRide(db: Db, userId: string, id: string, guards: RideDeleteGuard[] = []): void {
  db.transaction((tx) => {
    const before = mustFindRide(tx, id);
    const blockers = [hasDesignData, hasSchedules, hasInspections, hasNotices, hasSetups, ...guards]
      .map((g) => g(tx, id))
      .filter((b): b is string => b !== null);
    if (blockers.length > 0)
      throw conflict(
        `${before.name} has ${blockers.join('; ')}. Set it out of service instead, or remove those first.`,
        'in_use',
      );
    tx.delete(rides).where(eq(rides.id, id)).run();
    recordAudit(tx, {
      userId,
      entity: 'ride',
      entityId: id,
      action: 'delete',
      rideId: id,
      summary: `Ride ${before.name} removed`,
      before,
    });
    refreshQueue(tx, queueDay(db), [id]);
  });
}
