import { Router } from 'express';

import { documentHashParamsSchema } from '@/features/documents/schema';
import { companyScope } from '@/server/auth/scope';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import { operatorMayReadDocument } from '@/server/documents/references';
import { findDocument, MAX_DOCUMENT_BYTES, readDocument, storeDocument } from '@/server/documents/store';
import { assertContentHash } from '@/server/http/content-hash';
import { forbidden, notFound } from '@/server/http/errors';
import { pdfBodyOf, rawPdfBody } from '@/server/http/raw-pdf';
import { validate } from '@/server/http/validate';
import { storageOf } from '@/server/storage';

const byHash = validate({ params: documentHashParamsSchema });
const rawPdf = rawPdfBody(MAX_DOCUMENT_BYTES, 'The document');

/**
 * PDF documents stored by content, which records refer to by SHA-256 (server/documents).
 *
 * - `PUT /documents/:sha256` (anyone signed in) with the PDF's raw bytes (application/pdf or
 *   application/octet-stream, at most 40 MB) → 201 `{ stored: true, sha256 }`, 200 when already held; 415
 *   `not_a_pdf` when the bytes do not start with `%PDF-`, 415 `unsupported_media_type` for another
 *   Content-Type, 413 `payload_too_large`, 400 `hash_mismatch`. Storing a file shows it to nobody new: who
 *   reads it follows the records that refer to it.
 * - `GET /documents/:sha256` → the PDF (staff; an operator only a document a record of one of their
 *   company's rides refers to, server/documents/references.ts; 403 otherwise).
 */
export function documentsRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);

  router.put('/documents/:sha256', auth, byHash, rawPdf, async (req, res) => {
    const { sha256 } = byHash.params(res);
    const body = pdfBodyOf(req, 'document');
    assertContentHash(body, sha256);
    const { stored } = await storeDocument(
      deps.db,
      storageOf(deps.config),
      { sha256, bytes: body, userId: currentUser(res).id },
      nowOf(deps),
    );
    res.status(stored ? 201 : 200).json({ stored, sha256 });
  });

  router.get('/documents/:sha256', auth, byHash, async (_req, res) => {
    const { sha256 } = byHash.params(res);
    const scope = companyScope(currentUser(res));
    if (scope !== null && !operatorMayReadDocument(deps.db, scope, sha256))
      throw forbidden('Operators read the documents of their own rides.');
    if (!findDocument(deps.db, sha256)) throw notFound('The server has no document with this SHA-256.');
    const bytes = await readDocument(storageOf(deps.config), sha256);
    if (!bytes) throw notFound('The document is recorded but its file is missing on the server.');
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="document-${sha256.slice(0, 12)}.pdf"`);
    // Private: behind sign-in. Immutable: the address is the content's own hash.
    res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
    res.send(bytes);
  });

  return router;
}
