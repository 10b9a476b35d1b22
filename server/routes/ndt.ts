import { Router } from 'express';
import { and, eq } from 'drizzle-orm';
import { z } from 'zod';

import { ndtRecords } from '@/db/server/ndt';
import { rides } from '@/db/server/schema';
import { idParamsSchema } from '@/features/registry/schema';
import { ndtRecordInputSchema, type NdtRecordCreated, type RideNdt } from '@/features/pivot-life/ndt-schema';
import { isoDay } from '@/lib/dates';
import { companyScope } from '@/server/auth/scope';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import type { Db } from '@/server/db';
import { assertContentHash } from '@/server/http/content-hash';
import { forbidden, notFound } from '@/server/http/errors';
import { pdfBodyOf, rawPdfBody } from '@/server/http/raw-pdf';
import { validate } from '@/server/http/validate';
import { refreshRideLifeFlags } from '@/server/pivot-life/flags';
import { addNdtRecord, rideNdt } from '@/server/pivot-life/ndt';
import {
  findNdtReport,
  MAX_NDT_REPORT_BYTES,
  readNdtReport,
  storeNdtReport,
} from '@/server/pivot-life/ndt-report-store';
import { queueDay } from '@/server/queue/queue-refresh';
import { mustFindRide } from '@/server/registry/rides';
import { storageOf } from '@/server/storage';

const oneRide = validate({ params: idParamsSchema });
const addInput = validate({ params: idParamsSchema, body: ndtRecordInputSchema });
const byHash = validate({
  params: z.object({
    sha256: z.string().regex(/^[0-9a-f]{64}$/, 'Must be the report’s SHA-256 as 64 lower-case hex digits'),
  }),
});

const rawPdf = rawPdfBody(MAX_NDT_REPORT_BYTES, 'The report');

/** An operator may read a report attached to an NDT record of one of their company's rides. */
function operatorMaySeeReport(db: Pick<Db, 'select'>, companyId: string, sha256: string): boolean {
  const row = db
    .select({ id: ndtRecords.id })
    .from(ndtRecords)
    .innerJoin(rides, eq(rides.id, ndtRecords.rideId))
    .where(and(eq(ndtRecords.reportSha256, sha256), eq(rides.operatorCompanyId, companyId)))
    .limit(1)
    .get();
  return row !== undefined;
}

/**
 * NDT at the ride's pivots.
 *
 * - `GET /rides/:id/ndt` → `RideNdt`: per pivot of the design in force its plans, due dates and records
 *   (staff; the ride's operator for their own rides; 404 for others').
 * - `POST /rides/:id/ndt-records` (inspector, supervisor, admin) with `ndtRecordInputSchema` → 201
 *   `{ record, notInPlan, message }`; 400 naming the field for bad input, a pivot the design lacks, a date
 *   after today or a report not uploaded. The ride's pivot-life flags and queue rows follow at once.
 * - `PUT /ndt-reports/:sha256` (inspector, supervisor, admin) with the PDF's raw bytes (application/pdf or
 *   application/octet-stream, at most 20 MB) → 201 `{ stored: true, sha256 }`, 200 when already held; 415
 *   `not_a_pdf` when the bytes do not start with `%PDF-`, 415 `unsupported_media_type` for another
 *   Content-Type, 413 `payload_too_large`, 400 `hash_mismatch`.
 * - `GET /ndt-reports/:sha256` → the PDF (staff; operators only reports on their company's rides' records).
 */
export function ndtRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);
  const recorders = requireRole('inspector', 'supervisor', 'admin');

  router.get('/rides/:id/ndt', auth, oneRide, (_req, res) => {
    const ride = mustFindRide(deps.db, oneRide.params(res).id, companyScope(currentUser(res)));
    const body: RideNdt = rideNdt(deps.db, ride, isoDay(nowOf(deps)));
    res.json(body);
  });

  router.post('/rides/:id/ndt-records', auth, recorders, addInput, (_req, res) => {
    const ride = mustFindRide(deps.db, addInput.params(res).id);
    const now = nowOf(deps);
    const body: NdtRecordCreated = deps.db.transaction((tx) => {
      const created = addNdtRecord(tx, ride.id, addInput.body(res), currentUser(res).id, now, isoDay(now));
      refreshRideLifeFlags(tx, ride.id, queueDay(deps.db, now), now);
      return created;
    });
    res.status(201).json(body);
  });

  router.put('/ndt-reports/:sha256', auth, recorders, byHash, rawPdf, async (req, res) => {
    const { sha256 } = byHash.params(res);
    const body = pdfBodyOf(req, 'report');
    assertContentHash(body, sha256);
    const { stored } = await storeNdtReport(
      deps.db,
      storageOf(deps.config),
      { sha256, bytes: body, userId: currentUser(res).id },
      nowOf(deps),
    );
    res.status(stored ? 201 : 200).json({ stored, sha256 });
  });

  router.get('/ndt-reports/:sha256', auth, byHash, async (_req, res) => {
    const { sha256 } = byHash.params(res);
    const scope = companyScope(currentUser(res));
    if (scope !== null && !operatorMaySeeReport(deps.db, scope, sha256))
      throw forbidden('Operators see the NDT reports of their own rides.');
    if (!findNdtReport(deps.db, sha256)) throw notFound('The server has no NDT report with this SHA-256.');
    const bytes = await readNdtReport(storageOf(deps.config), sha256);
    if (!bytes) throw notFound('The report is recorded but its file is missing on the server.');
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="ndt-report-${sha256.slice(0, 12)}.pdf"`);
    // Private: behind sign-in. Immutable: the address is the content's own hash.
    res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
    res.send(bytes);
  });

  return router;
}
