import { Router } from 'express';
import { z } from 'zod';

import { pagingQuerySchema } from '@/lib/list-params';
import { nowOf, type ApiDeps } from '@/server/deps';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { inspectionReport } from '@/server/reports/inspection-report';
import { renderInspectionReportPdf } from '@/server/reports/inspection-report-pdf';
import { approvalRefusal } from '@/server/review/self-approval';
import { getInspection, listInspections } from '@/server/sync/read';

const byId = validate({ params: z.object({ id: z.string().trim().min(1).max(64) }) });
const reportInput = validate({
  params: z.object({ id: z.string().trim().min(1).max(64) }),
  query: z.object({ size: z.enum(['A4', 'LETTER'], { error: 'A4 or LETTER' }).default('A4') }),
});
const listInput = validate({
  query: pagingQuerySchema.extend({
    rideId: z.string().trim().min(1).max(64).optional(),
    inspectorId: z.string().trim().min(1).max(64).optional(),
    mine: z.enum(['1', '0', 'true', 'false'], { error: '1 or 0' }).optional(),
  }),
});

/**
 * Accepted inspections (staff; an inspector sees only their own, and another's answers 404).
 *
 * - `GET /inspections?rideId=&inspectorId=&mine=1&page=&pageSize=` → `{ inspections, total, page, pageSize }`,
 *   newest submission first, each with reading and photo counts, photos still missing, analysis status and
 *   review state
 * - `GET /inspections/:id` → `{ inspection }`: the record as accepted, readings, photos (each with
 *   `received`: whether its bytes have arrived), the server's analysis (null until made, or with
 *   `analysisNote` when none could be), amendments, review state
 * - `GET /inspections/:id/report.pdf?size=A4|LETTER` → the inspection report as a PDF (the inspector's own
 *   copy of what they recorded, with the load check and the review so far)
 */
export function inspectionsRouter(deps: ApiDeps): Router {
  const router = Router();
  const staff = [requireAuth(deps), requireRole('inspector', 'supervisor', 'admin')];

  router.get('/inspections', ...staff, listInput, (_req, res) => {
    const { mine, ...query } = listInput.query(res);
    res.json(listInspections(deps.db, currentUser(res), { ...query, mine: mine === '1' || mine === 'true' }));
  });

  router.get('/inspections/:id', ...staff, byId, (_req, res) => {
    const user = currentUser(res);
    const inspection = getInspection(deps.db, user, byId.params(res).id);
    res.json({
      inspection: { ...inspection, approvalRefusal: approvalRefusal(deps.db, user, inspection.inspectorId) },
    });
  });

  router.get('/inspections/:id/report.pdf', ...staff, reportInput, async (_req, res) => {
    const report = inspectionReport(deps.db, currentUser(res), reportInput.params(res).id, nowOf(deps));
    const pdf = await renderInspectionReportPdf(report, reportInput.query(res).size);
    const name = `inspection-${report.ride.name}-${report.inspection.submittedAt.slice(0, 10)}`;
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${name.replace(/[^\w.-]+/g, '_')}.pdf"`);
    res.setHeader('Cache-Control', 'private, no-cache');
    res.send(pdf);
  });

  return router;
}
