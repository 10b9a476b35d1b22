/**
 * Every file the app hands to a person (report and notice PDFs, exports, attachments) goes through here.
 * On a phone: written to the app's cache and offered in the system's share sheet (expo-sharing), from
 * which it can be saved to Files, mailed or printed; where the phone has no share sheet, kept in the
 * app's documents instead. The web's pair (`save-or-share.web.ts`) downloads it.
 */
import { File, Paths } from 'expo-file-system';
import * as Sharing from 'expo-sharing';

import { API_BASE } from '@/features/api/client';
import type { OnDownloadProgress } from '@/features/api/download-progress';
import type { FileType } from '@/features/api/file-types';
import { OfflineError } from '@/lib/api-errors';
import { tokenStore } from '@/features/session';

/** The word for what a press does here, for labels: a phone shares. */
export const handOverVerb = 'Share';

async function handOver(file: File, fileName: string, type: FileType, shared: boolean): Promise<string> {
  if (!shared) return `Saved ${fileName} to this device’s documents`;
  await Sharing.shareAsync(file.uri, { mimeType: type.mimeType, UTI: type.uti, dialogTitle: fileName });
  return `Opened ${fileName} in the share sheet`;
}

/**
 * A file the API makes (`apiPath` from `/api/…`), fetched with the session token. `onProgress` hears the
 * steps: preparing, the bytes as expo-file-system writes them (of the whole when the server said its
 * length), saving.
 */
export async function saveOrShareApiFile(
  apiPath: string,
  fileName: string,
  type: FileType,
  onProgress?: OnDownloadProgress,
): Promise<string> {
  onProgress?.({ step: 'preparing', receivedBytes: 0, totalBytes: null });
  const [session, shared] = await Promise.all([tokenStore.get(), Sharing.isAvailableAsync()]);
  let file: File;
  let received = 0;
  try {
    file = await File.downloadFileAsync(
      `${API_BASE}${apiPath}`,
      new File(shared ? Paths.cache : Paths.document, fileName),
      {
        headers: { Accept: type.mimeType, ...(session ? { Authorization: `Bearer ${session.token}` } : {}) },
        idempotent: true,
        onProgress: ({ bytesWritten, totalBytes }) => {
          received = bytesWritten;
          // -1 when the server sent no Content-Length.
          onProgress?.({
            step: 'downloading',
            receivedBytes: bytesWritten,
            totalBytes: totalBytes > 0 && bytesWritten <= totalBytes ? totalBytes : null,
          });
        },
      },
    );
  } catch (err) {
    throw new OfflineError(err);
  }
  onProgress?.({ step: 'saving', receivedBytes: received, totalBytes: received || null });
  return handOver(file, fileName, type, shared);
}

/** A text file made on the phone (an export): nothing to fetch, so it works offline. */
export async function saveOrShareText(fileName: string, text: string, type: FileType): Promise<string> {
  const shared = await Sharing.isAvailableAsync();
  const file = new File(shared ? Paths.cache : Paths.document, fileName);
  if (file.exists) file.delete();
  file.create();
  file.write(text);
  return handOver(file, fileName, type, shared);
}
