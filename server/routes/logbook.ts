import { Router } from 'express';
import { eq } from 'drizzle-orm';

import { companies, rides } from '@/db/server/schema';
import { logbookToCsv } from '@/features/logbook';
import { LOGBOOK_PAGE_SIZE, logbookExportQuerySchema, logbookQuerySchema } from '@/features/logbook/schema';
import { idParamsSchema } from '@/features/registry/schema';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import { validate } from '@/server/http/validate';
import { logbookPage, readLogbook } from '@/server/logbook/logbook';
import { renderLogbookPdf } from '@/server/logbook/logbook-pdf';

const pageInput = validate({ params: idParamsSchema, query: logbookQuerySchema });
const exportInput = validate({ params: idParamsSchema, query: logbookExportQuerySchema });

const fileStem = (rideName: string) => `logbook-${rideName}`.replace(/[^\w.-]+/g, '_');

/**
 * The ride logbook: everything that happened to a ride, newest first (features/logbook, server/logbook).
 * Every role that sees the ride; an operator's request about another company's ride answers 404, and
 * each source shows a viewer only what the rest of the API shows them.
 *
 * - `GET /rides/:id/logbook?kinds=&from=&to=&q=&page=` → `LogbookPage` (25 entries a page)
 * - `GET /rides/:id/logbook.csv?kinds=&from=&to=&q=` → every matching entry as RFC 4180 CSV (UTF-8)
 * - `GET /rides/:id/logbook.pdf?kinds=&from=&to=&q=&size=A4|LETTER` → the same as a PDF, on the operator
 *   company's paper unless `size` says otherwise
 */
export function logbookRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);

  router.get('/rides/:id/logbook', auth, pageInput, (_req, res) => {
    res.json(
      logbookPage(
        deps.db,
        currentUser(res),
        pageInput.params(res).id,
        pageInput.query(res),
        LOGBOOK_PAGE_SIZE,
      ),
    );
  });

  router.get('/rides/:id/logbook.csv', auth, exportInput, (_req, res) => {
    const { size: _size, ...filter } = exportInput.query(res);
    const read = readLogbook(deps.db, currentUser(res), exportInput.params(res).id, filter);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${fileStem(read.ride.name)}.csv"`);
    res.send(logbookToCsv(read.events));
  });

  router.get('/rides/:id/logbook.pdf', auth, exportInput, async (_req, res) => {
    const { size, ...filter } = exportInput.query(res);
    const user = currentUser(res);
    const read = readLogbook(deps.db, user, exportInput.params(res).id, filter);
    const paper =
      size ??
      deps.db
        .select({ paper: companies.noticePaper })
        .from(rides)
        .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
        .where(eq(rides.id, read.ride.id))
        .get()?.paper ??
      'A4';
    const pdf = await renderLogbookPdf({
      ...read,
      filter,
      printedFor: user.name,
      printedAt: nowOf(deps).toISOString(),
      size: paper,
    });
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${fileStem(read.ride.name)}.pdf"`);
    res.setHeader('Cache-Control', 'private, no-cache');
    res.send(pdf);
  });

  return router;
}
