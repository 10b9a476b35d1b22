/**
 * The ride cycle behind an inspection's load check, recomputed on request for the review desk's charts:
 * the stored analysis keeps only peaks and statuses, the whole cycle is computed again from the same
 * design-data version and readings, by the same analysis (the design's stops included: the envelope names
 * the case each value comes from). Answered in exactly the shape of POST /api/loads/cycle, so the
 * calculator's result view draws it, with the same bounded series (server/compute/cycle-series.ts).
 *
 * The analysis runs in the cycle worker (server/compute/cycle-worker.ts), never on the main thread, and
 * its answer is kept: everything it rests on is immutable once stored (the record, whose SHA-256 is
 * stored beside it; a design version's data; a checklist template version's content), so an answer is
 * kept under the identity of each input (the inspection, its record's hash, the design version and
 * template version it uses, the sampling, the resolution). An amendment is another inspection with
 * another record; a first analysis that settles the design version changes the key. The kept answers
 * are bounded by bytes (least recently used go first) and die with the process.
 */
import { eq, sql } from 'drizzle-orm';
import type { Request, Response } from 'express';

import { inspections } from '@/db/server/inspections';
import { designVersions } from '@/db/server/schema';
import type { CycleResolution } from '@/features/loads/cycle-resolution-schema';
import { cyclePoolOf, runCycleJob } from '@/server/compute/cycle';
import type { ApiDeps } from '@/server/deps';
import { HttpError, notFound } from '@/server/http/errors';
import { JsonAnswers, sendJsonAnswer, type JsonAnswer } from '@/server/http/json-answers';
import type { InspectionHead } from '@/server/findings/findings';
import { ANALYSIS_SAMPLES } from '@/server/sync/analysis';
import { templateContentOf } from '@/server/sync/checklist-check';

/** Bytes of kept answers (JSON, gzip and brotli together): a bounded one is about 0.4 MB of them. */
const KEPT_BYTES = 64 * 1024 * 1024;
/** A single answer larger than this (a big full-resolution one) is sent but not kept. */
const KEPT_MAX_ONE = 16 * 1024 * 1024;

const noDesign = () =>
  notFound(
    'This inspection has no design data (the ride had none when it arrived), so there is no ride cycle to show.',
  );

export type InspectionCycles = {
  /** Sends the cycle of an inspection the caller may see (checked before), from the kept answers or computed. */
  send: (
    req: Request,
    res: Response,
    inspection: InspectionHead,
    resolution: CycleResolution,
  ) => Promise<void>;
  /** How many answers are kept (for tests). */
  readonly size: number;
};

export function inspectionCycles(deps: ApiDeps): InspectionCycles {
  const kept = new Map<string, { answer: JsonAnswer; bytes: number }>();
  const running = new Map<string, Promise<JsonAnswer>>();
  let keptBytes = 0;
  // Every form is made by the worker, so this only picks the one the client takes.
  const forms = new JsonAnswers(0);

  const keep = (key: string, answer: JsonAnswer) => {
    const bytes = answer.body.length + (answer.gzip?.length ?? 0) + (answer.br?.length ?? 0);
    if (bytes > KEPT_MAX_ONE) return;
    kept.set(key, { answer, bytes });
    keptBytes += bytes;
    for (const [oldest, entry] of kept) {
      if (keptBytes <= KEPT_BYTES) break;
      kept.delete(oldest);
      keptBytes -= entry.bytes;
    }
  };

  const compute = async (
    res: Response,
    inspectionId: string,
    designId: string,
    template: { id: string | null; version: number | null },
    resolution: CycleResolution,
  ): Promise<JsonAnswer> => {
    const row = deps.db
      .select({ record: sql<string>`${inspections.record}` })
      .from(inspections)
      .where(eq(inspections.id, inspectionId))
      .get();
    const design = deps.db
      .select({ data: sql<string>`${designVersions.data}` })
      .from(designVersions)
      .where(eq(designVersions.id, designId))
      .get();
    if (!row || !design) throw noDesign();
    const outcome = await runCycleJob(
      cyclePoolOf(deps),
      {
        kind: 'inspection',
        designJson: design.data,
        recordJson: row.record,
        template: templateContentOf(deps.db, template.id, template.version),
        samples: ANALYSIS_SAMPLES,
        resolution,
      },
      res,
    );
    if (!outcome.ok && 'failed' in outcome)
      throw new HttpError(
        422,
        'analysis_failed',
        `The ride cycle could not be computed from these readings and design data: ${outcome.failed}`,
      );
    if (!outcome.ok)
      throw new HttpError(400, 'validation_failed', 'The request has invalid fields.', outcome.issues);
    if (!('answer' in outcome))
      throw new Error('The cycle worker answered an inspection with a request’s answer.');
    const { body, gzip, br, etag } = outcome.answer;
    const asBuffer = (bytes: Uint8Array) => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    return { body: asBuffer(body), gzip: asBuffer(gzip), br: asBuffer(br), etag };
  };

  return {
    get size() {
      return kept.size;
    },
    send: async (req, res, inspection, resolution) => {
      // What the answer rests on, read on every request (one row by its key): a change makes a new key.
      const inputs = deps.db
        .select({
          contentSha256: inspections.contentSha256,
          designVersionId: inspections.designVersionId,
          analysedWith: sql<string | null>`json_extract(${inspections.analysis}, '$.designVersionId')`,
          templateId: inspections.templateId,
          templateVersion: inspections.templateVersion,
        })
        .from(inspections)
        .where(eq(inspections.id, inspection.id))
        .get();
      // The version the stored analysis used, else the one resolved when the inspection arrived.
      const designId = inputs?.analysedWith ?? inputs?.designVersionId ?? null;
      if (!inputs || !designId) throw noDesign();
      const key = [
        inspection.id,
        inputs.contentSha256,
        designId,
        inputs.templateId ?? '',
        inputs.templateVersion ?? '',
        ANALYSIS_SAMPLES,
        resolution,
      ].join('\n');
      let answer = kept.get(key)?.answer;
      if (answer) {
        // Most recently used last: the first in the map goes first when it is full.
        const entry = kept.get(key)!;
        kept.delete(key);
        kept.set(key, entry);
      } else {
        let pending = running.get(key);
        if (!pending) {
          pending = compute(
            res,
            inspection.id,
            designId,
            { id: inputs.templateId, version: inputs.templateVersion },
            resolution,
          ).finally(() => running.delete(key));
          running.set(key, pending);
          answer = await pending;
          keep(key, answer);
        } else answer = await pending;
      }
      sendJsonAnswer(req, res, forms, answer);
    },
  };
}
