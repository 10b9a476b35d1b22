/**
 * Photo bytes on the server's disk, one file per content: DATA_DIR/photos/<sha256>. A file appears only
 * whole (written to a temporary name, flushed, then renamed), and its `photos` row is written after it,
 * so a row always means the bytes are there; re-sent bytes find the row and are not written again.
 */
import fs from 'node:fs';
import path from 'node:path';

import { eq } from 'drizzle-orm';

import { photos, type photoMimes } from '@/db/server/inspections';
import type { Db } from '@/server/db';
import { TEMP_SUFFIX, writeWhole } from '@/server/files';

type PhotoMime = (typeof photoMimes)[number];

/** Photos are compressed on the phone to a long edge of 1600 px; 8 MB leaves room for any of those. */
export const MAX_PHOTO_BYTES = 8 * 1024 * 1024;

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/**
 * The type the bytes themselves declare: JPEG's SOI marker (FF D8 FF), PNG's 8-byte signature, or a
 * RIFF container of type WEBP. Null for anything else, whatever the request's Content-Type said.
 */
export function sniffImage(bytes: Uint8Array): PhotoMime | null {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
  if (bytes.length >= 8 && PNG_SIGNATURE.every((b, i) => bytes[i] === b)) return 'image/png';
  const ascii = (from: number, to: number) => String.fromCharCode(...bytes.subarray(from, to));
  if (bytes.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'image/webp';
  return null;
}

export const photosDirOf = (dataDir: string) => path.join(dataDir, 'photos');
export const photoPathOf = (dataDir: string, sha256: string) => path.join(photosDirOf(dataDir), sha256);

/** Removes temporary files an interrupted upload left behind (older than an hour, so never a live one). */
export function sweepPartialPhotos(dataDir: string, now = Date.now()): number {
  const dir = photosDirOf(dataDir);
  let removed = 0;
  let names: string[];
  try {
    names = fs.readdirSync(dir);
  } catch {
    return 0;
  }
  for (const name of names) {
    if (!name.endsWith(TEMP_SUFFIX)) continue;
    const file = path.join(dir, name);
    try {
      if (now - fs.statSync(file).mtimeMs > 3_600_000) {
        fs.rmSync(file, { force: true });
        removed++;
      }
    } catch {
      // Gone already (another sweep); nothing to do.
    }
  }
  return removed;
}

export function findPhoto(db: Pick<Db, 'select'>, sha256: string) {
  return db.select().from(photos).where(eq(photos.sha256, sha256)).get() ?? null;
}

/**
 * Stores checked bytes (hash and type already verified). `stored` is false when the server already had
 * them; then nothing is written.
 */
export async function storePhoto(
  db: Db,
  dataDir: string,
  input: { sha256: string; mime: PhotoMime; bytes: Uint8Array; userId: string },
  now: Date = new Date(),
): Promise<{ stored: boolean }> {
  const file = photoPathOf(dataDir, input.sha256);
  const known = findPhoto(db, input.sha256);
  if (known && fs.existsSync(file)) return { stored: false };
  // Two uploads of the same bytes at once both write a whole file under the same name; the row is
  // inserted once, and only the upload whose insert took effect reports that it stored the photo.
  await writeWhole(file, input.bytes);
  const inserted = db
    .insert(photos)
    .values({
      sha256: input.sha256,
      mime: input.mime,
      bytes: input.bytes.length,
      storedAt: now.toISOString(),
      uploadedBy: input.userId,
    })
    .onConflictDoNothing()
    .run();
  return { stored: inserted.changes > 0 || known !== null };
}
