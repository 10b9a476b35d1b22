/**
 * Raw bytes up to the server with XMLHttpRequest, the one browser and React Native API that reports upload
 * progress (fetch does not): a photo in the sync, an NDT report. Around the JSON client, so the caller
 * gives the token; the answer's JSON error is read as the client reads it.
 */
import { ApiRequestError, OfflineError, apiErrorSchema } from '@/lib/api-errors';

export type PutBytes = {
  url: string;
  bytes: Uint8Array;
  mime: string;
  token: string | null;
  /** Past it the upload counts as cut off (retry later). */
  timeoutMs: number;
  /** What goes up, for the messages ("Photo upload", "Report upload"). */
  what: string;
  onProgress?: (sent: number, total: number) => void;
};

/** Resolves once the server answers 200, 201 or 204; rejects with OfflineError or ApiRequestError. */
export function putBytes({ url, bytes, mime, token, timeoutMs, what, onProgress }: PutBytes): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('PUT', url);
    xhr.timeout = timeoutMs;
    xhr.setRequestHeader('Content-Type', mime);
    xhr.setRequestHeader('Accept', 'application/json');
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress?.(e.loaded, e.total);
    };
    xhr.onerror = () => reject(new OfflineError(new Error(`${what}: network error`)));
    xhr.ontimeout = () => reject(new OfflineError(new Error(`${what}: timed out`)));
    xhr.onabort = () => reject(new OfflineError(new Error(`${what}: aborted`)));
    xhr.onload = () => {
      if (xhr.status === 200 || xhr.status === 201 || xhr.status === 204) {
        resolve();
        return;
      }
      // status 0 without onerror: the request never reached the server.
      if (xhr.status === 0) {
        reject(new OfflineError(new Error(`${what}: no answer`)));
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
          : new ApiRequestError(xhr.status, 'http_error', `${what} failed (${xhr.status}).`),
      );
    };
    // A view of exactly these bytes (the Uint8Array may sit in a larger buffer).
    xhr.send(bytes.slice().buffer);
  });
}
