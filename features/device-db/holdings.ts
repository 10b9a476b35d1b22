/**
 * What the phone's database holds, grouped by what it is for: work not yet on the server, and sent work
 * kept for reference until the pruning policy lets it go. Sizes are the stored text and photo bytes;
 * the database file also holds indexes and free pages, given apart.
 */
import { type AnyColumn, not, sql } from 'drizzle-orm';

import { drafts, outbox, photoBlobs } from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db/connection';
import { ownedBy } from '@/features/device-db/device-owner';

type Amount = { count: number; bytes: number };

export type DeviceHoldings = {
  drafts: Amount;
  /** Records queued, being sent, or refused by the server: not on the server. */
  unsentRecords: Amount;
  /** Records the server accepted, kept for reference and corrections. */
  sentRecords: Amount;
  /** Photos not yet on the server (named by a draft or an unsent record, or refused). */
  unsentPhotos: Amount;
  /** Photos the server has. */
  sentPhotos: Amount;
  /**
   * Unsent work another person left sealed on this phone (drafts, records and their photos), as one count
   * and size only: the signed-in person learns that space is taken, never what it is.
   */
  keptForOthers: Amount;
  /** The database file: all pages, and the free ones inside it that a compaction would give back. */
  fileBytes: number;
  freeBytes: number;
};

const amount = (row: { n: number | null; bytes: number | null } | undefined): Amount => ({
  count: Number(row?.n ?? 0),
  bytes: Number(row?.bytes ?? 0),
});

async function pragmaNumber(dev: DeviceDb, name: 'page_count' | 'page_size' | 'freelist_count') {
  const rows = await dev.db.values<[number]>(sql.raw(`PRAGMA ${name}`));
  return Number(rows[0]?.[0] ?? 0);
}

export async function readDeviceHoldings(dev: DeviceDb): Promise<DeviceHoldings> {
  // Bytes, not characters; and a blob's length is known without reading it, unlike a text's.
  const textBytes = (column: AnyColumn) => sql<number>`coalesce(sum(length(CAST(${column} AS BLOB))), 0)`;
  const draftRow = await dev.db
    .select({ n: sql<number>`count(*)`, bytes: textBytes(drafts.json) })
    .from(drafts)
    .where(ownedBy(drafts.authorId))
    .get();
  const outboxRows = await dev.db
    .select({
      sent: sql<number>`${outbox.state} = 'accepted'`,
      n: sql<number>`count(*)`,
      bytes: textBytes(outbox.json),
    })
    .from(outbox)
    .where(ownedBy(outbox.authorId))
    .groupBy(sql`${outbox.state} = 'accepted'`)
    .all();
  const photoRows = await dev.db
    .select({
      sent: sql<number>`${photoBlobs.uploadState} = 'uploaded'`,
      n: sql<number>`count(*)`,
      bytes: sql<number>`coalesce(sum(${photoBlobs.bytes}), 0)`,
    })
    .from(photoBlobs)
    .where(ownedBy(photoBlobs.authorId))
    .groupBy(sql`${photoBlobs.uploadState} = 'uploaded'`)
    .all();
  const others = await dev.db
    .select({
      n: sql<number>`(SELECT count(*) FROM ${drafts} WHERE NOT ${ownedBy(drafts.authorId)})
        + (SELECT count(*) FROM ${outbox} WHERE NOT ${ownedBy(outbox.authorId)} AND ${outbox.state} <> 'accepted')`,
      bytes: sql<number>`(SELECT ${textBytes(drafts.json)} FROM ${drafts} WHERE NOT ${ownedBy(drafts.authorId)})
        + (SELECT ${textBytes(outbox.json)} FROM ${outbox}
           WHERE NOT ${ownedBy(outbox.authorId)} AND ${outbox.state} <> 'accepted')
        + (SELECT coalesce(sum(${photoBlobs.bytes}), 0) FROM ${photoBlobs}
           WHERE ${not(ownedBy(photoBlobs.authorId))} AND ${photoBlobs.uploadState} <> 'uploaded')`,
    })
    .from(sql`(SELECT 1)`)
    .get();
  const pageSize = await pragmaNumber(dev, 'page_size');
  return {
    drafts: amount(draftRow),
    unsentRecords: amount(outboxRows.find((r) => !Number(r.sent))),
    sentRecords: amount(outboxRows.find((r) => Number(r.sent))),
    unsentPhotos: amount(photoRows.find((r) => !Number(r.sent))),
    sentPhotos: amount(photoRows.find((r) => Number(r.sent))),
    keptForOthers: amount(others),
    fileBytes: (await pragmaNumber(dev, 'page_count')) * pageSize,
    freeBytes: (await pragmaNumber(dev, 'freelist_count')) * pageSize,
  };
}

/**
 * Gives the free pages back to the phone (SQLite keeps deleted space inside the file for reuse). It
 * rewrites the whole file, so only on the person's request; a failure changes nothing and is reported.
 */
export async function compactDeviceDb(dev: DeviceDb): Promise<void> {
  await dev.db.run(sql.raw('VACUUM'));
}
