/** What other features may render or hook into from sync (needs the app's runtime). */
export { BackgroundSync } from '@/features/sync/background-sync';
export { useOnline } from '@/features/sync/online-state';
export type { SyncStatus } from '@/features/sync/sync-controller';
export type { SyncProgress } from '@/features/sync/sync-progress';
export { UpdatePrompt } from '@/features/sync/update-prompt';
export { useSyncStatus } from '@/features/sync/use-sync-status';
export type { SyncStatusHook } from '@/features/sync/use-sync-status';
export { SyncProgressView } from '@/features/sync/sync-progress-view';
