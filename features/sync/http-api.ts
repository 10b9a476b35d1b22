/**
 * The sync endpoints over HTTP. JSON calls go through the shared API client; photos go up as raw bytes
 * with XMLHttpRequest, the one browser and React Native API that reports upload progress.
 */
import { API_BASE, type ApiFetch, apiFetch } from '@/features/api';
import { ApiRequestError, OfflineError, apiErrorSchema } from '@/lib/api-errors';
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
  const token = await target.getToken();
  await new Promise<void>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('PUT', `${target.baseUrl}/api/photos/${photo.sha256}`);
    xhr.timeout = PHOTO_TIMEOUT_MS;
    xhr.setRequestHeader('Content-Type', photo.mime);
    xhr.setRequestHeader('Accept', 'application/json');
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress?.(e.loaded, e.total);
    };
    xhr.onerror = () => reject(new OfflineError(new Error('Photo upload: network error')));
    xhr.ontimeout = () => reject(new OfflineError(new Error('Photo upload: timed out')));
    xhr.onabort = () => reject(new OfflineError(new Error('Photo upload: aborted')));
    xhr.onload = () => {
      if (xhr.status === 200 || xhr.status === 201 || xhr.status === 204) {
        resolve();
        return;
      }
      // status 0 without onerror: the request never reached the server.
      if (xhr.status === 0) {
        reject(new OfflineError(new Error('Photo upload: no answer')));
        return;
      }
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      const parsed = apiErrorSchema.safeParse(body);
      reject(
        parsed.success
          ? new ApiRequestError(
              xhr.status,
              parsed.data.error.code,
              parsed.data.error.message,
              parsed.data.error.issues,
            )
          : new ApiRequestError(xhr.status, 'http_error', `Photo upload failed (${xhr.status}).`),
      );
    };
    // A view of exactly the photo's bytes (the Uint8Array may sit in a larger buffer).
    xhr.send(photo.bytes.slice().buffer);
  });
}
