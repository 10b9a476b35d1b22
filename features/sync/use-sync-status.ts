import { useSyncExternalStore } from 'react';

import { useDeviceDb } from '@/features/device-db/ui';
import { type SyncStatus, getSyncController } from '@/features/sync/sync-controller';

export type SyncStatusHook = SyncStatus & {
  /** Sync at once, ignoring back-off. */
  syncNow: () => Promise<void>;
  /** Re-reads counts, e.g. right after a submit. */
  refresh: () => Promise<void>;
  /** Sends a rejected record again (after the server side was fixed). */
  retryRecord: (id: string) => Promise<void>;
  retryPhoto: (sha256: string) => Promise<void>;
};

/**
 * What is waiting to go to the server and how the last sync went. Mounting it starts background sync
 * (on connection return and every half minute while something waits); unmounting the last user stops it.
 */
export function useSyncStatus(): SyncStatusHook {
  const controller = getSyncController(useDeviceDb());
  const status = useSyncExternalStore(controller.subscribe, controller.getSnapshot, controller.getSnapshot);
  return {
    ...status,
    syncNow: () => controller.syncNow(),
    refresh: controller.refresh,
    retryRecord: controller.retryRecord,
    retryPhoto: controller.retryPhoto,
  };
}
