/**
 * The server's own load check of each accepted inspection, made after the push has been answered so a
 * phone never waits for the engine. Every accepted inspection ends analysed (or with a note saying why it
 * could not be): the push schedules a run, and so does every start of the app, which picks up anything a
 * stop or crash left with `analysed_at` still empty.
 */
import { and, asc, eq, isNull } from 'drizzle-orm';

import { inspections, type StoredAnalysis } from '@/db/server/inspections';
import { designVersions } from '@/db/server/schema';
import { analyseRecord, previewDifferences, previewOf } from '@/features/records/analysis';
import { measuredRiderOf } from '@/features/records/motion-record';
import { confirmedOutOfRange } from '@/features/records/plausibility';
import type { AnalysisModelFields } from '@/features/records/analysis-schema';
import type { LoadCheckExtras } from '@/features/records/load-check';
import type { InspectionRecord } from '@/features/records/schema';
import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import { ENGINE_VERSION, pinChecksAtPeak, type CycleResult } from '@/features/loads/engine';
import { jointRangesOf } from '@/features/loads';
import type { Db } from '@/server/db';
import type { Logger } from '@/server/logger';
import { refreshRideLifeFlags } from '@/server/pivot-life/flags';
import { queueDay, refreshQueueInspections } from '@/server/queue/queue-refresh';
import { templateContentOf } from '@/server/sync/checklist-check';
import { isOpen } from '@/server/sqlite-client';

/** The phone analyses with the function's default sampling; the server must use the same to compare. */
export const ANALYSIS_SAMPLES = 360;

export const noDesignNote =
  'The ride had no design data when this inspection arrived, so no load check was made. Enter the design ' +
  'data and amend the inspection to have it checked.';

export function summariseAnalysis(
  result: CycleResult & Partial<LoadCheckExtras>,
  design: { id: string; version: number },
  device: InspectionRecord['preview'],
): StoredAnalysis {
  const server = previewOf(result);
  return {
    ...storedModelFields(result),
    engineVersion: ENGINE_VERSION,
    designVersionId: design.id,
    designVersion: design.version,
    status: server.status,
    durationS: result.durationS,
    samples: result.samples,
    joints: result.joints.map((j) => ({
      name: j.name,
      peakForceN: j.peakForce.value,
      peakForceAtArmAngleRad: j.peakForce.armAngleRad,
      peakTorqueNm: j.peakTorque.value,
      // Component ranges in the carried body's frame; the range of the force's size hid reversals.
      ranges: jointRangesOf(j),
    })),
    seats: result.seats.map((s) => ({
      name: s.name,
      gxMin: s.extremes.gx.min,
      gxMax: s.extremes.gx.max,
      gzMin: s.extremes.gz.min,
      gzMax: s.extremes.gz.max,
    })),
    envelope: result.envelope,
    server,
    device,
    differences: previewDifferences(device, server),
    ...(result.fatigue ? { fatigue: result.fatigue } : {}),
  };
}

/** How the analysis was made: models, load cases (peaks only, no histories), period checks, warnings. */
function storedModelFields(result: CycleResult & Partial<LoadCheckExtras>): AnalysisModelFields {
  return {
    models: result.models,
    loadCases: result.loadCases?.map(({ run: _run, results: _results, ...summary }) => summary),
    governingCase: result.governingCase,
    periodChecks: result.periodChecks,
    warnings: result.warnings,
  };
}

const dailyCheckNote = 'A daily pre-opening check: no load check is made of it.';

/** Analyses one inspection if it still needs it; false when there was nothing to do. */
export function analyseOne(db: Db, id: string, now: Date = new Date()): boolean {
  const row = db
    .select({
      rideId: inspections.rideId,
      record: inspections.record,
      designVersionId: inspections.designVersionId,
      templateId: inspections.templateId,
      templateVersion: inspections.templateVersion,
      type: inspections.type,
    })
    .from(inspections)
    .where(eq(inspections.id, id))
    .get();
  if (!row) return false;
  const dailyCheck = row.type === DAILY_CHECK_TYPE;
  const design = row.designVersionId
    ? db
        .select({ id: designVersions.id, version: designVersions.version, data: designVersions.data })
        .from(designVersions)
        .where(eq(designVersions.id, row.designVersionId))
        .get()
    : undefined;

  let analysis: StoredAnalysis | null = null;
  let note: string | null = null;
  if (dailyCheck) {
    // An operator's pre-opening check: its answers are what it says, there is no load check to make.
    note = dailyCheckNote;
  } else if (!design) {
    note = noDesignNote;
  } else {
    try {
      // Checklist values with limits join the envelope, so the status and the queue see them too.
      const template = templateContentOf(db, row.templateId, row.templateVersion);
      const result = analyseRecord(design.data, row.record, template, ANALYSIS_SAMPLES);
      analysis = summariseAnalysis(result, design, row.record.preview);
      // EN 1993-1-8 Table 3.10 at the peak force over every load case (pivots with pin-check data).
      const pinChecks = pinChecksAtPeak(result, design.data.pivots);
      if (pinChecks.length) analysis.pinChecks = pinChecks;
      // The reviewer must see that a result rests on a value the inspector confirmed as out of range.
      const confirmed = confirmedOutOfRange(design.data, row.record.readings);
      if (confirmed.length) analysis.confirmedOutOfRange = confirmed;
      const measuredRider = measuredRiderOf(design.data, row.record.motionRecords);
      if (measuredRider.length) analysis.measuredRider = measuredRider;
    } catch (err) {
      // Stored as a note rather than retried forever: the same inputs would fail the same way.
      const detail = err instanceof Error ? err.message : String(err);
      note = `The load check could not be made with these readings and design data: ${detail}`;
    }
  }
  // Only the first analysis counts; a second run (start-up sweep racing a push) changes nothing. The
  // status decides the inspection's place in the review queue, which moves with it.
  return db.transaction((tx) => {
    const changed = tx
      .update(inspections)
      .set({
        analysis,
        analysisNote: note,
        analysisStatus: analysis?.status ?? null,
        analysedAt: now.toISOString(),
      })
      .where(and(eq(inspections.id, id), isNull(inspections.analysedAt)))
      .run();
    if (changed.changes > 0) refreshQueueInspections(tx, queueDay(db, now), [id]);
    // Its pin and bushing readings move the ride's wear projections, which the queue flags.
    if (changed.changes > 0) refreshRideLifeFlags(tx, row.rideId, queueDay(db, now), now);
    return changed.changes > 0;
  });
}

const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Analyses everything not yet analysed, oldest first, letting requests in between records. */
async function drain(db: Db): Promise<number> {
  let done = 0;
  for (;;) {
    if (!isOpen(db)) return done;
    const pending = db
      .select({ id: inspections.id })
      .from(inspections)
      .where(isNull(inspections.analysedAt))
      .orderBy(asc(inspections.receivedAt), asc(inspections.id))
      .limit(25)
      .all();
    if (pending.length === 0) return done;
    for (const { id } of pending) {
      if (!isOpen(db)) return done;
      if (analyseOne(db, id)) done++;
      await yieldToEventLoop();
    }
  }
}

type Queue = { tail: Promise<number>; scheduled: boolean };
const queues = new WeakMap<Db, Queue>();

function queueOf(db: Db): Queue {
  let q = queues.get(db);
  if (!q) {
    q = { tail: Promise.resolve(0), scheduled: false };
    queues.set(db, q);
  }
  return q;
}

/**
 * Analyses every inspection still without analysis and resolves with how many it analysed. Runs after
 * any run already in progress, so when it resolves, everything accepted before the call is analysed.
 */
export function analysePending(db: Db): Promise<number> {
  const q = queueOf(db);
  const run = q.tail.catch(() => 0).then(() => drain(db));
  q.tail = run;
  return run;
}

/** Asks for a run on the next turn of the event loop (after the response in hand has been sent). */
export function scheduleAnalysis(db: Db, logger: Logger): void {
  const q = queueOf(db);
  if (q.scheduled) return;
  q.scheduled = true;
  setImmediate(() => {
    q.scheduled = false;
    analysePending(db).catch((err: unknown) => {
      // Whatever stopped this run, the rows stay unanalysed and the next push or start picks them up.
      if (isOpen(db)) logger.error({ err }, 'analysing inspections failed');
    });
  });
}
