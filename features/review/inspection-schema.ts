/**
 * What the review desk reads about one inspection: `GET /api/inspections/:id` (server/sync/read.ts
 * getInspection, with the server's stored analysis), the recomputed ride cycle for the charts, and the
 * inspection's audit trail. Pure zod, no React. Parsing is deliberately tolerant where the server may grow
 * (unknown fields are dropped, `findings` may be absent), and strict where the screen relies on a value.
 */
import { z } from 'zod';

import {
  checklistAnswerSchema,
  declarationSchema,
  devicePreviewSchema,
  instrumentSnapshotSchema,
  readingKindSchema,
  readingMethods,
} from '@/features/records/schema';
import type { EnvelopeItem, Limit } from '@/features/loads/engine';
import { photoPlaceSchema, photoTakenAtSourceSchema } from '@/features/photos/metadata-schema';
import { CYCLE_RESOLUTIONS } from '@/features/loads/cycle-resolution-schema';
import {
  analysisLifeFields,
  analysisModelFields,
  jointRangesSchema,
  loadCaseKinds,
  seatExtremesSchema,
} from '@/features/records/analysis-schema';
import { auditEntrySchema, inspectionTypeSchema } from '@/features/registry/schema';
import { findingSchema } from '@/features/notices/finding-schema';
import type { QuantityKind } from '@/lib/units';
import { reviewStates } from '@/lib/vocabulary';

export { reviewStates };
export const reviewStateSchema = z.enum(reviewStates);
export type ReviewState = z.infer<typeof reviewStateSchema>;

const envelopeStatusSchema = z.enum(['within', 'near', 'over']);

const quantityKinds = [
  'force',
  'moment',
  'length',
  'lengthSmall',
  'mass',
  'angle',
  'rate',
  'angularAccel',
  'accel',
  'stress',
  'pressure',
  'time',
  'frequency',
] as const satisfies readonly QuantityKind[];

/** JSON turns NaN and ±Infinity into null; read them back as numbers the formatters show as "—". */
const jsonNumber = (whenNull: number) =>
  z
    .number()
    .nullable()
    .transform((v) => v ?? whenNull);

const limitSchema: z.ZodType<Limit> = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('upper'), max: z.number() }),
  z.object({ kind: z.literal('lower'), min: z.number(), nominal: z.number().optional() }),
  z.object({
    kind: z.literal('range'),
    min: z.number().optional(),
    max: z.number().optional(),
    reference: z.number().optional(),
  }),
]);

/** One checked value against its design limit, as the engine wrote it (SI). */
const envelopeItemSchema = z.object({
  id: z.string(),
  label: z.string(),
  quantity: z.enum(quantityKinds),
  value: jsonNumber(Number.NaN),
  limit: limitSchema,
  // An infinite ratio (no allowance left at all) arrives as null.
  ratio: jsonNumber(Number.POSITIVE_INFINITY),
  status: envelopeStatusSchema,
  /** The load case the value comes from; absent from analyses made before load cases. */
  loadCase: z.enum(loadCaseKinds).optional().catch(undefined),
}) satisfies z.ZodType<EnvelopeItem, unknown>;

/** db/server/inspections.ts StoredAnalysis: the server's own load check of the inspection. */
export const storedAnalysisSchema = z.object({
  engineVersion: z.string(),
  designVersionId: z.string(),
  designVersion: z.number().int(),
  status: envelopeStatusSchema.nullable(),
  durationS: z.number(),
  samples: z.number().int(),
  joints: z.array(
    z.object({
      name: z.string(),
      peakForceN: z.number(),
      peakForceAtArmAngleRad: z.number(),
      peakTorqueNm: z.number(),
      /** Analyses before engine 1.2.0 only: the range of the force's size, no longer shown as a range. */
      forceRangeN: z.number().optional(),
      /** Component ranges in the carried body's frame; absent from analyses before engine 1.2.0. */
      ranges: jointRangesSchema.optional().catch(undefined),
    }),
  ),
  seats: z.array(seatExtremesSchema),
  envelope: z.array(envelopeItemSchema),
  server: devicePreviewSchema,
  device: devicePreviewSchema.nullable(),
  differences: z.array(z.string()),
  /** Motion readings far from the design motion that the inspector confirmed; absent when none. */
  confirmedOutOfRange: z
    .array(
      z.object({
        readingId: z.string(),
        label: z.string(),
        kind: z.enum(['speed', 'period', 'amplitude']),
        valueSI: z.number(),
        designSI: z.number(),
        ratio: z.number(),
        confirmedAt: z.string(),
        note: z.string().optional(),
        usedByLoadCheck: z.boolean(),
      }),
    )
    .optional()
    .catch(undefined),
  /** Models, load cases, period checks and warnings; absent from analyses made by engine 1.0.0. */
  ...analysisModelFields,
  /** Fatigue per detail and pin checks; absent from analyses before engine 1.2.0. */
  ...analysisLifeFields,
  /** Rider accelerations measured with the phone in a seat; absent when none were recorded. */
  measuredRider: z
    .array(
      z.object({
        recordId: z.string(),
        seat: z.number().int(),
        name: z.string(),
        cutoffHz: z.number(),
        gxMin: z.number(),
        gxMax: z.number(),
        gzMin: z.number(),
        gzMax: z.number(),
        limits: z.object({
          gx: z.object({ min: z.number().optional(), max: z.number().optional() }).optional(),
          gz: z.object({ min: z.number().optional(), max: z.number().optional() }).optional(),
        }),
      }),
    )
    .optional()
    .catch(undefined),
});
export type StoredAnalysisView = z.infer<typeof storedAnalysisSchema>;

export const inspectionReadingSchema = z.object({
  id: z.string(),
  kind: readingKindSchema,
  joint: z.number().int().nullable(),
  label: z.string(),
  valueSI: z.number(),
  unit: z.string(),
  method: z.enum(readingMethods),
  spreadSI: z.number().nullable(),
  takenAt: z.string(),
  note: z.string().nullable(),
  /** The value as the inspector typed it, in `unit` (from the record); absent from older records. */
  entered: z.string().optional(),
  /** From the record (the readings table keeps no instrument); absent from records made before the register. */
  instrument: instrumentSnapshotSchema.nullable().optional(),
});
export type InspectionReading = z.infer<typeof inspectionReadingSchema>;

export const inspectionPhotoSchema = z.object({
  id: z.string(),
  sha256: z.string(),
  mime: z.string(),
  bytes: z.number(),
  caption: z.string(),
  joint: z.number().int().nullable(),
  checklistItemId: z.string().nullable(),
  takenAt: z.string(),
  /** From the record: where `takenAt` came from and, when the inspector allowed it, the place. */
  takenAtSource: photoTakenAtSourceSchema.optional().catch(undefined),
  place: photoPlaceSchema.optional().catch(undefined),
  /** Whether the bytes have reached the server (the record may arrive first). */
  received: z.boolean(),
  url: z.string(),
});
export type InspectionPhoto = z.infer<typeof inspectionPhotoSchema>;

/** The parts of the accepted record the desk shows; the rest is in `readings` and `photos`. */
const recordSchema = z.object({
  checklist: z.array(checklistAnswerSchema).default([]),
  notes: z.string().optional(),
  preview: devicePreviewSchema.nullable().optional(),
  /** The inspector's declaration at submit; records made before it was asked for have none. */
  declaration: declarationSchema.optional().catch(undefined),
  /** Ride cycles recorded with the phone: what the desk draws of them. */
  motionRecords: z
    .array(
      z.object({
        id: z.string(),
        joint: z.number().int(),
        seat: z.number().int().nullable(),
        cycles: z.number().int(),
        sampleRateHz: z.number(),
        timeS: z.array(z.number()),
        rateRadS: z.array(z.number()),
      }),
    )
    .optional()
    .catch(undefined),
  /** Only what the readings table lacks: the instrument each reading was taken with. */
  readings: z
    .array(
      z.object({
        id: z.string(),
        instrument: instrumentSnapshotSchema.nullable().optional().catch(undefined),
      }),
    )
    .optional()
    .catch(undefined),
});

export const inspectionDetailSchema = z.object({
  id: z.string(),
  rideId: z.string(),
  rideName: z.string(),
  inspectorId: z.string(),
  inspectorName: z.string(),
  type: inspectionTypeSchema,
  startedAt: z.string(),
  submittedAt: z.string(),
  receivedAt: z.string(),
  /** The ride's site's zone (else the inspection body's default): the desk shows times on that clock. */
  siteTimeZone: z.string().optional(),
  designVersionId: z.string().nullable(),
  /** The number of that design-data version (null without design data; absent from older servers). */
  designVersion: z.number().int().nullable().optional(),
  amendsId: z.string().nullable(),
  failedItems: z.number().int(),
  readingCount: z.number().int(),
  photoCount: z.number().int(),
  photosMissing: z.number().int(),
  analysisStatus: envelopeStatusSchema.nullable(),
  analysedAt: z.string().nullable(),
  reviewState: reviewStateSchema,
  reviewedAt: z.string().nullable(),
  templateId: z.string().nullable(),
  templateVersion: z.number().int().nullable(),
  record: recordSchema,
  analysis: storedAnalysisSchema.nullable(),
  analysisNote: z.string().nullable(),
  reviewedByName: z.string().nullable(),
  reviewNote: z.string().nullable(),
  readings: z.array(inspectionReadingSchema),
  photos: z.array(inspectionPhotoSchema),
  amendedBy: z.array(z.object({ id: z.string(), submittedAt: z.string() })).default([]),
  /**
   * Why the person reading may not approve it (they recorded it, and the inspection body does not allow
   * approving one's own), or null; absent from older servers.
   */
  approvalRefusal: z.string().nullable().optional(),
  // Added by the findings work; a shape this screen does not know must not blank the whole page.
  findings: z.array(findingSchema).optional().catch(undefined),
});
export type InspectionDetail = z.infer<typeof inspectionDetailSchema>;

/** `GET /api/inspections/:id`. */
export const inspectionResponseSchema = z.object({ inspection: inspectionDetailSchema });

// ——— the ride cycle, recomputed by the server for the charts ———

const series = z.array(jsonNumber(Number.NaN));
const peakAtSchema = z.object({
  value: z.number(),
  index: z.number().int(),
  timeS: z.number(),
  angleRad: z.number(),
  armAngleRad: z.number(),
});
const seatExtremes = z.object({
  min: z.number(),
  max: z.number(),
  minAtS: z.number(),
  maxAtS: z.number(),
});

/**
 * `GET /api/inspections/:id/cycle`: the same JSON as `POST /api/loads/cycle` (the engine's cycle result
 * with plain arrays), for the inspection's readings on its design version. Only what the charts use.
 * `resolution` 'bounded' means the series hold the instants `sampleIndex` names (every peak kept), not all
 * `samples`; an answer without it (an older server) holds every sample.
 */
export const inspectionCycleSchema = z.object({
  engineVersion: z.string(),
  samples: z.number().int(),
  resolution: z.enum(CYCLE_RESOLUTIONS).default('full'),
  sampleIndex: z.array(z.number().int()).optional(),
  durationS: z.number(),
  timeS: series,
  status: envelopeStatusSchema,
  joints: z.array(
    z.object({
      name: z.string(),
      angleRad: series,
      forceMagnitudeN: series,
      peakForce: peakAtSchema,
    }),
  ),
  seats: z.array(
    z.object({
      name: z.string(),
      gx: series,
      gz: series,
      extremes: z.object({ gx: seatExtremes, gz: seatExtremes }),
    }),
  ),
  envelope: z.array(envelopeItemSchema),
});
export type InspectionCycle = z.infer<typeof inspectionCycleSchema>;

/** `GET /api/inspections/:id/trail`: who did what to the inspection, newest first. */
export const inspectionTrailSchema = z.object({ entries: z.array(auditEntrySchema) });
