/**
 * Photo bytes in the server's storage (server/storage), one object per content: `photos/<sha256>` (on the
 * disk DATA_DIR/photos/<sha256>). An object appears only whole, and its `photos` row is written after it
 * is durably stored, so a row always means the bytes are there; re-sent bytes find the row and are not
 * written again.
 */
import path from 'node:path';

import { eq } from 'drizzle-orm';

import { photos, type photoMimes } from '@/db/server/inspections';
import { jpegMetadataKinds } from '@/lib/jpeg-metadata';
import type { Db } from '@/server/db';
import { storeContent, storedFolders, type ObjectStorage } from '@/server/storage';

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

/**
 * The metadata kinds a JPEG still carries (EXIF, XMP, IPTC, another APP1), each once. Stored photos carry
 * none: the upload route refuses such a JPEG rather than strip it, since stripping would change the bytes
 * the SHA-256 in the signed record names.
 */
export const jpegMetadataOf = (bytes: Uint8Array) => [...new Set(jpegMetadataKinds(bytes))];

/** The photo's key in the storage. */
export const photoKeyOf = (sha256: string) => `${storedFolders.photos}/${sha256}`;
/** Where the disk driver keeps photos when STORAGE_URL is unset (the layout of every earlier release). */
export const photosDirOf = (dataDir: string) => path.join(dataDir, storedFolders.photos);
export const photoPathOf = (dataDir: string, sha256: string) => path.join(photosDirOf(dataDir), sha256);

/** Removes temporary files an interrupted upload left behind (older than an hour, so never a live one). */
export function sweepPartialPhotos(storage: ObjectStorage, now = Date.now()): Promise<number> {
  return storage.sweepPartial(storedFolders.photos, now);
}

/** The photo's bytes, or null when the storage does not hold them. */
export function readPhoto(storage: ObjectStorage, sha256: string): Promise<Buffer | null> {
  return storage.get(photoKeyOf(sha256));
}

const busy = new Map<string, Promise<unknown>>();

/**
 * Runs `fn` alone for this photo in this process: a store and the clean-up's removal of the same bytes
 * never interleave (the removal's await could otherwise delete bytes an upload had just stored again).
 */
export async function withPhotoLock<T>(sha256: string, fn: () => Promise<T>): Promise<T> {
  const run = (busy.get(sha256) ?? Promise.resolve()).catch(() => undefined).then(fn);
  const tail = run.catch(() => undefined);
  busy.set(sha256, tail);
  try {
    return await run;
  } finally {
    if (busy.get(sha256) === tail) busy.delete(sha256);
  }
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
  storage: ObjectStorage,
  input: { sha256: string; mime: PhotoMime; bytes: Uint8Array; userId: string },
  now: Date = new Date(),
): Promise<{ stored: boolean }> {
  // One upload of the same bytes at a time (withPhotoLock): the first stores them, the next finds them.
  return withPhotoLock(input.sha256, () =>
    storeContent(storage, photoKeyOf(input.sha256), input.bytes, {
      known: () => findPhoto(db, input.sha256) !== null,
      insert: () =>
        db
          .insert(photos)
          .values({
            sha256: input.sha256,
            mime: input.mime,
            bytes: input.bytes.length,
            storedAt: now.toISOString(),
            uploadedBy: input.userId,
          })
          .onConflictDoNothing()
          .run().changes,
    }),
  );
}
