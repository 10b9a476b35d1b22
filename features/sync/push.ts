/**
 * Sends the outbox in batches of at most 50 records. Each batch's id is written to its rows, in the same
 * transaction that marks them `sending`, before the request leaves: a re-send after a cut connection
 * (or after the app was closed mid-request) reuses it, so the server can answer from what it already
 * stored. Per-record answers: accepted/duplicate → accepted; rejected → kept with the server's reasons;
 * no answer → queued again in a new batch. A failed request puts the whole batch back in the queue.
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';

import { type OutboxRow, outbox } from '@/db/device/schema';
import {
  type DeviceDb,
  type DeviceKey,
  type RecordSignature,
  currentDeviceKey,
  getDeviceOwner,
  markDeviceKeyRegistered,
  ownedBy,
  signRecord,
} from '@/features/device-db';
import type { InspectionRecord, PushResult } from '@/features/records/schema';
import { PUSH_MAX_RECORDS, pushResultSchema } from '@/features/records/schema';
import type { SyncApi } from '@/features/sync/api';
import {
  type OutboxEntry,
  type OutboxEvent,
  type SendFailure,
  classifyFailure,
  isDue,
  transition,
} from '@/features/sync/outbox-machine';
import type { PushProgress } from '@/features/sync/sync-progress';

/**
 * Records per push: as many as the server takes in one (each push is one commit on the server and one round
 * trip on what is often a slow, high-latency link). The byte limit below keeps a push of large records small.
 */
export const MAX_BATCH = PUSH_MAX_RECORDS;
/**
 * A batch also stops growing at this many characters of JSON (one record always goes): records carrying ride
 * cycles recorded with the phone are large, and the server takes at most 16 MB per push.
 */
export const MAX_BATCH_BYTES = 8_000_000;

type PushOptions = {
  newId: () => string;
  now?: () => Date;
  /** Ignore back-off (the inspector pressed "sync now"). */
  force?: boolean;
  batchSize?: number;
  /** Records and batches sent of those due, after each claim and each answer (features/sync/sync-progress.ts). */
  onProgress?: (progress: PushProgress) => void;
};

export type PushReport = {
  batches: number;
  accepted: number;
  rejected: number;
  /** Records put back in the queue by a failed request or a missing answer. */
  requeued: number;
  /** Set when a request failed; the run stops there (the rest waits for the next run). */
  failure: SendFailure | null;
};

const entryOf = (row: OutboxRow): OutboxEntry => ({
  state: row.state,
  attempts: row.attempts,
  batchId: row.batchId,
  lastError: row.lastError,
  issues: row.issues ? JSON.parse(row.issues) : [],
  nextAttemptAt: row.nextAttemptAt,
});

async function writeEntry(tx: DeviceDb, id: string, entry: OutboxEntry, now: Date): Promise<void> {
  await tx.db
    .update(outbox)
    .set({
      state: entry.state,
      attempts: entry.attempts,
      batchId: entry.batchId,
      lastError: entry.lastError,
      issues: entry.issues.length ? JSON.stringify(entry.issues) : null,
      nextAttemptAt: entry.nextAttemptAt,
      updatedAt: now.toISOString(),
    })
    .where(eq(outbox.id, id))
    .run();
}

/**
 * Picks the next batch and marks it `sending` under its batch id, in one transaction. Records left with a
 * batch id by an earlier failure go first, together and under that same id; otherwise up to `size` of
 * the oldest due records get a fresh id.
 */
type Candidate = { id: string; batchId: string | null; bytes: number };

/**
 * The next batch out of the due candidates (in send order): the rows of an earlier failed batch, under its
 * id, else up to `size` fresh rows within the byte limit. One rule for claiming and for counting ahead.
 */
function pickBatch(candidates: Candidate[], size: number): { resendId: string | null; ids: string[] } {
  const resend = candidates.find((c) => c.batchId !== null);
  if (resend)
    return {
      resendId: resend.batchId,
      ids: candidates.filter((c) => c.batchId === resend.batchId).map((c) => c.id),
    };
  return {
    resendId: null,
    ids: withinBytes(candidates.slice(0, size), MAX_BATCH_BYTES).map((c) => c.id),
  };
}

/** How many batches `candidates` take, batch by batch as `pickBatch` would make them. */
function batchesFor(candidates: Candidate[], size: number): number {
  let left = candidates;
  let n = 0;
  while (left.length > 0) {
    const taken = new Set(pickBatch(left, size).ids);
    left = left.filter((c) => !taken.has(c.id));
    n++;
  }
  return n;
}

async function claimBatch(
  dev: DeviceDb,
  opts: { newId: () => string; now: Date; force: boolean; size: number; skip: Set<string> },
): Promise<{ batchId: string; rows: OutboxRow[]; dueRecords: number; batchesAfter: number } | null> {
  return dev.transaction(async (tx) => {
    const candidates = (
      await tx.db
        .select({
          id: outbox.id,
          state: outbox.state,
          batchId: outbox.batchId,
          nextAttemptAt: outbox.nextAttemptAt,
          bytes: sql<number>`length(${outbox.json})`,
        })
        .from(outbox)
        // Only the phone's person's records: another's stay sealed until they sign in again.
        .where(and(inArray(outbox.state, ['queued', 'sending']), ownedBy(outbox.authorId)))
        .orderBy(asc(outbox.createdAt), asc(outbox.id))
        .all()
    ).filter((c) => !opts.skip.has(c.id) && isDue(c, opts.now, opts.force));
    if (candidates.length === 0) return null;

    const picked = pickBatch(candidates, opts.size);
    const batchId = picked.resendId ?? opts.newId();
    const ids = picked.ids;
    const taken = new Set(ids);
    const batchesAfter = batchesFor(
      candidates.filter((c) => !taken.has(c.id)),
      opts.size,
    );

    const rows = await tx.db
      .select()
      .from(outbox)
      .where(inArray(outbox.id, ids))
      .orderBy(asc(outbox.createdAt))
      .all();
    for (const row of rows) {
      const next = transition(entryOf(row), { type: 'send', batchId }, opts.now);
      await writeEntry(tx, row.id, next, opts.now);
    }
    return { batchId, rows, dueRecords: candidates.length, batchesAfter };
  });
}

/** Records queued before phones wrote the author get it from their row (adopted by the phone's person). */
function withAuthor(record: InspectionRecord, authorId: string | null): InspectionRecord {
  return record.authorId === undefined && authorId !== null ? { ...record, authorId } : record;
}

/** The leading rows whose JSON adds up to at most `limit` characters, and always the first. */
function withinBytes<T extends { bytes: number }>(rows: T[], limit: number): T[] {
  let total = 0;
  const out: T[] = [];
  for (const r of rows) {
    total += Number(r.bytes) || 0;
    if (out.length > 0 && total > limit) break;
    out.push(r);
  }
  return out;
}

async function settle(
  dev: DeviceDb,
  rows: OutboxRow[],
  eventFor: (row: OutboxRow) => OutboxEvent,
  now: Date,
) {
  await dev.transaction(async (tx) => {
    for (const row of rows) {
      // Re-read: the row is `sending` now (claimBatch wrote it), the copy in `rows` predates that.
      const current = await tx.db.select().from(outbox).where(eq(outbox.id, row.id)).get();
      if (!current) continue;
      await writeEntry(tx, row.id, transition(entryOf(current), eventFor(current), now), now);
    }
  });
}

/** How the phone names itself beside its key on the person's page (the browser, or the app). */
function deviceLabel(): string {
  const agent = typeof navigator !== 'undefined' ? navigator.userAgent : '';
  const browser = /Edg\//.test(agent)
    ? 'Edge'
    : /Firefox\//.test(agent)
      ? 'Firefox'
      : /Chrom(e|ium)\//.test(agent)
        ? 'Chromium'
        : /Safari\//.test(agent)
          ? 'Safari'
          : null;
  const system = /Android/.test(agent)
    ? 'Android'
    : /iPhone|iPad/.test(agent)
      ? 'iOS'
      : /Windows/.test(agent)
        ? 'Windows'
        : /Mac OS X/.test(agent)
          ? 'macOS'
          : /Linux/.test(agent)
            ? 'Linux'
            : null;
  if (!browser && !system) return 'Pivotwatch app';
  return [browser ?? 'Browser', system].filter(Boolean).join(' on ');
}

/**
 * This sign-in's key, registered with the server before the first record it signed leaves (once: the
 * phone remembers). A key the server has withdrawn is refused there, and the run stops with its words.
 */
async function registeredKey(
  api: SyncApi,
  dev: DeviceDb,
  now: Date,
  known: DeviceKey | null,
): Promise<DeviceKey> {
  if (known?.registeredAt) return known;
  const owner = await getDeviceOwner(dev);
  if (owner === null) throw new Error('Nobody is signed in on this phone.');
  const key = await currentDeviceKey(dev, owner, now);
  if (key.registeredAt) return key;
  await api.registerKey({ publicKey: key.publicKey, label: deviceLabel() });
  await markDeviceKeyRegistered(dev, key.keyId, now);
  return { ...key, registeredAt: now.toISOString() };
}

export async function pushOutbox(api: SyncApi, dev: DeviceDb, options: PushOptions): Promise<PushReport> {
  const clock = options.now ?? (() => new Date());
  const size = Math.min(options.batchSize ?? MAX_BATCH, MAX_BATCH);
  const report: PushReport = { batches: 0, accepted: 0, rejected: 0, requeued: 0, failure: null };
  // Each record is tried at most once per run, so a forced run cannot loop on a record that keeps failing.
  const tried = new Set<string>();
  let keyOfRun: DeviceKey | null = null;

  for (;;) {
    const batch = await claimBatch(dev, {
      newId: options.newId,
      now: clock(),
      force: options.force ?? false,
      size,
      skip: tried,
    });
    if (!batch) break;
    batch.rows.forEach((r) => tried.add(r.id));
    // Counted before the request leaves: the records of this run so far and those still due after it.
    const sentBefore = report.accepted + report.rejected + report.requeued;
    const batchesTotal = report.batches + 1 + batch.batchesAfter;
    const progressOf = (recordsDone: number, batchesDone: number): PushProgress => ({
      records: { done: recordsDone, total: sentBefore + batch.dueRecords },
      batches: { done: batchesDone, total: batchesTotal },
    });
    options.onProgress?.(progressOf(sentBefore, report.batches));
    report.batches++;

    let result: PushResult;
    try {
      const key = await registeredKey(api, dev, clock(), keyOfRun);
      keyOfRun = key;
      const records: InspectionRecord[] = [];
      const signatures: Record<string, RecordSignature> = {};
      for (const row of batch.rows) {
        const queued = JSON.parse(row.json) as InspectionRecord;
        const record = withAuthor(queued, row.authorId);
        records.push(record);
        // Signed as it entered the outbox. A record queued under an earlier sign-in (whose key the server may
        // have withdrawn), before phones signed, or given its author only now, is signed with this sign-in's
        // key as it leaves: the person has signed in with their password since.
        signatures[record.id] =
          row.deviceKeyId === key.keyId && row.deviceSignature && record === queued
            ? { keyId: row.deviceKeyId, signature: row.deviceSignature }
            : await signRecord(key, record);
      }
      result = pushResultSchema.parse(await api.push({ batchId: batch.batchId, records, signatures }));
    } catch (err) {
      const failure = classifyFailure(err);
      await settle(dev, batch.rows, () => ({ type: 'failed', failure }), clock());
      report.requeued += batch.rows.length;
      report.failure = failure;
      // The bar stays where this batch began: its records are back in the queue, not sent.
      break;
    }

    const byId = new Map(result.results.filter((r) => r.id !== null).map((r) => [r.id, r]));
    await settle(
      dev,
      batch.rows,
      (row) => {
        const answer = byId.get(row.id);
        if (!answer) return { type: 'unanswered' };
        if (answer.status === 'rejected') return { type: 'rejected', issues: answer.issues ?? [] };
        return { type: answer.status };
      },
      clock(),
    );
    for (const row of batch.rows) {
      const status = byId.get(row.id)?.status;
      if (status === 'accepted' || status === 'duplicate') report.accepted++;
      else if (status === 'rejected') report.rejected++;
      else report.requeued++;
    }
    options.onProgress?.(progressOf(sentBefore + batch.rows.length, report.batches));
  }
  return report;
}
