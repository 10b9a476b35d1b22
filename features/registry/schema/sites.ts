import { id, nullableText, requiredText } from '@/features/registry/schema/fields';
import { pageSchema, pagingQuerySchema, searchQuery, sortQuery } from '@/lib/list-params';
import { z } from 'zod';

import { timeZoneProblem } from '@/lib/dates';
import { labelsOf, siteKinds, siteKindVocabulary } from '@/lib/vocabulary';

// ——— sites ———

export { siteKinds };
const siteKindSchema = z.enum(siteKinds, { error: `One of ${siteKinds.join(', ')}` });
export const siteKindLabel = labelsOf(siteKindVocabulary);

/** An IANA time zone this platform knows (checked with Intl), with a plain error otherwise. */
export const timeZoneSchema = z
  .string()
  .trim()
  .min(1, 'Choose a time zone')
  .max(64)
  .superRefine((zone, ctx) => {
    const problem = timeZoneProblem(zone);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });

/** A site's zone as a form sends it: empty (or null) = the inspection body's default. */
const siteTimeZoneSchema = z
  .string()
  .trim()
  .max(64)
  .superRefine((zone, ctx) => {
    const problem = zone === '' ? null : timeZoneProblem(zone);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  })
  .transform((zone) => (zone === '' ? null : zone));

export const siteInputSchema = z.object({
  name: requiredText(120),
  kind: siteKindSchema,
  address: nullableText(300).optional(),
  locality: nullableText(120).optional(),
  /** The site's IANA time zone; null or absent = the inspection body's default. */
  timeZone: siteTimeZoneSchema.nullable().optional(),
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
  /** As stored: null = the inspection body's default. */
  timeZone: z.string().nullable(),
  /** The zone in force: `timeZone`, else the default. */
  effectiveTimeZone: z.string(),
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

/** The inspection body's default time zone for sites that name none (GET/PUT /api/settings/time-zone). */
export const timeZoneSettingSchema = z.object({
  zone: z.string(),
  updatedAt: z.string().nullable(),
  updatedByName: z.string().nullable(),
});
export type TimeZoneSetting = z.infer<typeof timeZoneSettingSchema>;
export const timeZoneSettingInputSchema = z.object({ zone: timeZoneSchema });
export const timeZoneSettingResponseSchema = z.object({ timeZone: timeZoneSettingSchema });
