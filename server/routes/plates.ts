import { Router } from 'express';
import { z } from 'zod';

import { nowOf, type ApiDeps } from '@/server/deps';
import { requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { plateSheet } from '@/server/reports/plate-sheet';
import { renderPlateSheetPdf } from '@/server/reports/plate-sheet-pdf';

const sheetInput = validate({
  query: z.object({
    size: z.enum(['A4', 'LETTER'], { error: 'A4 or LETTER' }).default('A4'),
    rideId: z.string().trim().min(1).max(64).optional(),
  }),
});

/**
 * Plates: QR labels to fix on the rides and their pivots (admin).
 *
 * - `GET /plates.pdf?size=A4|LETTER&rideId=` → a PDF sheet of labels: each ride and each pivot of its
 *   design data in force (one ride's with `rideId`, 404 when there is no such ride), each code holding the
 *   plate's address under APP_URL (features/rides/plate-url.ts)
 */
export function platesRouter(deps: ApiDeps): Router {
  const router = Router();
  router.get('/plates.pdf', requireAuth(deps), requireRole('admin'), sheetInput, async (_req, res) => {
    const { size, rideId } = sheetInput.query(res);
    const sheet = plateSheet(deps.db, deps.config.appUrl, nowOf(deps), rideId);
    const pdf = await renderPlateSheetPdf(sheet, size);
    const stem = rideId && sheet.plates[0] ? `plates-${sheet.plates[0].rideName}` : 'plates';
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${stem.replace(/[^\w.-]+/g, '_')}.pdf"`);
    res.setHeader('Cache-Control', 'private, no-cache');
    res.send(pdf);
  });
  return router;
}
