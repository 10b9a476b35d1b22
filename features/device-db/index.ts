/** What other features may use from device-db: everything else in the folder is its own. */
export type { DeviceDb } from '@/features/device-db/connection';
export { listDrafts, loadDraft, saveDraft, submitDraft } from '@/features/device-db/drafts';
export { fieldKeys } from '@/features/device-db/field-keys';
export { countOutbox, getOutboxItem, listOutbox, requeueRejected } from '@/features/device-db/outbox';
export type { OutboxIssue, OutboxItem } from '@/features/device-db/outbox';
export {
  getPhotoBytes,
  getPhotoDataUri,
  listPhotoBlobs,
  markPhotoUploaded,
  putPhotoBlob,
} from '@/features/device-db/photos';
export type { PhotoBlob } from '@/features/device-db/photos';
export { DeviceDbProvider, useDeviceDb } from '@/features/device-db/provider';
export { getAllSyncMeta, getSyncMeta, setSyncMeta } from '@/features/device-db/sync-meta';
