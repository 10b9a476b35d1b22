import { email, nullableText, requiredText } from '@/features/registry/schema/fields';
import { pageSchema, pagingQuerySchema, searchQuery, sortQuery } from '@/lib/list-params';
import { z } from 'zod';

import { companyKinds, noticeUnitSystems, paperSizes } from '@/lib/vocabulary';

// ——— operator companies ———

const companyContactSchema = z.object({
  name: requiredText(80),
  role: nullableText(80).optional(),
  email: z
    .union([email(), z.literal(''), z.null()])
    .optional()
    .transform((v) => (v ? v : null)),
  phone: nullableText(40).optional(),
});

/** A contact as stored and returned: every field present, null when not given. */
export const storedContactSchema = z.object({
  name: z.string(),
  role: z.string().nullable(),
  email: z.string().nullable(),
  phone: z.string().nullable(),
});
export type CompanyContact = z.infer<typeof storedContactSchema>;

/** POST /api/companies (always an operator company); PATCH takes any subset. */
export const companyInputSchema = z.object({
  name: requiredText(120),
  /** Where notices go. */
  noticeEmails: z.array(email()).max(20, 'At most 20 addresses').optional(),
  phone: nullableText(40).optional(),
  address: nullableText(300).optional(),
  contacts: z.array(companyContactSchema).max(30, 'At most 30 contacts').optional(),
  /** The units and paper of the company's notices; SI and A4 unless chosen. */
  noticeUnits: z.enum(noticeUnitSystems, { error: 'SI or US customary' }).optional(),
  noticePaper: z.enum(paperSizes, { error: 'A4 or Letter' }).optional(),
});
export type CompanyInput = z.output<typeof companyInputSchema>;
export const companyPatchSchema = companyInputSchema.partial();

export const companySchema = z.object({
  id: z.string(),
  kind: z.enum(companyKinds),
  name: z.string(),
  noticeEmails: z.array(z.string()),
  phone: z.string().nullable(),
  address: z.string().nullable(),
  contacts: z.array(storedContactSchema),
  noticeUnits: z.enum(noticeUnitSystems),
  noticePaper: z.enum(paperSizes),
  createdAt: z.string(),
  siteCount: z.number().int(),
  rideCount: z.number().int(),
});
export type Company = z.infer<typeof companySchema>;

export const companySortKeys = ['name', 'createdAt'] as const;
export const companyListQuerySchema = pagingQuerySchema.extend({
  q: searchQuery(),
  sort: sortQuery(companySortKeys).optional(),
});
export const companyListResponseSchema = pageSchema.extend({ companies: z.array(companySchema) });
export const companyResponseSchema = z.object({ company: companySchema });
