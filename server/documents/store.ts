/**
 * PDF documents in the server's storage (server/storage), one object per content: `documents/<sha256>`
 * (on the disk DATA_DIR/documents/<sha256>). As with photos and NDT reports, an object appears only whole
 * and its `documents` row is written after it is durably stored, so a row always means the bytes are there.
 */
import path from 'node:path';

import { eq } from 'drizzle-orm';

import { documents } from '@/db/server/documents';
import type { Db } from '@/server/db';
import { storeContent, storedFolders, type ObjectStorage } from '@/server/storage';

/** A maker's manual of a few hundred scanned pages fits inside this; a larger file is refused with 413. */
export { MAX_DOCUMENT_BYTES } from '@/features/documents/schema';

export const documentKeyOf = (sha256: string) => `${storedFolders.documents}/${sha256}`;
/** Where the disk driver keeps documents when STORAGE_URL is unset. */
export const documentsDirOf = (dataDir: string) => path.join(dataDir, storedFolders.documents);

export function findDocument(db: Pick<Db, 'select'>, sha256: string) {
  return db.select().from(documents).where(eq(documents.sha256, sha256)).get() ?? null;
}

/** The document's bytes, or null when the storage does not hold them. */
export function readDocument(storage: ObjectStorage, sha256: string): Promise<Buffer | null> {
  return storage.get(documentKeyOf(sha256));
}

/** Stores checked bytes (hash and type verified by the caller); `stored` is false when already there. */
export async function storeDocument(
  db: Db,
  storage: ObjectStorage,
  input: { sha256: string; bytes: Uint8Array; userId: string },
  now: Date,
): Promise<{ stored: boolean }> {
  return storeContent(storage, documentKeyOf(input.sha256), input.bytes, {
    known: () => findDocument(db, input.sha256) !== null,
    insert: () =>
      db
        .insert(documents)
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

/**
 * Checks that a record refers to documents the server holds: a 400 naming `path` (the field) for the
 * first hash it does not. Records keep a document's hash, so the file must be uploaded first.
 */
export function missingDocument(db: Pick<Db, 'select'>, hashes: readonly string[]): string | null {
  return hashes.find((h) => findDocument(db, h) === null) ?? null;
}
