/**
 * NDT records: what a technician tested at a pivot and found, with the report as a PDF stored by its
 * SHA-256. Pure zod, no React: the server validates with it, the app parses with it. The methods and the
 * plans (method + interval per pivot) are design data (`features/loads/design-schema.ts`).
 */
import { z } from 'zod';

import { NDT_METHOD_WORDS, ndtMethods } from '@/features/loads/design-schema';
import { ndtDueSchema } from '@/features/pivot-life/schema';

/**
 * A test's outcome against the acceptance level its procedure names (common practice in NDT reporting):
 * nothing recordable, indications within the acceptance level, or indications beyond it.
 */
export const ndtResults = ['no_indications', 'acceptable_indications', 'rejectable_indications'] as const;
export type NdtResult = (typeof ndtResults)[number];
export const ndtResultInfo: Record<NdtResult, { label: string; description: string }> = {
  no_indications: { label: 'No indications', description: 'Nothing recordable was found.' },
  acceptable_indications: {
    label: 'Indications within acceptance',
    description: 'Indications were found and are within the acceptance level of the procedure.',
  },
  rejectable_indications: {
    label: 'Indications beyond acceptance',
    description: 'Indications beyond the acceptance level: a defect to report and act on.',
  },
};

/** Personnel certification levels of EN ISO 9712 (level 1 performs, 2 also interprets, 3 also approves). */
export const ndtLevels = [1, 2, 3] as const;
export type NdtLevel = (typeof ndtLevels)[number];

export { NDT_METHOD_WORDS };

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'A date as YYYY-MM-DD');
const sha256 = z.string().regex(/^[0-9a-f]{64}$/, 'The report’s SHA-256 as 64 lower-case hex digits');

/** `POST /api/rides/:id/ndt-records`. */
export const ndtRecordInputSchema = z.object({
  joint: z.int({ error: 'The pivot (its joint number)' }).min(0, 'Cannot be negative'),
  testedOn: isoDate,
  method: z.enum(ndtMethods, { error: `One of ${ndtMethods.join(', ')}` }),
  technician: z.string({ error: 'Who tested' }).trim().min(1, 'Who tested').max(120),
  level: z.union([z.literal(1), z.literal(2), z.literal(3)], { error: 'The EN ISO 9712 level: 1, 2 or 3' }),
  result: z.enum(ndtResults, { error: `One of ${ndtResults.join(', ')}` }),
  note: z.string().trim().max(1000).optional(),
  /** A report uploaded first with `PUT /api/ndt-reports/:sha256`. */
  reportSha256: sha256.optional(),
});
export type NdtRecordInput = z.infer<typeof ndtRecordInputSchema>;

export const ndtRecordSchema = z.object({
  id: z.string(),
  rideId: z.string(),
  joint: z.number().int(),
  testedOn: isoDate,
  method: z.enum(ndtMethods),
  technician: z.string(),
  level: z.number().int(),
  result: z.enum(ndtResults),
  note: z.string().nullable(),
  reportSha256: z.string().nullable(),
  createdBy: z.string(),
  createdByName: z.string().nullable(),
  createdAt: z.string(),
});
export type NdtRecord = z.infer<typeof ndtRecordSchema>;

/** `GET /api/rides/:id/ndt`: per pivot of the current design, its plans with due states and its records. */
export const rideNdtSchema = z.object({
  rideId: z.string(),
  rideName: z.string(),
  asOf: isoDate,
  designVersion: z.number().nullable(),
  pivots: z.array(
    z.object({
      joint: z.number().int(),
      name: z.string(),
      plans: z.array(
        z.object({ method: z.enum(ndtMethods), intervalDays: z.number().int(), note: z.string().nullable() }),
      ),
      due: z.array(ndtDueSchema),
      /** Newest first. */
      records: z.array(ndtRecordSchema),
    }),
  ),
  /** Records at joints the current design no longer has (kept, never lost). */
  otherRecords: z.array(ndtRecordSchema),
});
export type RideNdt = z.infer<typeof rideNdtSchema>;

/** `POST` answer: the stored record, and a word when its method is not one the pivot's plan lists. */
export const ndtRecordCreatedSchema = z.object({
  record: ndtRecordSchema,
  notInPlan: z.boolean(),
  message: z.string().nullable(),
});
export type NdtRecordCreated = z.infer<typeof ndtRecordCreatedSchema>;
