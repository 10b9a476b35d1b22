/**
 * Findings a supervisor writes on an inspection: the deficiency, its severity, what must be done and by
 * when, and the photos that show it. Every change is one transaction with its audit entry and the ride's
 * queue rows. The content of a finding is fixed once its inspection is approved; what happens to it
 * afterwards (corrective action, closing) is a change of state, not of content.
 */
import { and, asc, eq, max, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { z } from 'zod';

import { inspectionPhotos, inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import { auditLog, rides, users } from '@/db/server/schema';
import type { SessionUser } from '@/features/session/schema';
import {
  findingProblems,
  severityInfo,
  type Finding,
  type findingInputSchema,
  type findingPatchSchema,
} from '@/features/notices/finding-schema';
import type { Db } from '@/server/db';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { appendToLedger } from '@/server/ledger/append';
import { recordAudit } from '@/server/registry/audit';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';

type Reader = Pick<Db, 'select'>;
type FindingInput = z.output<typeof findingInputSchema>;
type FindingPatch = z.output<typeof findingPatchSchema>;

const inspectorUser = alias(users, 'inspector_user');
const reviewerUser = alias(users, 'reviewer_user');

/** What the review desk needs to know about an inspection before reading or changing anything on it. */
export type InspectionHead = {
  id: string;
  rideId: string;
  rideName: string;
  inspectorId: string;
  inspectorName: string;
  type: (typeof inspections.$inferSelect)['type'];
  submittedAt: string;
  reviewState: (typeof inspections.$inferSelect)['reviewState'];
  reviewedAt: string | null;
  reviewedByName: string | null;
  reviewNote: string | null;
};

/**
 * The inspection as `user` may see it: staff see all, an inspector only their own; another's answers the
 * same 404 as a missing one, so ids can't be probed.
 */
export function mustSeeInspection(db: Reader, user: SessionUser, id: string): InspectionHead {
  const row = db
    .select({
      id: inspections.id,
      rideId: inspections.rideId,
      rideName: rides.name,
      inspectorId: inspections.inspectorId,
      inspectorName: inspectorUser.name,
      type: inspections.type,
      submittedAt: inspections.submittedAt,
      reviewState: inspections.reviewState,
      reviewedAt: inspections.reviewedAt,
      reviewedByName: reviewerUser.name,
      reviewNote: inspections.reviewNote,
    })
    .from(inspections)
    .innerJoin(rides, eq(rides.id, inspections.rideId))
    .innerJoin(inspectorUser, eq(inspectorUser.id, inspections.inspectorId))
    .leftJoin(reviewerUser, eq(reviewerUser.id, inspections.reviewedBy))
    .where(
      and(
        eq(inspections.id, id),
        user.role === 'inspector' ? eq(inspections.inspectorId, user.id) : undefined,
      ),
    )
    .get();
  if (!row) throw notFound('No such inspection.');
  return row;
}

/** The number people call a finding by: its number on the ride, else (not yet numbered) in its inspection. */
export const findingNumber = sql<number>`COALESCE(${findings.rideNumber}, ${findings.number})`.mapWith(
  Number,
);

/**
 * Gives the ride's findings stored before rides numbered them their number on the ride, in the order
 * they were made (inspection submitted, then number), after the highest number already given. Runs in
 * the caller's transaction before anything numbers or shows the ride's findings; a no-op once done.
 */
export function numberRideFindings(tx: Pick<Db, 'run' | 'all'>, rideId?: string): void {
  // Read first, then write: each number rests on the highest given before this run, not during it.
  const todo = tx.all<{ id: string; n: number }>(sql`
    SELECT f.id AS id,
      ROW_NUMBER() OVER (PARTITION BY f.ride_id ORDER BY i.submitted_at, f.created_at, f.number)
        + COALESCE((SELECT MAX(g.ride_number) FROM ${findings} g WHERE g.ride_id = f.ride_id), 0) AS n
    FROM ${findings} f JOIN ${inspections} i ON i.id = f.inspection_id
    WHERE f.ride_number IS NULL ${rideId ? sql`AND f.ride_id = ${rideId}` : sql``}`);
  for (const row of todo) tx.run(sql`UPDATE ${findings} SET ride_number = ${row.n} WHERE id = ${row.id}`);
}

const creator = alias(users, 'finding_creator');
const updater = alias(users, 'finding_updater');
const closer = alias(users, 'finding_closer');

/**
 * Findings in the shape the app reads (`Finding`), with the names of who created, last changed and closed
 * each; the caller adds the filter and order. The review desk and the notices' findings both read this way.
 */
export function findingRows(db: Reader) {
  return db
    .select({
      id: findings.id,
      inspectionId: findings.inspectionId,
      rideId: findings.rideId,
      number: findingNumber,
      inspectionNumber: findings.number,
      severity: findings.severity,
      description: findings.description,
      ruleRef: findings.ruleRef,
      requiredAction: findings.requiredAction,
      dueOn: findings.dueOn,
      photoShas: findings.photoShas,
      state: findings.state,
      createdAt: findings.createdAt,
      createdByName: creator.name,
      updatedAt: findings.updatedAt,
      updatedByName: updater.name,
      closedAt: findings.closedAt,
      closedByName: closer.name,
      stateNote: findings.stateNote,
      closeEvidence: findings.closeEvidence,
    })
    .from(findings)
    .leftJoin(creator, eq(creator.id, findings.createdBy))
    .leftJoin(updater, eq(updater.id, findings.updatedBy))
    .leftJoin(closer, eq(closer.id, findings.closedBy));
}

/** An inspection's findings in number order. */
export function listFindings(db: Reader, inspectionId: string): Finding[] {
  return findingRows(db).where(eq(findings.inspectionId, inspectionId)).orderBy(asc(findings.number)).all();
}

function findFinding(db: Reader, id: string): Finding | null {
  return findingRows(db).where(eq(findings.id, id)).get() ?? null;
}

function mustFindFinding(db: Reader, id: string): Finding {
  const found = findFinding(db, id);
  if (!found) throw notFound('No such finding.');
  return found;
}

const invalid = (issues: { path: string; message: string }[]) =>
  new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', issues);

/** Content may change only until the inspection is approved. */
function assertEditable(inspection: InspectionHead, what: string): void {
  if (inspection.reviewState === 'approved')
    throw conflict(
      `This inspection was approved${inspection.reviewedAt ? ` on ${inspection.reviewedAt.slice(0, 10)}` : ''}, so ${what}. ` +
        'Record what happens next (corrective action, closing) on the finding’s state instead.',
      'inspection_approved',
    );
}

/** Every photo reference must be one of the inspection's own photos. */
function assertPhotosOf(db: Reader, inspectionId: string, shas: readonly string[]): void {
  if (shas.length === 0) return;
  const own = new Set(
    db
      .select({ sha256: inspectionPhotos.sha256 })
      .from(inspectionPhotos)
      .where(eq(inspectionPhotos.inspectionId, inspectionId))
      .all()
      .map((p) => p.sha256),
  );
  const issues = shas.flatMap((sha, i) =>
    own.has(sha) ? [] : [{ path: `photoShas.${i}`, message: 'Not a photo of this inspection' }],
  );
  if (issues.length) throw invalid(issues);
}

/**
 * The next number in the inspection: one past the highest ever given, deleted findings included (their
 * numbers are read back from the audit log), so "finding 3" always means the same finding.
 */
function nextNumber(db: Reader, inspection: InspectionHead): number {
  const live = db
    .select({ n: max(findings.number) })
    .from(findings)
    .where(eq(findings.inspectionId, inspection.id))
    .get()?.n;
  const removed = db
    .select({
      n: sql<
        number | null
      >`max(COALESCE(json_extract(${auditLog.before}, '$.inspectionNumber'), json_extract(${auditLog.before}, '$.number')))`,
    })
    .from(auditLog)
    .where(
      and(
        eq(auditLog.rideId, inspection.rideId),
        eq(auditLog.entity, 'finding'),
        eq(auditLog.action, 'delete'),
        sql`json_extract(${auditLog.before}, '$.inspectionId') = ${inspection.id}`,
      ),
    )
    .get()?.n;
  return Math.max(live ?? 0, removed ?? 0) + 1;
}

/** The next number on the ride: one past the highest ever given, deleted findings included. */
function nextRideNumber(db: Reader, rideId: string): number {
  const live = db
    .select({ n: max(findings.rideNumber) })
    .from(findings)
    .where(eq(findings.rideId, rideId))
    .get()?.n;
  // Entries written since rides numbered findings carry `inspectionNumber`; their `number` is the ride's.
  const removed = db
    .select({ n: sql<number | null>`max(json_extract(${auditLog.before}, '$.number'))` })
    .from(auditLog)
    .where(
      and(
        eq(auditLog.rideId, rideId),
        eq(auditLog.entity, 'finding'),
        eq(auditLog.action, 'delete'),
        sql`json_extract(${auditLog.before}, '$.inspectionNumber') IS NOT NULL`,
      ),
    )
    .get()?.n;
  return Math.max(live ?? 0, removed ?? 0) + 1;
}

/**
 * The time to stamp a change with: now, but always after the stored `updatedAt`, so a stale editor's
 * `expectedUpdatedAt` can never match again, even when two edits fall in the same millisecond.
 */
function laterThan(previous: string | null, now: Date): string {
  const prev = previous ? Date.parse(previous) : NaN;
  return new Date(Number.isNaN(prev) ? now.getTime() : Math.max(now.getTime(), prev + 1)).toISOString();
}

const label = (f: Pick<Finding, 'severity'>) => severityInfo[f.severity].label;

export function createFinding(
  db: Db,
  user: SessionUser,
  inspectionId: string,
  input: FindingInput,
  now: Date,
): Finding {
  return db.transaction((tx) => {
    const inspection = mustSeeInspection(tx, user, inspectionId);
    assertEditable(inspection, 'no finding can be added to it');
    assertPhotosOf(tx, inspection.id, input.photoShas);
    const number = nextNumber(tx, inspection);
    numberRideFindings(tx, inspection.rideId);
    const rideNumber = nextRideNumber(tx, inspection.rideId);
    const at = now.toISOString();
    const { id } = tx
      .insert(findings)
      .values({
        inspectionId: inspection.id,
        rideId: inspection.rideId,
        number,
        rideNumber,
        severity: input.severity,
        description: input.description,
        ruleRef: input.ruleRef,
        requiredAction: input.requiredAction,
        dueOn: input.dueOn,
        photoShas: input.photoShas,
        createdAt: at,
        createdBy: user.id,
        updatedAt: at,
        updatedBy: user.id,
      })
      .returning({ id: findings.id })
      .get();
    appendToLedger(tx, { kind: 'finding', refId: id }, now);
    const after = mustFindFinding(tx, id);
    recordAudit(tx, {
      userId: user.id,
      entity: 'finding',
      entityId: id,
      action: 'create',
      rideId: inspection.rideId,
      summary: `${inspection.rideName}: finding ${rideNumber} added (${label(after)})`,
      after,
    });
    refreshQueue(tx, queueDay(db, now), [inspection.rideId]);
    return after;
  });
}

export function updateFinding(
  db: Db,
  user: SessionUser,
  id: string,
  patch: FindingPatch,
  now: Date,
): Finding {
  return db.transaction((tx) => {
    const before = mustFindFinding(tx, id);
    const inspection = mustSeeInspection(tx, user, before.inspectionId);
    assertEditable(inspection, 'its findings can no longer be edited');
    if (patch.expectedUpdatedAt !== undefined && patch.expectedUpdatedAt !== before.updatedAt)
      throw conflict(
        `Finding ${before.number} was changed by ${before.updatedByName ?? 'someone else'} at ` +
          `${before.updatedAt} after you opened it. Reload it, check their changes, then make yours again.`,
        'edit_conflict',
      );
    const merged = {
      severity: patch.severity ?? before.severity,
      description: patch.description ?? before.description,
      ruleRef: patch.ruleRef !== undefined ? patch.ruleRef : before.ruleRef,
      requiredAction: patch.requiredAction !== undefined ? patch.requiredAction : before.requiredAction,
      dueOn: patch.dueOn !== undefined ? patch.dueOn : before.dueOn,
      photoShas: patch.photoShas !== undefined ? [...new Set(patch.photoShas)] : before.photoShas,
    };
    const problems = findingProblems(merged);
    if (problems.length) throw invalid(problems);
    if (patch.photoShas !== undefined) assertPhotosOf(tx, inspection.id, patch.photoShas);
    tx.update(findings)
      .set({ ...merged, updatedAt: laterThan(before.updatedAt, now), updatedBy: user.id })
      .where(eq(findings.id, id))
      .run();
    appendToLedger(tx, { kind: 'finding', refId: id }, now);
    const after = mustFindFinding(tx, id);
    const severityChange = before.severity === after.severity ? '' : ` (${label(before)} → ${label(after)})`;
    recordAudit(tx, {
      userId: user.id,
      entity: 'finding',
      entityId: id,
      action: 'update',
      rideId: inspection.rideId,
      summary: `${inspection.rideName}: finding ${after.number} changed${severityChange}`,
      before,
      after,
    });
    refreshQueue(tx, queueDay(db, now), [inspection.rideId]);
    return after;
  });
}

export function deleteFinding(db: Db, user: SessionUser, id: string, now: Date): void {
  db.transaction((tx) => {
    const before = mustFindFinding(tx, id);
    const inspection = mustSeeInspection(tx, user, before.inspectionId);
    assertEditable(inspection, 'its findings can no longer be removed');
    tx.delete(findings).where(eq(findings.id, id)).run();
    appendToLedger(tx, { kind: 'finding', refId: id, rideId: inspection.rideId }, now);
    recordAudit(tx, {
      userId: user.id,
      entity: 'finding',
      entityId: id,
      action: 'delete',
      rideId: inspection.rideId,
      summary: `${inspection.rideName}: finding ${before.number} removed`,
      before,
    });
    refreshQueue(tx, queueDay(db, now), [inspection.rideId]);
  });
}
