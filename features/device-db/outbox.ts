/** Reading the outbox for the sync status and the "needs attention" list; the sync engine writes it. */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';

import { type OutboxRow, type OutboxState, outbox, outboxStates } from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db/connection';
import { ownedBy } from '@/features/device-db/device-owner';
import { DeviceDataError } from '@/features/device-db/errors';
import type { InspectionRecord } from '@/features/records/schema';

export type OutboxIssue = { path: string; message: string };
export type OutboxItem = Omit<OutboxRow, 'json' | 'issues'> & {
  record: InspectionRecord;
  issues: OutboxIssue[];
};

function toOutboxItem(row: OutboxRow): OutboxItem {
  const { json, issues, ...rest } = row;
  return {
    ...rest,
    record: JSON.parse(json) as InspectionRecord,
    issues: issues ? (JSON.parse(issues) as OutboxIssue[]) : [],
  };
}

/** The signed-in person's outbox rows (another person's stay sealed: see device-owner.ts). */
export async function listOutbox(dev: DeviceDb, states?: OutboxState[]): Promise<OutboxItem[]> {
  const mine = ownedBy(outbox.authorId);
  const rows = await dev.db
    .select()
    .from(outbox)
    .where(states ? and(mine, inArray(outbox.state, states)) : mine)
    .orderBy(asc(outbox.createdAt))
    .all();
  return rows.map(toOutboxItem);
}

export async function getOutboxItem(dev: DeviceDb, id: string): Promise<OutboxItem | null> {
  const row = await dev.db
    .select()
    .from(outbox)
    .where(and(eq(outbox.id, id), ownedBy(outbox.authorId)))
    .get();
  return row ? toOutboxItem(row) : null;
}

export async function countOutbox(dev: DeviceDb): Promise<Record<OutboxState, number>> {
  const rows = await dev.db
    .select({ state: outbox.state, n: sql<number>`count(*)` })
    .from(outbox)
    .where(ownedBy(outbox.authorId))
    .groupBy(outbox.state)
    .all();
  const counts = Object.fromEntries(outboxStates.map((s) => [s, 0])) as Record<OutboxState, number>;
  for (const r of rows) counts[r.state] = Number(r.n);
  return counts;
}

/**
 * Puts a rejected record back in the queue (e.g. after the server was fixed). It goes in a new batch:
 * the old batch id already has its answer on the server.
 */
export async function requeueRejected(dev: DeviceDb, id: string, now = new Date()): Promise<void> {
  await dev.transaction(async (tx) => {
    const row = await tx.db
      .select({ state: outbox.state })
      .from(outbox)
      .where(and(eq(outbox.id, id), ownedBy(outbox.authorId)))
      .get();
    if (!row) throw new DeviceDataError('No such record in the outbox.');
    if (row.state !== 'rejected') throw new DeviceDataError(`The record is ${row.state}, not rejected.`);
    await tx.db
      .update(outbox)
      .set({
        state: 'queued',
        batchId: null,
        issues: null,
        lastError: null,
        attempts: 0,
        nextAttemptAt: null,
        updatedAt: now.toISOString(),
      })
      .where(and(eq(outbox.id, id), eq(outbox.state, 'rejected')))
      .run();
  });
}
