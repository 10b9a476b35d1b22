import { Router } from 'express';
import { asc, eq } from 'drizzle-orm';

import { rides, sites } from '@/db/server/schema';
import type { DailyOverviewRide, RideDailyChecks } from '@/features/daily-checks/schema';
import { idParamsSchema } from '@/features/registry/schema';
import { companyScope } from '@/server/auth/scope';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { rideDailyChecks } from '@/server/daily-checks/daily-checks';
import { nowOf, type ApiDeps } from '@/server/deps';
import { validate } from '@/server/http/validate';
import { mustFindRide } from '@/server/registry/rides';

const byRide = validate({ params: idParamsSchema });

/**
 * Operators' daily pre-opening checks, read (they arrive through `POST /sync/push` as records of type
 * `daily_pre_opening`). Staff see every ride; operators only their own company's (others' answer 404).
 *
 * - `GET /rides/:id/daily-checks` → `RideDailyChecks`: the last 14 days' checks (newest first), the days
 *   the ride ran with no check, and today's state (features/daily-checks/schema.ts)
 * - `GET /daily-checks/overview` → `{ rides: DailyOverviewRide[] }`: every ride the caller may see, by
 *   name, with today's state, its latest check and its missed days
 */
export function dailyChecksRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);

  router.get('/rides/:id/daily-checks', auth, byRide, (_req, res) => {
    const ride = mustFindRide(deps.db, byRide.params(res).id, companyScope(currentUser(res)));
    const body: RideDailyChecks = rideDailyChecks(deps.db, ride, nowOf(deps));
    res.json(body);
  });

  router.get('/daily-checks/overview', auth, (_req, res) => {
    const scope = companyScope(currentUser(res));
    const now = nowOf(deps);
    const rows = deps.db
      .select({ id: rides.id, name: rides.name, status: rides.status, siteName: sites.name })
      .from(rides)
      .leftJoin(sites, eq(sites.id, rides.siteId))
      .where(scope === null ? undefined : eq(rides.operatorCompanyId, scope))
      .orderBy(asc(rides.name), asc(rides.id))
      .all();
    const body: { rides: DailyOverviewRide[] } = {
      rides: rows.map((r) => {
        const state = rideDailyChecks(deps.db, r, now);
        return {
          rideId: r.id,
          rideName: r.name,
          siteName: r.siteName,
          today: state.today,
          todayState: state.todayState,
          latest: state.checks[0] ?? null,
          missedDays: state.missedDays,
        };
      }),
    };
    res.json(body);
  });

  return router;
}
