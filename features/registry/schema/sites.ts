import { id, nullableText, requiredText } from '@/features/registry/schema/fields';
import { pageSchema, pagingQuerySchema, searchQuery, sortQuery } from '@/lib/list-params';
import { z } from 'zod';

import { labelsOf, siteKinds, siteKindVocabulary } from '@/lib/vocabulary';

// ——— sites ———

export { siteKinds };
const siteKindSchema = z.enum(siteKinds, { error: `One of ${siteKinds.join(', ')}` });
export const siteKindLabel = labelsOf(siteKindVocabulary);

export const siteInputSchema = z.object({
  name: requiredText(120),
  kind: siteKindSchema,
  address: nullableText(300).optional(),
  locality: nullableText(120).optional(),
  operatorCompanyId: id(),
});
export type SiteInput = z.output<typeof siteInputSchema>;
export const sitePatchSchema = siteInputSchema.partial();

export const siteSchema = z.object({
  id: z.string(),
  name: z.string(),
  kind: siteKindSchema,
  address: z.string().nullable(),
  locality: z.string().nullable(),
  operatorCompanyId: z.string(),
  operatorName: z.string(),
  createdAt: z.string(),
  rideCount: z.number().int(),
});
export type Site = z.infer<typeof siteSchema>;

export const siteSortKeys = ['name', 'kind', 'operator', 'locality'] as const;
export const siteListQuerySchema = pagingQuerySchema.extend({
  q: searchQuery(),
  operatorId: z.string().trim().min(1).optional(),
  kind: siteKindSchema.optional(),
  sort: sortQuery(siteSortKeys).optional(),
});
export const siteListResponseSchema = pageSchema.extend({ sites: z.array(siteSchema) });
export const siteResponseSchema = z.object({ site: siteSchema });
