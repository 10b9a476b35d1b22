import { PaperSizeDownload, downloadPdf, pdfFileName } from '@/features/api/ui';

/**
 * The inspector's own copy of a sent inspection as a PDF: the share sheet on a phone, a download on the
 * web. The server makes it from the record it accepted, so it needs a connection; the record itself
 * stays on the phone either way.
 */
export function ReportDownload({
  inspection,
}: {
  inspection: { id: string; rideName: string; submittedAt: string | null };
}) {
  return (
    <PaperSizeDownload
      label="My report"
      what={`the inspection report of ${inspection.rideName}`}
      progressLabel={`Inspection report of ${inspection.rideName}`}
      failure="The report could not be fetched."
      offline="No connection: the report is made by the server, so download it when you have signal."
      fetch={(size, onProgress) =>
        downloadPdf(
          `/api/inspections/${encodeURIComponent(inspection.id)}/report.pdf?size=${size}`,
          pdfFileName(
            `inspection-${inspection.rideName}-${(inspection.submittedAt ?? '').slice(0, 10)}`,
            size,
          ),
          onProgress,
        )
      }
    />
  );
}
