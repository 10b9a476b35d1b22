/**
 * The operators' running log: one row per ride and day (cycles or hours run). Entering a day again
 * replaces it; every write is in the audit log under the ride, with what the day said before, so a
 * replaced day is never lost. An import is one transaction: all its days or none.
 */
import { and, asc, desc, eq, gte } from 'drizzle-orm';

import { runningLog, type RunningLogSource } from '@/db/server/life';
import { users } from '@/db/server/schema';
import type { RunningLogEntry, RunningLogRow } from '@/features/pivot-life/schema';
import { dayProblem } from '@/features/pivot-life';
import type { Db } from '@/server/db';
import { HttpError } from '@/server/http/errors';
import { refreshRideLifeFlags } from '@/server/pivot-life/flags';
import { queueDay } from '@/server/queue/queue-refresh';
import { recordAudit } from '@/server/registry/audit';
import { mustFindRide } from '@/server/registry/rides';

/** Rows answered by the log's list at most (about three years of daily entries), newest first. */
export const RUNNING_LOG_LIST_LIMIT = 1200;

const rowColumns = {
  id: runningLog.id,
  rideId: runningLog.rideId,
  day: runningLog.day,
  cycles: runningLog.cycles,
  hours: runningLog.hours,
  note: runningLog.note,
  enteredBy: runningLog.enteredBy,
  enteredByName: users.name,
  enteredAt: runningLog.enteredAt,
  source: runningLog.source,
};

type SelectedRow = {
  id: string;
  rideId: string;
  day: string;
  cycles: number | null;
  hours: number | null;
  note: string | null;
  enteredBy: string;
  enteredByName: string;
  enteredAt: string;
  source: RunningLogSource;
};

/** Absent values are left out (not null), as the entry schema has them. */
function toRow(r: SelectedRow): RunningLogRow {
  return {
    id: r.id,
    rideId: r.rideId,
    day: r.day,
    ...(r.cycles === null ? {} : { cycles: r.cycles }),
    ...(r.hours === null ? {} : { hours: r.hours }),
    ...(r.note === null ? {} : { note: r.note }),
    enteredBy: r.enteredBy,
    enteredByName: r.enteredByName,
    enteredAt: r.enteredAt,
    source: r.source,
  };
}

/** A ride's log, newest day first. */
export function listRunningLog(
  db: Pick<Db, 'select'>,
  rideId: string,
  limit = RUNNING_LOG_LIST_LIMIT,
): RunningLogRow[] {
  return db
    .select(rowColumns)
    .from(runningLog)
    .innerJoin(users, eq(users.id, runningLog.enteredBy))
    .where(eq(runningLog.rideId, rideId))
    .orderBy(desc(runningLog.day))
    .limit(limit)
    .all()
    .map(toRow);
}

/** What the life's accumulation reads: every day of the log (or from a day on), oldest first. */
export function runningLogDays(
  db: Pick<Db, 'select'>,
  rideId: string,
  fromDay?: string,
): { day: string; cycles: number | null; hours: number | null }[] {
  return db
    .select({ day: runningLog.day, cycles: runningLog.cycles, hours: runningLog.hours })
    .from(runningLog)
    .where(
      fromDay
        ? and(eq(runningLog.rideId, rideId), gte(runningLog.day, fromDay))
        : eq(runningLog.rideId, rideId),
    )
    .orderBy(asc(runningLog.day))
    .all();
}

function findDay(db: Pick<Db, 'select'>, rideId: string, day: string): RunningLogRow | null {
  const r = db
    .select(rowColumns)
    .from(runningLog)
    .innerJoin(users, eq(users.id, runningLog.enteredBy))
    .where(and(eq(runningLog.rideId, rideId), eq(runningLog.day, day)))
    .get();
  return r ? toRow(r) : null;
}

function amountText(e: Pick<RunningLogEntry, 'cycles' | 'hours'>): string {
  const parts = [];
  if (e.cycles !== undefined) parts.push(`${e.cycles} cycles`);
  if (e.hours !== undefined) parts.push(`${e.hours} h`);
  return parts.join(', ');
}

/** The audit's record of a day: what the operator gave, without who and when (the entry itself says). */
const auditValue = (r: RunningLogRow) => ({
  day: r.day,
  cycles: r.cycles ?? null,
  hours: r.hours ?? null,
  note: r.note ?? null,
  source: r.source,
});

/** Inserts or replaces one day inside the caller's transaction, with its audit entry. */
function putDay(
  tx: Db,
  ride: { id: string; name: string },
  userId: string,
  entry: RunningLogEntry,
  source: RunningLogSource,
  now: Date,
): { entry: RunningLogRow; replaced: boolean } {
  const before = findDay(tx, ride.id, entry.day);
  const values = {
    cycles: entry.cycles ?? null,
    hours: entry.hours ?? null,
    note: entry.note ? entry.note : null,
    enteredBy: userId,
    enteredAt: now.toISOString(),
    source,
  };
  tx.insert(runningLog)
    .values({ rideId: ride.id, day: entry.day, ...values })
    .onConflictDoUpdate({ target: [runningLog.rideId, runningLog.day], set: values })
    .run();
  const after = findDay(tx, ride.id, entry.day)!;
  recordAudit(tx, {
    userId,
    entity: 'ride',
    entityId: ride.id,
    action: before ? 'update' : 'create',
    rideId: ride.id,
    summary: `${ride.name}: running log ${entry.day} ${before ? 'replaced' : 'added'} (${amountText(entry)}${source === 'csv' ? ', from a CSV file' : ''})`,
    before: before ? { runningLog: auditValue(before) } : null,
    after: { runningLog: auditValue(after) },
  });
  return { entry: after, replaced: before !== null };
}

function assertDay(day: string, today: string, path: string): void {
  const problem = dayProblem(day, today);
  if (problem)
    throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
      { path, message: problem },
    ]);
}

/** One day, typed. `scope` limits operators to their company's rides (others: 404). */
export function saveRunningLogDay(
  db: Db,
  rideId: string,
  scope: string | null,
  userId: string,
  entry: RunningLogEntry,
  now: Date,
  today: string,
): { entry: RunningLogRow; replaced: boolean } {
  const ride = mustFindRide(db, rideId, scope);
  assertDay(entry.day, today, 'day');
  return db.transaction((tx) => {
    const saved = putDay(tx, ride, userId, entry, 'typed', now);
    // The log moves the wear projections by cycles, and with them the ride's flags in the review queue.
    refreshRideLifeFlags(tx, ride.id, queueDay(db, now), now);
    return saved;
  });
}

/** Days from a CSV file (already checked whole): all saved in one transaction, or none. */
export function importRunningLog(
  db: Db,
  rideId: string,
  scope: string | null,
  userId: string,
  entries: readonly RunningLogEntry[],
  now: Date,
): { saved: number; replaced: number } {
  const ride = mustFindRide(db, rideId, scope);
  return db.transaction((tx) => {
    let replaced = 0;
    for (const entry of entries) if (putDay(tx, ride, userId, entry, 'csv', now).replaced) replaced++;
    refreshRideLifeFlags(tx, ride.id, queueDay(db, now), now);
    return { saved: entries.length, replaced };
  });
}
