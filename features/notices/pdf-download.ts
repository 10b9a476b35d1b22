import { type OnDownloadProgress, type PaperSize, downloadPdf, pdfFileName } from '@/features/api/ui';

export type { PaperSize } from '@/features/api/ui';

/** The notice's PDF, in the paper size asked for; `onProgress` hears its steps and bytes. */
export const downloadNoticePdf = (
  notice: { id: string; reference: string },
  size: PaperSize,
  onProgress?: OnDownloadProgress,
) =>
  downloadPdf(
    `/api/notices/${encodeURIComponent(notice.id)}/pdf?size=${size}`,
    pdfFileName(notice.reference, size),
    onProgress,
  );
