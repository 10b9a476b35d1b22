/**
 * The ride cycle behind an inspection's load check, recomputed on request for the review desk's charts:
 * the stored analysis keeps only peaks and statuses, the whole cycle is cheap to compute again from the
 * same design-data version and readings, by the same analysis (the design's stops included: the envelope
 * names the case each value comes from). Answered in exactly the shape of POST /api/loads/cycle, so the
 * calculator's result view draws it, with the same bounded series (server/compute/cycle-series.ts).
 */
import { eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { designVersions } from '@/db/server/schema';
import { analyseRecord } from '@/features/records/analysis';
import type { CycleResolution } from '@/features/loads/cycle-resolution-schema';
import type { Db } from '@/server/db';
import { cycleAnswer, type CycleAnswer } from '@/server/compute/cycle-series';
import { HttpError, notFound } from '@/server/http/errors';
import type { InspectionHead } from '@/server/findings/findings';
import { ANALYSIS_SAMPLES } from '@/server/sync/analysis';
import { templateContentOf } from '@/server/sync/checklist-check';

export function inspectionCycle(
  db: Pick<Db, 'select'>,
  inspection: InspectionHead,
  resolution: CycleResolution = 'bounded',
): CycleAnswer {
  const row = db
    .select({
      record: inspections.record,
      analysis: inspections.analysis,
      designVersionId: inspections.designVersionId,
      templateId: inspections.templateId,
      templateVersion: inspections.templateVersion,
    })
    .from(inspections)
    .where(eq(inspections.id, inspection.id))
    .get();
  // The version the stored analysis used, else the one resolved when the inspection arrived.
  const designId = row?.analysis?.designVersionId ?? row?.designVersionId ?? null;
  const design = designId
    ? db
        .select({ data: designVersions.data })
        .from(designVersions)
        .where(eq(designVersions.id, designId))
        .get()
    : undefined;
  if (!row || !design)
    throw notFound(
      'This inspection has no design data (the ride had none when it arrived), so there is no ride cycle to show.',
    );
  let result;
  try {
    // The stored analysis's own computation: readings, recorded cycles, the design's stops, checklist values.
    const template = templateContentOf(db, row.templateId, row.templateVersion);
    const {
      models: _m,
      loadCases: _c,
      governingCase: _g,
      periodChecks: _p,
      ...cycle
    } = analyseRecord(design.data, row.record, template, ANALYSIS_SAMPLES);
    result = cycle;
  } catch (err) {
    const detail = err instanceof Error ? err.message : String(err);
    throw new HttpError(
      422,
      'analysis_failed',
      `The ride cycle could not be computed from these readings and design data: ${detail}`,
    );
  }
  const answer = cycleAnswer(result, resolution);
  if (!answer.ok)
    throw new HttpError(400, 'validation_failed', 'The request has invalid fields.', answer.issues);
  return answer.value;
}
