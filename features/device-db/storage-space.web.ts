/**
 * The browser's word on storage (the Storage API: `navigator.storage`). Browsers without it, or that
 * refuse it (some private modes), answer null / `unknown`, never an error: storage facts only inform.
 */
import type { StoragePersistence, StorageSpace } from '@/features/device-db/storage-space-types';

type StorageManagerLike = {
  estimate?: () => Promise<{ usage?: number; quota?: number }>;
  persisted?: () => Promise<boolean>;
  persist?: () => Promise<boolean>;
};

const manager = (): StorageManagerLike | null =>
  (globalThis as { navigator?: { storage?: StorageManagerLike } }).navigator?.storage ?? null;

async function persistence(storage: StorageManagerLike | null): Promise<StoragePersistence> {
  if (!storage?.persisted) return 'unknown';
  try {
    return (await storage.persisted()) ? 'persisted' : 'best_effort';
  } catch {
    return 'unknown';
  }
}

export async function readStorageSpace(): Promise<StorageSpace | null> {
  const storage = manager();
  if (!storage?.estimate) return null;
  let estimate: { usage?: number; quota?: number };
  try {
    estimate = await storage.estimate();
  } catch {
    return null;
  }
  const { usage, quota } = estimate;
  if (typeof quota !== 'number' || !Number.isFinite(quota) || quota <= 0) return null;
  const used = typeof usage === 'number' && Number.isFinite(usage) ? usage : null;
  return {
    usedBytes: used,
    availableBytes: Math.max(0, quota - (used ?? 0)),
    totalBytes: quota,
    persistence: await persistence(storage),
  };
}

let asked: Promise<StoragePersistence> | null = null;

/**
 * Asks once per page load for storage the browser will not clear by itself (some browsers ask the
 * person, others decide from how the site is used). Already granted: nothing is asked.
 */
export function requestPersistentStorage(): Promise<StoragePersistence> {
  asked ??= (async () => {
    const storage = manager();
    const now = await persistence(storage);
    if (now !== 'best_effort' || !storage?.persist) return now;
    try {
      return (await storage.persist()) ? 'persisted' : 'best_effort';
    } catch {
      return 'best_effort';
    }
  })();
  return asked;
}

/** Tests start each case from a page that has not asked yet. */
export function forgetPersistenceRequest(): void {
  asked = null;
}
