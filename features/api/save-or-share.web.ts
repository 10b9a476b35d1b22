/**
 * Every file the app hands to a person goes through here; in the browser, as a download. A plain link
 * cannot carry the session token, so a file the API makes is fetched with it and handed to the browser
 * from a temporary Blob URL. The phone's pair (`save-or-share.ts`) opens the share sheet.
 */
import { API_BASE } from '@/features/api/client';
import { type OnDownloadProgress, readBody } from '@/features/api/download-progress';
import type { FileType } from '@/features/api/file-types';
import { saveBlob } from '@/features/api/save-blob';
import { OfflineError, errorOfResponse } from '@/lib/api-errors';
import { tokenStore } from '@/features/session';

/** The word for what a press does here, for labels: a browser downloads. */
export const handOverVerb = 'Download';

/**
 * A file the API makes (`apiPath` from `/api/…`), fetched with the session token. `onProgress` hears the
 * steps: preparing until the answer starts, the bytes as the body arrives, saving.
 */
export async function saveOrShareApiFile(
  apiPath: string,
  fileName: string,
  type: FileType,
  onProgress?: OnDownloadProgress,
): Promise<string> {
  onProgress?.({ step: 'preparing', receivedBytes: 0, totalBytes: null });
  const session = await tokenStore.get();
  let res: Response;
  let blob: Blob;
  try {
    res = await fetch(`${API_BASE}${apiPath}`, {
      headers: { Accept: type.mimeType, ...(session ? { Authorization: `Bearer ${session.token}` } : {}) },
    });
  } catch (err) {
    throw new OfflineError(err);
  }
  if (!res.ok) throw await errorOfResponse(res, `The file could not be made (${res.status}).`);
  try {
    blob = await readBody(res, onProgress);
  } catch (err) {
    // The connection went while the body came.
    throw new OfflineError(err);
  }
  onProgress?.({ step: 'saving', receivedBytes: blob.size, totalBytes: blob.size });
  return saveBlob(blob, fileName);
}

/** A text file made in the page (an export): nothing to fetch, so it works offline. */
export async function saveOrShareText(fileName: string, text: string, type: FileType): Promise<string> {
  return saveBlob(new Blob([text], { type: type.mimeType }), fileName);
}
