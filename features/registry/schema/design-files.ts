import { changeReasonSchema } from '@/features/registry/schema/design';
import { designDataSchema } from '@/features/loads/design-schema';
import { z } from 'zod';

// ——— design data import and export ———

export const designFileFormats = ['csv', 'json'] as const;
export type DesignFileFormat = (typeof designFileFormats)[number];

/**
 * POST /api/rides/:id/design/import as JSON: the file's text (`content`; for JSON files the object itself
 * is accepted too), its format and the reason for the new version. The same can be sent as a text body
 * (Content-Type text/csv, text/plain or application/csv) with `format`, `reason` and `basedOnVersion` in
 * the query.
 */
export const designImportBodySchema = z.object({
  format: z.enum(designFileFormats, { error: 'csv or json' }),
  content: z.union([z.string(), z.record(z.string(), z.unknown())], { error: 'The file’s content' }),
  reason: changeReasonSchema,
  basedOnVersion: z.number().int().min(0).optional(),
});
export const designImportQuerySchema = z.object({
  format: z.enum(designFileFormats, { error: 'csv or json' }).optional(),
  reason: changeReasonSchema.optional(),
  basedOnVersion: z.coerce.number({ error: 'Must be a whole number' }).int().min(0).optional(),
  /** Check the file and report, save nothing. */
  dryRun: z
    .enum(['true', 'false', '1', '0'], { error: 'true or false' })
    .optional()
    .transform((v) => v === 'true' || v === '1'),
});
/** A dry run's answer: the data the file would become. */
export const designImportCheckResponseSchema = z.object({ ok: z.literal(true), data: designDataSchema });

export const designExportQuerySchema = z.object({
  format: z.enum(designFileFormats, { error: 'csv or json' }).default('csv'),
  version: z.coerce.number({ error: 'Must be a whole number' }).int().min(1).optional(),
});
