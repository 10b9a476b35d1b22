/**
 * The worker thread that draws a notice's PDF (started by render-off-thread.ts, never imported): drawing
 * takes 0.5–1.7 s of synchronous work that would otherwise hold every other request. Photos are read
 * here from the files the main thread found in the database.
 */
import fs from 'node:fs';

import type { NoticeDocument } from '@/features/notices/schema';
import { serveJobs } from '@/server/compute/worker-side';
import { renderNoticePdf } from '@/server/notices/pdf';

export type NoticePdfJob = {
  document: NoticeDocument;
  pageSize: 'A4' | 'LETTER';
  /** SHA-256 → the stored file, for the photos the server holds. */
  photoFiles: Record<string, string>;
};

serveJobs(async (job: NoticePdfJob): Promise<Uint8Array> => {
  const pdf = await renderNoticePdf(job.document, {
    pageSize: job.pageSize,
    loadPhoto: async (sha256) => {
      const file = job.photoFiles[sha256];
      if (!file) return null;
      try {
        return await fs.promises.readFile(file);
      } catch {
        return null;
      }
    },
  });
  return new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.length);
});
