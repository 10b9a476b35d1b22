/**
 * Part replacements: a component fitted to a ride (at a pivot or elsewhere), its serial number and maker,
 * when and by whom it was fitted, what it replaced, and its certificates as PDFs stored by SHA-256. Pure
 * zod, no React: the server validates with it, the app parses with it.
 */
import { z } from 'zod';

import { documentHashSchema } from '@/features/documents/schema';
import { isRealIsoDay } from '@/lib/dates';

const text = (what: string, max: number) =>
  z.string({ error: what }).trim().min(1, what).max(max, `At most ${max} characters`);
const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters`)
    .optional()
    .transform((v) => (v ? v : undefined));

export const partDocumentInputSchema = z.object({
  sha256: documentHashSchema,
  /** What the file is ("Certificate of conformity", "Material certificate 3.1"). */
  title: text('Say what the PDF is', 120),
});

/** `POST /api/rides/:id/parts`. */
export const partReplacementInputSchema = z.object({
  component: text('Which component was fitted', 120),
  /** The pivot of the design in force (its joint number); left out for a part elsewhere on the ride. */
  joint: z.int({ error: 'The pivot (its joint number)' }).min(0, 'Cannot be negative').nullable().optional(),
  serialNumber: text('The new part’s serial number', 80),
  maker: text('Who made the part', 120),
  fittedOn: z
    .string({ error: 'A date as YYYY-MM-DD' })
    .trim()
    .refine(isRealIsoDay, 'A date that exists, as YYYY-MM-DD'),
  fittedBy: text('Who fitted it (a person or company)', 120),
  replacedSerial: optionalText(80),
  note: optionalText(1000),
  /** An earlier record of the same ride that this one corrects. */
  correctsId: z.string().trim().min(1).max(64).optional(),
  documents: z.array(partDocumentInputSchema).max(10, 'At most 10 PDFs on one record').default([]),
});
export type PartReplacementInput = z.input<typeof partReplacementInputSchema>;
export type PartReplacementValues = z.infer<typeof partReplacementInputSchema>;

export const partDocumentSchema = z.object({ sha256: z.string(), title: z.string() });

export const partReplacementSchema = z.object({
  id: z.string(),
  rideId: z.string(),
  component: z.string(),
  joint: z.number().int().nullable(),
  pivotName: z.string().nullable(),
  serialNumber: z.string(),
  maker: z.string(),
  fittedOn: z.string(),
  fittedBy: z.string(),
  replacedSerial: z.string().nullable(),
  note: z.string().nullable(),
  correctsId: z.string().nullable(),
  /** A later record that corrects this one, when there is one. */
  correctedById: z.string().nullable(),
  createdAt: z.string(),
  createdByName: z.string().nullable(),
  documents: z.array(partDocumentSchema),
});
export type PartReplacement = z.infer<typeof partReplacementSchema>;

/** `GET /api/rides/:id/parts`: the ride's replacements newest first, and the pivots a new one may name. */
export const ridePartsSchema = z.object({
  rideId: z.string(),
  rideName: z.string(),
  /** Today at the ride's site: the latest a part can have been fitted. */
  today: z.string(),
  designVersion: z.number().int().nullable(),
  pivots: z.array(z.object({ joint: z.number().int(), name: z.string() })),
  replacements: z.array(partReplacementSchema),
});
export type RideParts = z.infer<typeof ridePartsSchema>;

export const partReplacementCreatedSchema = z.object({ replacement: partReplacementSchema });
