/** What other features and the server may use from device-db: runs anywhere (no React Native). */
export type { DeviceDb } from '@/features/device-db/connection';
export { listDrafts, loadDraft, saveDraft, submitDraft } from '@/features/device-db/drafts';
export { fieldKeys } from '@/features/device-db/field-keys';
export { countOutbox, getOutboxItem, listOutbox, requeueRejected } from '@/features/device-db/outbox';
export type { OutboxIssue, OutboxItem } from '@/features/device-db/outbox';
export {
  getPhotoBytes,
  getPhotoDataUri,
  listOwnPhotoBlobs,
  listPhotoBlobs,
  markPhotoUploaded,
  putPhotoBlob,
} from '@/features/device-db/photos';
export type { PhotoBlob } from '@/features/device-db/photos';
export { getAllSyncMeta, getSyncMeta, setSyncMeta } from '@/features/device-db/sync-meta';
export {
  bindDeviceOwner,
  countUnsentWork,
  getDeviceOwner,
  ownedBy,
  releaseDeviceOwner,
} from '@/features/device-db/device-owner';
export type { UnsentWork } from '@/features/device-db/device-owner';
export { pruneDevice } from '@/features/device-db/prune';
export {
  currentDeviceKey,
  markDeviceKeyRegistered,
  noteSession,
  signRecord,
} from '@/features/device-db/device-keys';
export type { DeviceKey, RecordSignature } from '@/features/device-db/device-keys';
export type { PruneReport } from '@/features/device-db/prune';
