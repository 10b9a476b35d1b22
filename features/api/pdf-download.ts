import { File, Paths } from 'expo-file-system';

import { API_BASE } from '@/features/api/client';
import { OfflineError } from '@/lib/api-errors';
import { tokenStore } from '@/features/session';

export type PaperSize = 'A4' | 'LETTER';

/** Saves a PDF the API makes to the app's documents on a phone; the request carries the session token. */
export async function downloadPdf(apiPath: string, fileName: string): Promise<string> {
  const session = await tokenStore.get();
  try {
    await File.downloadFileAsync(`${API_BASE}${apiPath}`, new File(Paths.document, fileName), {
      headers: session ? { Authorization: `Bearer ${session.token}` } : {},
      idempotent: true,
    });
  } catch (err) {
    throw new OfflineError(err);
  }
  return `Saved ${fileName} to this device’s documents`;
}

/** "PW-2026-0001-A4.pdf": safe on every file system, with the paper size in the name. */
export const pdfFileName = (stem: string, size: PaperSize) =>
  `${stem.replace(/[^\w.-]+/g, '_')}-${size === 'A4' ? 'A4' : 'Letter'}.pdf`;
