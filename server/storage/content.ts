import type { ObjectStorage } from '@/server/storage/types';

/**
 * Stores bytes kept once per content (photos, NDT reports: the key ends in their SHA-256, checked by the
 * caller) and then their row: the object first and durably, the row after, so a row always means the
 * bytes are there. `known` says whether the row exists; `insert` writes it (a no-op on conflict) and
 * answers the rows it changed. `stored` is false when both the row and the bytes were there already.
 */
export async function storeContent(
  storage: ObjectStorage,
  key: string,
  bytes: Uint8Array,
  row: { known: () => boolean; insert: () => number },
): Promise<{ stored: boolean }> {
  const known = row.known();
  if (known && (await storage.has(key))) return { stored: false };
  await storage.put(key, bytes);
  return { stored: row.insert() > 0 || known };
}
