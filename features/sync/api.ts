import type { RecordSignature } from '@/features/device-db';
import type { InspectionRecord, PushResult } from '@/features/records/schema';

export type PhotoUpload = { sha256: string; mime: string; bytes: Uint8Array };

/**
 * The server as the sync engine needs it. The HTTP implementation is `createHttpSyncApi`; tests pass a
 * fake. Failures are thrown as the API client's errors (OfflineError, ApiRequestError).
 */
export type SyncApi = {
  /** POST /api/sync/push, each record with this phone's signature by record id. */
  push(batch: {
    batchId: string;
    records: InspectionRecord[];
    signatures: Record<string, RecordSignature>;
  }): Promise<PushResult>;
  /** POST /api/devices/keys: the server learns this phone's public key for the signed-in person. */
  registerKey(key: { publicKey: string; label: string }): Promise<void>;
  /** PUT /api/photos/:sha256 with the raw bytes; resolves when the server holds them (new or already). */
  putPhoto(photo: PhotoUpload, onProgress?: (sentBytes: number, totalBytes: number) => void): Promise<void>;
  /** GET /api/sync/pull?cursor=… ; the answer is checked by the engine against `pullResponseSchema`. */
  pull(cursor: string | null): Promise<unknown>;
};
