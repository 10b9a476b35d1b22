/**
 * NDT report PDFs in the server's storage (server/storage), one object per content:
 * `ndt-reports/<sha256>` (on the disk DATA_DIR/ndt-reports/<sha256>). As with photos
 * (server/sync/photo-store.ts), an object appears only whole and its `ndt_reports` row is written after it
 * is durably stored, so a row always means the bytes are there.
 */
import path from 'node:path';

import { eq } from 'drizzle-orm';

import { ndtReports } from '@/db/server/ndt';
import type { Db } from '@/server/db';
import { storeContent, storedFolders, type ObjectStorage } from '@/server/storage';

/** A scanned report of a few pages fits well inside this; a larger file is refused with 413. */
export const MAX_NDT_REPORT_BYTES = 20 * 1024 * 1024;

/** The report's key in the storage. */
export const ndtReportKeyOf = (sha256: string) => `${storedFolders.ndtReports}/${sha256}`;
/** Where the disk driver keeps reports when STORAGE_URL is unset (the layout of every earlier release). */
export const ndtReportsDirOf = (dataDir: string) => path.join(dataDir, storedFolders.ndtReports);

/** The report's bytes, or null when the storage does not hold them. */
export function readNdtReport(storage: ObjectStorage, sha256: string): Promise<Buffer | null> {
  return storage.get(ndtReportKeyOf(sha256));
}

export function findNdtReport(db: Pick<Db, 'select'>, sha256: string) {
  return db.select().from(ndtReports).where(eq(ndtReports.sha256, sha256)).get() ?? null;
}

/** Stores checked bytes (hash and type verified by the caller); `stored` is false when already there. */
export async function storeNdtReport(
  db: Db,
  storage: ObjectStorage,
  input: { sha256: string; bytes: Uint8Array; userId: string },
  now: Date,
): Promise<{ stored: boolean }> {
  return storeContent(storage, ndtReportKeyOf(input.sha256), input.bytes, {
    known: () => findNdtReport(db, input.sha256) !== null,
    insert: () =>
      db
        .insert(ndtReports)
        .values({
          sha256: input.sha256,
          bytes: input.bytes.length,
          storedAt: now.toISOString(),
          uploadedBy: input.userId,
        })
        .onConflictDoNothing()
        .run().changes,
  });
}
