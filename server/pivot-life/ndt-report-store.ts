/**
 * NDT report PDFs on the server's disk, one file per content: DATA_DIR/ndt-reports/<sha256>. As with
 * photos (server/sync/photo-store.ts), a file appears only whole (written under a temporary name, flushed,
 * renamed) and its `ndt_reports` row is written after it, so a row always means the bytes are there.
 */
import fs from 'node:fs';
import path from 'node:path';

import { eq } from 'drizzle-orm';

import { ndtReports } from '@/db/server/ndt';
import type { Db } from '@/server/db';
import { writeWhole } from '@/server/files';

/** A scanned report of a few pages fits well inside this; a larger file is refused with 413. */
export const MAX_NDT_REPORT_BYTES = 20 * 1024 * 1024;

/**
 * Whether the bytes are a PDF: the file header `%PDF-` (ISO 32000-1 §7.5.2) at the very start. A
 * Content-Type says nothing about the bytes, so it is never trusted alone.
 */
export function isPdf(bytes: Uint8Array): boolean {
  const header = [0x25, 0x50, 0x44, 0x46, 0x2d]; // %PDF-
  return bytes.length >= header.length && header.every((b, i) => bytes[i] === b);
}

export const ndtReportsDirOf = (dataDir: string) => path.join(dataDir, 'ndt-reports');
export const ndtReportPathOf = (dataDir: string, sha256: string) =>
  path.join(ndtReportsDirOf(dataDir), sha256);

export function findNdtReport(db: Pick<Db, 'select'>, sha256: string) {
  return db.select().from(ndtReports).where(eq(ndtReports.sha256, sha256)).get() ?? null;
}

/** Stores checked bytes (hash and type verified by the caller); `stored` is false when already there. */
export async function storeNdtReport(
  db: Db,
  dataDir: string,
  input: { sha256: string; bytes: Uint8Array; userId: string },
  now: Date,
): Promise<{ stored: boolean }> {
  const file = ndtReportPathOf(dataDir, input.sha256);
  const known = findNdtReport(db, input.sha256);
  if (known && fs.existsSync(file)) return { stored: false };
  await writeWhole(file, input.bytes);
  const inserted = db
    .insert(ndtReports)
    .values({
      sha256: input.sha256,
      bytes: input.bytes.length,
      storedAt: now.toISOString(),
      uploadedBy: input.userId,
    })
    .onConflictDoNothing()
    .run();
  return { stored: inserted.changes > 0 || known !== null };
}
