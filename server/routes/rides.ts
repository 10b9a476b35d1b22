import { and, asc, eq } from 'drizzle-orm';
import { Router } from 'express';

import { companies, rides, sites } from '@/db/server/schema';
import type { RideDetailResponse } from '@/features/registry/schema';
import { rideIdParamsSchema } from '@/features/registry/schema';
import { companyScope } from '@/server/auth/scope';
import type { Db } from '@/server/db';
import type { ApiDeps } from '@/server/deps';
import { notFound } from '@/server/http/errors';
import { currentUser, requireAuth } from '@/server/http/require-auth';
import { validate } from '@/server/http/validate';
import { findDesignVersion } from '@/server/registry/design';

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

/** Rides with their site and operator names; limited to one operator company when `scope` is set. */
export function listRides(db: Db, scope: string | null) {
  const query = rideQuery(db);
  return (scope === null ? query : query.where(eq(rides.operatorCompanyId, scope)))
    .orderBy(asc(companies.name), asc(rides.name))
    .all();
}

export type RideListItem = ReturnType<typeof listRides>[number];

/**
 * One ride in the list shape, or null when it does not exist or lies outside `scope`: the caller answers
 * both with the same 404, so an operator cannot learn that another company's ride exists.
 */
export function findRide(db: Pick<Db, 'select'>, id: string, scope: string | null): RideListItem | null {
  const row = rideQuery(db)
    .where(scope === null ? eq(rides.id, id) : and(eq(rides.id, id), eq(rides.operatorCompanyId, scope)))
    .get();
  return row ?? null;
}

const rideParams = validate({ params: rideIdParamsSchema });

/**
 * `GET /rides` → `{ rides: RideListItem[] }`: operators get their own company's rides, staff all.
 * `GET /rides/:id` → `{ ride, design }`: the ride and its current design data (null for operators, who
 * may not see design data, and for rides without any yet); 404 for unknown rides and other companies'.
 */
export function ridesRouter(deps: ApiDeps): Router {
  const router = Router();
  router.get('/rides', requireAuth(deps), (_req, res) => {
    res.json({ rides: listRides(deps.db, companyScope(currentUser(res))) });
  });
  router.get('/rides/:id', requireAuth(deps), rideParams, (_req, res) => {
    const user = currentUser(res);
    const ride = findRide(deps.db, rideParams.params(res).id, companyScope(user));
    if (!ride) throw notFound('No such ride.');
    const body: RideDetailResponse = {
      ride,
      design: user.role === 'operator' ? null : findDesignVersion(deps.db, ride.id),
    };
    res.json(body);
  });
  return router;
}
