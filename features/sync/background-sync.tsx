import { useSyncStatus } from '@/features/sync/use-sync-status';

/**
 * Keeps sync running for as long as it is mounted (connection return, every half minute while anything
 * waits), even on screens that show no sync state. Mount it once inside the signed-in part of the app.
 */
export function BackgroundSync() {
  useSyncStatus();
  return null;
}
