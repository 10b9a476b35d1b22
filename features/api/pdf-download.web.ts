import { API_BASE } from '@/features/api/client';
import { OfflineError, errorOfResponse } from '@/lib/api-errors';
import { tokenStore } from '@/features/session';
import { saveBlob } from '@/features/api/save-blob';

export type PaperSize = 'A4' | 'LETTER';

/**
 * Downloads a PDF the API makes (`apiPath` from `/api/…`). A plain link cannot carry the session token,
 * so the bytes are fetched with it and handed to the browser as a file from a temporary Blob URL.
 */
export async function downloadPdf(apiPath: string, fileName: string): Promise<string> {
  const session = await tokenStore.get();
  let res: Response;
  try {
    res = await fetch(`${API_BASE}${apiPath}`, {
      headers: {
        Accept: 'application/pdf',
        ...(session ? { Authorization: `Bearer ${session.token}` } : {}),
      },
    });
  } catch (err) {
    throw new OfflineError(err);
  }
  if (!res.ok) throw await errorOfResponse(res, `The PDF could not be made (${res.status}).`);
  return saveBlob(await res.blob(), fileName);
}

/** "PW-2026-0001-A4.pdf": safe on every file system, with the paper size in the name. */
export const pdfFileName = (stem: string, size: PaperSize) =>
  `${stem.replace(/[^\w.-]+/g, '_')}-${size === 'A4' ? 'A4' : 'Letter'}.pdf`;
