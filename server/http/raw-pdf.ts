/**
 * Uploads of PDF files by their raw bytes (NDT reports, documents): the body parser with a limit whose
 * "too large" is a 413 naming it, and the check that what arrived is a PDF at all.
 */
import express, { type Request, type RequestHandler } from 'express';
import { z } from 'zod';

import { isPdfBytes, megabytes } from '@/features/documents/schema';
import { HttpError } from '@/server/http/errors';

/** The raw body parser for a PDF of at most `limit` bytes; `what` names it in the 413 ("The report"). */
export function rawPdfBody(limit: number, what: string): RequestHandler {
  const parse = express.raw({ type: ['application/pdf', 'application/octet-stream'], limit });
  const tooLarge = z.object({ type: z.literal('entity.too.large'), length: z.number().optional() });
  return (req, res, next) =>
    parse(req, res, (err?: unknown) => {
      const big = tooLarge.safeParse(err);
      if (big.success) {
        const size = big.data.length === undefined ? '' : ` (this one is ${megabytes(big.data.length)})`;
        next(
          new HttpError(
            413,
            'payload_too_large',
            `${what} is larger than the ${megabytes(limit)} limit${size}; send a smaller PDF ` +
              '(scanned pages at a lower resolution).',
          ),
        );
        return;
      }
      next(err);
    });
}

/**
 * The request's body as PDF bytes: 415 `unsupported_media_type` when it came with another Content-Type,
 * 415 `not_a_pdf` when it is empty or does not begin with `%PDF-`. `what` is the file in words ("report").
 */
export function pdfBodyOf(req: Request, what: string): Buffer {
  const body: unknown = req.body;
  if (!Buffer.isBuffer(body))
    throw new HttpError(
      415,
      'unsupported_media_type',
      `Send the ${what} as its raw bytes with Content-Type application/pdf.`,
    );
  // A Content-Type says nothing about the bytes, so it is never trusted alone.
  if (!isPdfBytes(body))
    throw new HttpError(
      415,
      'not_a_pdf',
      body.length === 0
        ? `The upload is empty; send the ${what}’s bytes.`
        : 'The file is not a PDF (it does not begin with %PDF-), so it was not stored.',
    );
  return body;
}
