/**
 * The worker thread that draws a notice's PDF (started by render-off-thread.ts, never imported): drawing
 * takes 0.5–1.7 s of synchronous work that would otherwise hold every other request. The main thread
 * reads the photos the server holds from its storage and sends their bytes with the job.
 */
import type { NoticeDocument } from '@/features/notices/schema';
import { serveJobs } from '@/server/compute/worker-side';
import type { NoticeChainMark } from '@/server/ledger/notice-mark';
import { renderNoticePdf } from '@/server/notices/pdf';

export type NoticePdfJob = {
  document: NoticeDocument;
  pageSize: 'A4' | 'LETTER';
  /** SHA-256 → the bytes, for the photos the server holds. */
  photoBytes: Record<string, Uint8Array>;
  chain: NoticeChainMark | null;
};

serveJobs(async (job: NoticePdfJob): Promise<Uint8Array> => {
  const pdf = await renderNoticePdf(job.document, {
    pageSize: job.pageSize,
    chain: job.chain,
    loadPhoto: (sha256) => {
      const bytes = job.photoBytes[sha256];
      return Promise.resolve(bytes ? Buffer.from(bytes.buffer, bytes.byteOffset, bytes.length) : null);
    },
  });
  return new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.length);
});
