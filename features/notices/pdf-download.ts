import { type PaperSize, downloadPdf, pdfFileName } from '@/features/api/ui';

export type { PaperSize } from '@/features/api/ui';

/** The notice's PDF, in the paper size asked for. */
export const downloadNoticePdf = (notice: { id: string; reference: string }, size: PaperSize) =>
  downloadPdf(
    `/api/notices/${encodeURIComponent(notice.id)}/pdf?size=${size}`,
    pdfFileName(notice.reference, size),
  );
