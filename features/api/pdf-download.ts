import type { OnDownloadProgress } from '@/features/api/download-progress';
import { fileTypes } from '@/features/api/file-types';
import { saveOrShareApiFile } from '@/features/api/save-or-share';

export type PaperSize = 'A4' | 'LETTER';

/**
 * A PDF the API makes: the share sheet on a phone, a download on the web (`save-or-share.ts`).
 * `onProgress`: the server making it, its bytes arriving, saving (features/api/download-progress.ts).
 */
export const downloadPdf = (
  apiPath: string,
  fileName: string,
  onProgress?: OnDownloadProgress,
): Promise<string> => saveOrShareApiFile(apiPath, fileName, fileTypes.pdf, onProgress);

/** "PW-2026-0001-A4.pdf": safe on every file system, with the paper size in the name. */
export const pdfFileName = (stem: string, size: PaperSize) =>
  `${stem.replace(/[^\w.-]+/g, '_')}-${size === 'A4' ? 'A4' : 'Letter'}.pdf`;
