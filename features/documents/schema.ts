import { z } from 'zod';

/**
 * Stored PDF documents (design reports, makers' manuals and bulletins, part certificates), shared by the
 * phone and the server: a record refers to one by the SHA-256 of its bytes, uploaded first.
 */
export const documentHashSchema = z
  .string({ error: 'Required' })
  .regex(/^[0-9a-f]{64}$/, 'Must be the document’s SHA-256 as 64 lower-case hex digits');

export const documentHashParamsSchema = z.object({ sha256: documentHashSchema });

/** The server's limit, checked on the phone first so a big file fails at once. */
export const MAX_DOCUMENT_BYTES = 40 * 1024 * 1024;

/** The bytes start with the PDF header "%PDF-" (ISO 32000-1 §7.5.2), as the server checks. */
export function isPdfBytes(bytes: Uint8Array): boolean {
  const header = [0x25, 0x50, 0x44, 0x46, 0x2d];
  return bytes.length >= header.length && header.every((b, i) => bytes[i] === b);
}

/** A size limit in words, in binary megabytes as the server's messages give it: "40.0 MB". */
export const megabytes = (n: number) => `${(n / 1048576).toFixed(1)} MB`;
