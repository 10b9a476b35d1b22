import { asc, eq } from 'drizzle-orm';
import { Router } from 'express';

import { companies, rides, sites } from '@/db/server/schema';
import { companyScope } from '@/server/auth/scope';
import type { Db } from '@/server/db';
import type { ApiDeps } from '@/server/deps';
import { currentUser, requireAuth } from '@/server/http/require-auth';

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

/** Rides with their site and operator names; limited to one operator company when `scope` is set. */
export function listRides(db: Db, scope: string | null) {
  const query = db
    .select(rideListColumns)
    .from(rides)
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .leftJoin(sites, eq(sites.id, rides.siteId));
  return (scope === null ? query : query.where(eq(rides.operatorCompanyId, scope)))
    .orderBy(asc(companies.name), asc(rides.name))
    .all();
}

export type RideListItem = ReturnType<typeof listRides>[number];

/** `GET /rides` → `{ rides: RideListItem[] }`: operators get their own company's rides, staff all. */
export function ridesRouter(deps: ApiDeps): Router {
  const router = Router();
  router.get('/rides', requireAuth(deps), (_req, res) => {
    res.json({ rides: listRides(deps.db, companyScope(currentUser(res))) });
  });
  return router;
}
