/**
 * PDF files for upload tests: real ones written by pdfkit (whose files begin with the ISO 32000-1 header
 * "%PDF-"), their SHA-256 by Node's crypto, and a supertest parser that keeps a download's bytes.
 */
import { createHash } from 'node:crypto';

import PDFDocument from 'pdfkit';
import type request from 'supertest';

export function pdfBytes(text: string): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4' });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.text(text);
    doc.end();
  });
}

export const sha256Hex = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** Runs a GET keeping the body as bytes, whatever its Content-Type. */
export const asBytes = (req: request.Test) =>
  req.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });
