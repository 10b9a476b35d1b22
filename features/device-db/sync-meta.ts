import { eq } from 'drizzle-orm';

import { syncMeta } from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db/connection';

const syncMetaKeys = ['pullCursor', 'lastSuccessAt', 'lastAttemptAt', 'lastError'] as const;
type SyncMetaKey = (typeof syncMetaKeys)[number];

export async function getSyncMeta(dev: DeviceDb, key: SyncMetaKey): Promise<string | null> {
  const row = await dev.db.select().from(syncMeta).where(eq(syncMeta.key, key)).get();
  return row?.value ?? null;
}

export async function getAllSyncMeta(dev: DeviceDb): Promise<Partial<Record<SyncMetaKey, string>>> {
  const rows = await dev.db.select().from(syncMeta).all();
  const known = new Set<string>(syncMetaKeys);
  return Object.fromEntries(rows.filter((r) => known.has(r.key)).map((r) => [r.key, r.value]));
}

/** `null` removes the key. */
export async function setSyncMeta(dev: DeviceDb, key: SyncMetaKey, value: string | null): Promise<void> {
  if (value === null) {
    await dev.db.delete(syncMeta).where(eq(syncMeta.key, key)).run();
    return;
  }
  await dev.db
    .insert(syncMeta)
    .values({ key, value })
    .onConflictDoUpdate({ target: syncMeta.key, set: { value } })
    .run();
}
