import { z } from 'zod';

import { documentHashSchema } from '@/features/documents/schema';
import { nullableText, requiredText } from '@/features/registry/schema/fields';
import { isRealIsoDay } from '@/lib/dates';
import { designDocumentKinds } from '@/lib/vocabulary';

// ——— documents on design-data versions ———

/** A calendar day that exists, as YYYY-MM-DD. */
const day = z
  .string({ error: 'A date as YYYY-MM-DD' })
  .trim()
  .refine(isRealIsoDay, 'A date that exists, as YYYY-MM-DD');

/**
 * `POST /api/rides/:id/design/versions/:version/documents`: a PDF uploaded first with
 * `PUT /api/documents/:sha256`, what it is, its title, and the document's own revision and issue date.
 */
export const designDocumentInputSchema = z.object({
  sha256: documentHashSchema,
  kind: z.enum(designDocumentKinds, { error: `One of ${designDocumentKinds.join(', ')}` }),
  title: requiredText(200),
  revision: nullableText(40).optional(),
  issuedOn: z
    .union([day, z.null(), z.literal('')])
    .transform((v) => (v === '' ? null : v))
    .optional(),
});
export type DesignDocumentInput = z.infer<typeof designDocumentInputSchema>;

export const designDocumentParamsSchema = z.object({
  id: requiredText(64),
  version: z.coerce.number({ error: 'A version number' }).int().min(1),
  documentId: requiredText(64),
});

export const designDocumentSchema = z.object({
  id: z.string(),
  rideId: z.string(),
  version: z.number().int(),
  sha256: z.string(),
  kind: z.enum(designDocumentKinds),
  title: z.string(),
  revision: z.string().nullable(),
  issuedOn: z.string().nullable(),
  /** The version it was first attached to; earlier than `version` when carried over to a new version. */
  firstVersion: z.number().int(),
  attachedAt: z.string(),
  attachedByName: z.string().nullable(),
  /** Set when removed from this version; the file stays stored and earlier versions keep theirs. */
  detachedAt: z.string().nullable(),
  detachedByName: z.string().nullable(),
});
export type DesignDocument = z.infer<typeof designDocumentSchema>;

/** A version's documents (attached now), oldest first; `version` null when the ride has no design data. */
export const versionDocumentsSchema = z.object({
  rideId: z.string(),
  rideName: z.string(),
  version: z.number().int().nullable(),
  documents: z.array(designDocumentSchema),
});
export type VersionDocuments = z.infer<typeof versionDocumentsSchema>;

export const designDocumentResponseSchema = z.object({ document: designDocumentSchema });
