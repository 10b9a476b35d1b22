/** What other features may use from sync: everything else in the folder is its own. */
export { BackgroundSync } from '@/features/sync/background-sync';
export {
  readAssignments,
  readCurrentDesign,
  readDecisions,
  readDesignVersion,
  readRide,
  readRides,
  readTemplates,
} from '@/features/sync/cache';
export { useOnline } from '@/features/sync/online-state';
export type { SyncStatus } from '@/features/sync/sync-controller';
export { UpdatePrompt } from '@/features/sync/update-prompt';
export { useSyncStatus } from '@/features/sync/use-sync-status';
export type { SyncStatusHook } from '@/features/sync/use-sync-status';
