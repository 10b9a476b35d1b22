import { File, Paths } from 'expo-file-system';

import { API_BASE, OfflineError } from '@/features/api/client';
import { tokenStore } from '@/features/auth/token-store';

export type PaperSize = 'A4' | 'LETTER';

/** Saves the notice's PDF to the app's documents on a phone; the request carries the session token. */
export async function downloadNoticePdf(
  notice: { id: string; reference: string },
  size: PaperSize,
): Promise<string> {
  const session = await tokenStore.get();
  const name = pdfFileName(notice.reference, size);
  try {
    await File.downloadFileAsync(
      `${API_BASE}/api/notices/${encodeURIComponent(notice.id)}/pdf?size=${size}`,
      new File(Paths.document, name),
      { headers: session ? { Authorization: `Bearer ${session.token}` } : {}, idempotent: true },
    );
  } catch (err) {
    throw new OfflineError(err);
  }
  return `Saved ${name} to this device’s documents`;
}

export const pdfFileName = (reference: string, size: PaperSize) =>
  `${reference.replace(/[^\w.-]+/g, '_')}-${size === 'A4' ? 'A4' : 'Letter'}.pdf`;
