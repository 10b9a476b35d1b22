/**
 * NDT records per pivot and when each planned test falls due. The plans are the design data's (the version
 * in force); a method never tested at a pivot is due from the day its plan took effect — the day the
 * earliest version of an unbroken run of versions in force that list it came into force.
 */
import { randomUUID } from 'node:crypto';

import { and, asc, desc, eq } from 'drizzle-orm';

import { ndtRecords, ndtReports } from '@/db/server/ndt';
import { designVersions, users } from '@/db/server/schema';
import type { DesignData, NdtMethod } from '@/features/loads/design-schema';
import type { NdtRecord, NdtRecordInput, RideNdt } from '@/features/pivot-life/ndt-schema';
import { ndtDue, type PlanFrom } from '@/features/pivot-life/ndt-due';
import type { NdtDue } from '@/features/pivot-life/schema';
import { isoDay } from '@/lib/dates';
import type { Db } from '@/server/db';
import { HttpError } from '@/server/http/errors';
import { appendToLedger } from '@/server/ledger/append';

type Reader = Pick<Db, 'select'>;

const recordColumns = {
  id: ndtRecords.id,
  rideId: ndtRecords.rideId,
  joint: ndtRecords.joint,
  testedOn: ndtRecords.testedOn,
  method: ndtRecords.method,
  technician: ndtRecords.technician,
  level: ndtRecords.level,
  result: ndtRecords.result,
  note: ndtRecords.note,
  reportSha256: ndtRecords.reportSha256,
  createdBy: ndtRecords.createdBy,
  createdByName: users.name,
  createdAt: ndtRecords.createdAt,
};

/** A ride's NDT records, newest test first (a later report first on the same day). */
export function listNdtRecords(db: Reader, rideId: string): NdtRecord[] {
  return db
    .select(recordColumns)
    .from(ndtRecords)
    .leftJoin(users, eq(users.id, ndtRecords.createdBy))
    .where(eq(ndtRecords.rideId, rideId))
    .orderBy(desc(ndtRecords.testedOn), desc(ndtRecords.createdAt), desc(ndtRecords.id))
    .all();
}

type VersionRow = { version: number; data: DesignData; createdAt: string; decidedAt: string | null };

/** The versions in force, oldest first (a pending or rejected revision never counts). */
function versionsInForce(db: Reader, rideId: string): VersionRow[] {
  return db
    .select({
      version: designVersions.version,
      data: designVersions.data,
      createdAt: designVersions.createdAt,
      decidedAt: designVersions.decidedAt,
    })
    .from(designVersions)
    .where(and(eq(designVersions.rideId, rideId), eq(designVersions.approvalState, 'in_force')))
    .orderBy(asc(designVersions.version))
    .all();
}

/** A version is in force from its approval when a second person approved it, else from its creation. */
const inForceFrom = (v: VersionRow) => isoDay(v.decidedAt ?? v.createdAt);

const plansAt = (data: DesignData, joint: number) =>
  data.pivots.find((p) => p.joint === joint)?.ndt?.map((n) => n.method) ?? [];

/**
 * Per method planned at `joint` in the current version: the day the plan took effect, walking back over
 * the versions while each still lists the method there.
 */
function planFromOf(versions: VersionRow[], joint: number): PlanFrom {
  const current = versions[versions.length - 1];
  const byMethod: Partial<Record<NdtMethod, string>> = {};
  for (const method of plansAt(current.data, joint)) {
    let i = versions.length - 1;
    while (i > 0 && plansAt(versions[i - 1].data, joint).includes(method)) i--;
    byMethod[method] = inForceFrom(versions[i]);
  }
  return { byMethod, fallback: inForceFrom(current) };
}

type Assembled = { versions: VersionRow[]; records: NdtRecord[] };

function assemble(db: Reader, rideId: string): Assembled {
  return { versions: versionsInForce(db, rideId), records: listNdtRecords(db, rideId) };
}

function dueByJoint({ versions, records }: Assembled, today: string): Map<number, NdtDue[]> {
  const due = new Map<number, NdtDue[]>();
  const current = versions[versions.length - 1];
  if (!current) return due;
  for (const pivot of current.data.pivots) {
    if (!pivot.ndt?.length) continue;
    const tests = records.filter((r) => r.joint === pivot.joint);
    due.set(pivot.joint, ndtDue(pivot.ndt, tests, today, planFromOf(versions, pivot.joint)));
  }
  return due;
}

/**
 * Per pivot of the design in force that has NDT plans: each planned method's due date and state on
 * `today`. Pivots without plans (and rides without design data) are absent.
 */
export function rideNdtDue(db: Reader, rideId: string, today: string): Map<number, NdtDue[]> {
  return dueByJoint(assemble(db, rideId), today);
}

/** `GET /api/rides/:id/ndt`: every pivot of the design in force, its plans, due dates and records. */
export function rideNdt(db: Reader, ride: { id: string; name: string }, today: string): RideNdt {
  const rideId = ride.id;
  const assembled = assemble(db, rideId);
  const current = assembled.versions[assembled.versions.length - 1];
  const due = dueByJoint(assembled, today);
  const joints = new Set(current?.data.pivots.map((p) => p.joint) ?? []);
  return {
    rideId,
    rideName: ride.name,
    asOf: today,
    designVersion: current?.version ?? null,
    pivots: (current?.data.pivots ?? []).map((p) => ({
      joint: p.joint,
      name: p.name,
      plans: (p.ndt ?? []).map((n) => ({
        method: n.method,
        intervalDays: n.intervalDays,
        note: n.note ?? null,
      })),
      due: due.get(p.joint) ?? [],
      records: assembled.records.filter((r) => r.joint === p.joint),
    })),
    otherRecords: assembled.records.filter((r) => !joints.has(r.joint)),
  };
}

const problem = (path: string, message: string) =>
  new HttpError(400, 'validation_failed', message, [{ path, message }]);

/**
 * Stores one NDT record after checking it against the ride: the pivot must be one of the design in
 * force, the date not after `today`, and a named report must have been uploaded. Answers whether the
 * method is one the pivot's plan lists (a test outside the plan is kept, and said so).
 */
export function addNdtRecord(
  tx: Pick<Db, 'select' | 'insert' | 'get' | 'run'>,
  rideId: string,
  input: NdtRecordInput,
  userId: string,
  now: Date,
  today: string,
): { record: NdtRecord; notInPlan: boolean; message: string | null } {
  const current = versionsInForce(tx, rideId).at(-1);
  if (!current)
    throw problem('joint', 'This ride has no design data in force, so it has no pivots to record a test at.');
  const pivot = current.data.pivots.find((p) => p.joint === input.joint);
  if (!pivot)
    throw problem(
      'joint',
      `The ride’s design data (version ${current.version}) has no pivot at joint ${input.joint}; its pivots are ` +
        `${current.data.pivots.map((p) => `${p.joint} (${p.name})`).join(', ') || 'none'}.`,
    );
  if (input.testedOn > today) throw problem('testedOn', 'The test date cannot be after today.');
  if (input.reportSha256) {
    const known = tx
      .select({ sha256: ndtReports.sha256 })
      .from(ndtReports)
      .where(eq(ndtReports.sha256, input.reportSha256))
      .get();
    if (!known)
      throw problem('reportSha256', 'No report with this SHA-256 has been uploaded; upload the PDF first.');
  }
  const id = randomUUID();
  tx.insert(ndtRecords)
    .values({
      id,
      rideId,
      joint: input.joint,
      testedOn: input.testedOn,
      method: input.method,
      technician: input.technician,
      level: input.level,
      result: input.result,
      note: input.note || null,
      reportSha256: input.reportSha256 ?? null,
      createdBy: userId,
      createdAt: now.toISOString(),
    })
    .run();
  appendToLedger(tx, { kind: 'ndt', refId: id }, now);
  const record = listNdtRecords(tx, rideId).find((r) => r.id === id);
  if (!record) throw new Error('The NDT record just stored could not be read back.');
  const planned = (pivot.ndt ?? []).map((n) => n.method);
  const notInPlan = !planned.includes(input.method);
  const message = notInPlan
    ? `${input.method} is not in ${pivot.name}’s NDT plan (${planned.join(', ') || 'none planned'}); the record ` +
      'is kept, and no due date follows from it.'
    : null;
  return { record, notInPlan, message };
}
