import { type PaperSize, downloadPdf, pdfFileName } from '@/features/api/pdf-download';

export type { PaperSize } from '@/features/api/pdf-download';

/** The notice's PDF, in the paper size asked for. */
export const downloadNoticePdf = (notice: { id: string; reference: string }, size: PaperSize) =>
  downloadPdf(
    `/api/notices/${encodeURIComponent(notice.id)}/pdf?size=${size}`,
    pdfFileName(notice.reference, size),
  );

/** The inspection report's PDF: the inspector's own copy of what they recorded. */
export const downloadInspectionReport = (
  inspection: { id: string; rideName: string; submittedAt: string | null },
  size: PaperSize,
) =>
  downloadPdf(
    `/api/inspections/${encodeURIComponent(inspection.id)}/report.pdf?size=${size}`,
    pdfFileName(`inspection-${inspection.rideName}-${(inspection.submittedAt ?? '').slice(0, 10)}`, size),
  );
