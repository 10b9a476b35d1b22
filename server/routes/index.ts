import { Router } from 'express';

import { authRouter } from '@/server/auth/router';
import type { ApiDeps } from '@/server/deps';
import { apiNotFound } from '@/server/http/errors';
import { accountRouter } from '@/server/routes/account';
import { adminUsersRouter } from '@/server/routes/admin-users';
import { auditRouter } from '@/server/routes/audit';
import { chainRouter } from '@/server/routes/chain';
import { checklistsRouter } from '@/server/routes/checklists';
import { designRouter } from '@/server/routes/design';
import { devicesRouter } from '@/server/routes/devices';
import { fatigueRouter } from '@/server/routes/fatigue';
import { findingsRouter } from '@/server/routes/findings';
import { inspectionsRouter } from '@/server/routes/inspections';
import { instrumentsRouter } from '@/server/routes/instruments';
import { lifeRouter } from '@/server/routes/life';
import { dailyChecksRouter } from '@/server/routes/daily-checks';
import { loadsRouter } from '@/server/routes/loads';
import { ndtRouter } from '@/server/routes/ndt';
import { documentsRouter } from '@/server/routes/documents';
import { noticesRouter } from '@/server/routes/notices';
import { photosRouter } from '@/server/routes/photos';
import { platesRouter } from '@/server/routes/plates';
import { registerRouter } from '@/server/routes/register';
import { reviewQueueRouter, reviewRouter } from '@/server/routes/review';
import { ridesRouter } from '@/server/routes/rides';
import { schedulesRouter } from '@/server/routes/schedules';
import { syncRouter } from '@/server/routes/sync';

/** Everything under `/api`. Anything it doesn't know ends in a JSON 404 here, never in the web app. */
export function apiRouter(deps: ApiDeps): Router {
  const router = Router();
  router.get('/health', (_req, res) => {
    res.json({ ok: true });
  });
  router.use(reviewQueueRouter(deps));
  router.use(authRouter(deps));
  router.use(accountRouter(deps));
  router.use(ridesRouter(deps));
  router.use(chainRouter(deps));
  router.use(devicesRouter(deps));
  router.use(registerRouter(deps));
  router.use(designRouter(deps));
  router.use(checklistsRouter(deps));
  router.use(instrumentsRouter(deps));
  router.use(schedulesRouter(deps));
  router.use(auditRouter(deps));
  router.use(adminUsersRouter(deps));
  router.use(loadsRouter(deps));
  router.use(ndtRouter(deps));
  router.use(documentsRouter(deps));
  router.use(fatigueRouter(deps));
  router.use(syncRouter(deps), photosRouter(deps), inspectionsRouter(deps));
  router.use(reviewRouter(deps), findingsRouter(deps), noticesRouter(deps));
  router.use(lifeRouter(deps));
  router.use(dailyChecksRouter(deps));
  router.use(platesRouter(deps));
  router.use(apiNotFound);
  return router;
}
