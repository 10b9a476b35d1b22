/**
 * A pdfkit document as Pivotwatch's PDFs start: the shipped fonts registered, English, the title shown by
 * viewers, our name as creator and producer, and a creation date taken from the record (not the clock), so
 * the same record renders to the same bytes. `finished` resolves with the bytes once `doc.end()` is called.
 */
import path from 'node:path';

import PDFDocument from 'pdfkit';

import { FONT_FILES, fontDir, fonts } from '@/server/pdf/fonts';

type PdfStart = {
  size: 'A4' | 'LETTER';
  margins: number;
  /** False when the caller adds its first page itself (after setting up its layout). */
  autoFirstPage?: boolean;
  title: string;
  author: string;
  subject: string;
  /** The record's own date (ISO); left out of the file when it does not parse. */
  createdAt: string;
};

export function startPdf(p: PdfStart): { doc: PDFKit.PDFDocument; finished: Promise<Buffer> } {
  const created = new Date(p.createdAt);
  const doc = new PDFDocument({
    size: p.size,
    margins: { top: p.margins, bottom: p.margins, left: p.margins, right: p.margins },
    bufferPages: true,
    ...(p.autoFirstPage === false ? { autoFirstPage: false } : {}),
    font: path.join(fontDir, FONT_FILES.regular),
    lang: 'en',
    displayTitle: true,
    info: {
      Title: p.title,
      Author: p.author,
      Subject: p.subject,
      Creator: 'Pivotwatch',
      Producer: 'Pivotwatch',
      ...(Number.isNaN(created.getTime()) ? {} : { CreationDate: created }),
    },
  });
  for (const [name, data] of Object.entries(fonts())) doc.registerFont(name, data);

  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  return { doc, finished };
}
