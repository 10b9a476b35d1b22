/**
 * The sync endpoints over HTTP. JSON calls go through the shared API client; photos go up as raw bytes
 * with their progress (`putBytes`).
 */
import { API_BASE, type ApiFetch, apiFetch, putBytes } from '@/features/api';
import { tokenStore } from '@/features/session';
import { pushResultSchema } from '@/features/records/schema';
import type { PhotoUpload, SyncApi } from '@/features/sync/api';

/** A photo of ≤ 1600 px should be up well within this even on a poor signal; past it, retry later. */
const PHOTO_TIMEOUT_MS = 120_000;

/** The server the sync talks to: the app's own client and session unless a test hands its own. */
export type HttpSyncTarget = {
  /** The JSON client (`createApiClient`) that push and pull go through. */
  apiFetch: ApiFetch;
  /** The same server's prefix and token, for the photo upload that goes around the JSON client. */
  baseUrl: string;
  getToken: () => Promise<string | null>;
};

const appTarget: HttpSyncTarget = {
  apiFetch,
  baseUrl: API_BASE,
  getToken: async () => (await tokenStore.get())?.token ?? null,
};

export function createHttpSyncApi(target: HttpSyncTarget = appTarget): SyncApi {
  return {
    push: (batch) =>
      target.apiFetch('/api/sync/push', { method: 'POST', body: batch, schema: pushResultSchema }),
    registerKey: async (key) => {
      await target.apiFetch('/api/devices/keys', { method: 'POST', body: key });
    },
    pull: (cursor) =>
      target.apiFetch(`/api/sync/pull${cursor === null ? '' : `?cursor=${encodeURIComponent(cursor)}`}`),
    putPhoto: (photo, onProgress) => putPhoto(target, photo, onProgress),
  };
}

async function putPhoto(
  target: HttpSyncTarget,
  photo: PhotoUpload,
  onProgress?: (sent: number, total: number) => void,
): Promise<void> {
  await putBytes({
    url: `${target.baseUrl}/api/photos/${photo.sha256}`,
    bytes: photo.bytes,
    mime: photo.mime,
    token: await target.getToken(),
    timeoutMs: PHOTO_TIMEOUT_MS,
    what: 'Photo upload',
    onProgress,
  });
}
