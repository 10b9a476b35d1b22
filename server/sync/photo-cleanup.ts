/**
 * Photos nothing uses are removed after a grace period: bytes uploaded for an inspection that was never
 * sent or was refused, evidence an operator uploaded and never reported, or plain junk within someone's
 * quota. A photo stays while ANY of these names it: an inspection's photos (`inspection_photos`) or its
 * stored record, a finding's photos or its closing evidence, a corrective action, or an issued notice's
 * frozen document. The grace period (PHOTO_GRACE_DAYS) covers the legitimate order "bytes first, then
 * the record or report that uses them" with days to spare.
 */
import { Cron } from 'croner';
import { eq, sql } from 'drizzle-orm';

import { inspectionPhotos, inspections, photos } from '@/db/server/inspections';
import { correctiveActions, notices } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import type { Db } from '@/server/db';
import type { Logger } from '@/server/logger';
import type { ObjectStorage } from '@/server/storage';
import { photoKeyOf, withPhotoLock } from '@/server/sync/photo-store';

const DAY_MS = 86_400_000;

/** The condition "no stored record names photo `p`", as one SQL expression over the photos row `p`. */
const unreferenced = sql`NOT EXISTS (SELECT 1 FROM ${inspectionPhotos} ip WHERE ip.sha256 = p.sha256)
  AND NOT EXISTS (SELECT 1 FROM ${findings} f, json_each(f.photo_shas) j WHERE j.value = p.sha256)
  AND NOT EXISTS (SELECT 1 FROM ${findings} f, json_each(f.close_evidence, '$.photoShas') j
                  WHERE f.close_evidence IS NOT NULL AND j.value = p.sha256)
  AND NOT EXISTS (SELECT 1 FROM ${correctiveActions} ca, json_each(ca.photo_shas) j WHERE j.value = p.sha256)
  AND NOT EXISTS (SELECT 1 FROM ${notices} n WHERE instr(n.document, p.sha256) > 0)
  AND NOT EXISTS (SELECT 1 FROM ${inspections} i WHERE instr(i.record, p.sha256) > 0)`;

/** Photos stored before `cutoff` that nothing names. */
export function unreferencedPhotos(db: Pick<Db, 'all'>, cutoff: Date): string[] {
  return db
    .all<{ sha256: string }>(
      sql`SELECT p.sha256 AS sha256 FROM ${photos} p WHERE p.stored_at < ${cutoff.toISOString()} AND ${unreferenced}`,
    )
    .map((r) => r.sha256);
}

/**
 * Removes the photos stored more than `graceDays` before `now` that nothing names: the row, then the
 * stored bytes. Each row is checked again and deleted in one synchronous step, so no request can attach
 * it in between, and the bytes go before another upload of them can store them again (withPhotoLock).
 */
export async function removeUnreferencedPhotos(
  db: Db,
  storage: ObjectStorage,
  opts: { now: Date; graceDays: number },
): Promise<string[]> {
  const cutoff = new Date(opts.now.getTime() - opts.graceDays * DAY_MS);
  const removed: string[] = [];
  for (const sha256 of unreferencedPhotos(db, cutoff)) {
    // Under the photo's lock: an upload of the same bytes waits until they are gone, then stores them anew.
    const gone = await withPhotoLock(sha256, async () => {
      const deleted = db.transaction((tx) => {
        const still = tx.get<{ ok: number } | undefined>(
          sql`SELECT 1 AS ok FROM ${photos} p WHERE p.sha256 = ${sha256} AND p.stored_at < ${cutoff.toISOString()} AND ${unreferenced}`,
        );
        if (!still) return false;
        tx.delete(photos).where(eq(photos.sha256, sha256)).run();
        return true;
      });
      if (deleted) await storage.remove(photoKeyOf(sha256));
      return deleted;
    });
    if (gone) removed.push(sha256);
  }
  return removed;
}

export type PhotoCleanupJob = { stop: () => void };

/** Runs the clean-up every day at 03:30 UTC (a quiet hour on most sites). */
export function startPhotoCleanup(deps: {
  db: Db;
  storage: ObjectStorage;
  graceDays: number;
  logger?: Logger;
  schedule?: string;
}): PhotoCleanupJob {
  const job = new Cron(deps.schedule ?? '30 3 * * *', { timezone: 'UTC', protect: true }, async () => {
    try {
      const removed = await removeUnreferencedPhotos(deps.db, deps.storage, {
        now: new Date(),
        graceDays: deps.graceDays,
      });
      if (removed.length > 0)
        deps.logger?.info({ removed: removed.length, graceDays: deps.graceDays }, 'unused photos removed');
    } catch (error) {
      deps.logger?.error({ err: error }, 'removing unused photos failed');
    }
  });
  return { stop: () => job.stop() };
}
