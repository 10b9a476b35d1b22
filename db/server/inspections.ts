import { sql } from 'drizzle-orm';
import {
  check,
  index,
  integer,
  primaryKey,
  real,
  sqliteTable,
  text,
  type AnySQLiteColumn,
} from 'drizzle-orm/sqlite-core';

import { designVersions, rides, users } from '@/db/server/schema';
import {
  readingKinds,
  readingMethods,
  type DevicePreview,
  type InspectionRecord,
  type ConfirmedOutOfRange,
  type PushResult,
} from '@/features/records/schema';
import type { CycleWarning, EnvelopeItem, LoadCaseKind } from '@/features/loads/engine';
import type {
  JointModel,
  JointRanges,
  PeriodCheck,
  StoredFatigueDetail,
  StoredLoadCase,
  StoredPinCheck,
} from '@/features/records/analysis-schema';
import type { MeasuredRider } from '@/features/records/motion-record-schema';
import {
  envelopeStatuses,
  inspectionTypes,
  photoMimes,
  reviewStates,
  type EnvelopeStatus,
  type ReviewState,
} from '@/lib/vocabulary';
import { col, oneOf } from '@/db/server/checks';

/*
 * Inspections as the phones submit them, and what the server made of them. A submitted inspection is
 * immutable: `record` keeps exactly what was accepted; corrections arrive as new records with `amends_id`.
 * Only the server's analysis (filled in once, after the push is answered) and the review state change.
 */

export { envelopeStatuses, reviewStates };
export type { ReviewState };
export type EnvelopeStatusValue = EnvelopeStatus;
export { photoMimes };

/** The server's own load check of one inspection, as stored and returned. */
export type StoredAnalysis = {
  engineVersion: string;
  /** The design-data version analysed (the phone's, or the ride's current one when the phone sent none). */
  designVersionId: string;
  designVersion: number;
  /** Worst envelope status; null when the design data defines no envelope. */
  status: EnvelopeStatusValue | null;
  durationS: number;
  samples: number;
  joints: {
    name: string;
    peakForceN: number;
    /** The main arm's angle at the peak, where an inspector would look for the worst case. */
    peakForceAtArmAngleRad: number;
    peakTorqueNm: number;
    /**
     * Analyses made before engine 1.2.0 only: max − min of the force's size, which hides a reversal. No
     * longer stored or shown as a range.
     */
    forceRangeN?: number;
    /** Force ranges per component in the carried body's frame (features/records/analysis-schema.ts). */
    ranges?: JointRanges;
  }[];
  seats: { name: string; gxMin: number; gxMax: number; gzMin: number; gzMax: number }[];
  envelope: EnvelopeItem[];
  /** The server's result in the phone's preview shape, and what the phone sent. */
  server: DevicePreview;
  device: DevicePreview | null;
  /** Where the phone's preview and this analysis differ; empty when they agree. */
  differences: string[];
  /**
   * Motion readings far from the design motion that the inspector confirmed (features/inspections/
   * plausibility.ts); absent when there were none, and in analyses made before the rule existed.
   */
  confirmedOutOfRange?: ConfirmedOutOfRange[];
  /**
   * How the analysis was made (features/records/analysis-schema.ts): the model each joint ran, the load
   * cases with their peaks and the governing one, a free swing's period against the measured one, and the
   * result's warnings. Absent from analyses made by engine 1.0.0, which recorded none of it.
   */
  models?: JointModel[];
  loadCases?: StoredLoadCase[];
  governingCase?: LoadCaseKind | null;
  periodChecks?: PeriodCheck[];
  warnings?: CycleWarning[];
  /** Rider accelerations measured in a seat with the phone, beside the computed `seats`; absent when none. */
  measuredRider?: MeasuredRider[];
  /** Per fatigue detail: damage per load case and per ride cycle; absent without fatigue design data. */
  fatigue?: StoredFatigueDetail[];
  /** Per pivot with pin data: EN 1993-1-8 utilisations at the peak force. */
  pinChecks?: StoredPinCheck[];
};

export const inspections = sqliteTable(
  'inspections',
  {
    /** The phone's UUID: re-sending the same inspection can never make a second one. */
    id: text('id').primaryKey(),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    /** Who pushed it; the phone's signed-in user is the inspector. */
    inspectorId: text('inspector_id')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    type: text('type', { enum: inspectionTypes }).notNull(),
    startedAt: text('started_at').notNull(),
    submittedAt: text('submitted_at').notNull(),
    receivedAt: text('received_at').notNull(),
    /** The push batch it arrived in, for tracing a phone's sync. */
    batchId: text('batch_id').notNull(),
    /** Resolved at receipt: the phone's version, or the ride's current one if the phone had none. */
    designVersionId: text('design_version_id').references(() => designVersions.id, { onDelete: 'restrict' }),
    templateId: text('template_id'),
    templateVersion: integer('template_version'),
    amendsId: text('amends_id').references((): AnySQLiteColumn => inspections.id, { onDelete: 'restrict' }),
    /** The record exactly as validated (inspectionRecordSchema's output). */
    record: text('record', { mode: 'json' }).$type<InspectionRecord>().notNull(),
    /** SHA-256 of `record`: a re-sent record is recognised as the same without parsing the stored one. */
    contentSha256: text('content_sha256').notNull(),
    failedItems: integer('failed_items').notNull().default(0),
    /** Null until analysed, and for inspections without design data (see `analysis_note`). */
    analysis: text('analysis', { mode: 'json' }).$type<StoredAnalysis>(),
    /** Why there is no analysis, when there is none after analysing. */
    analysisNote: text('analysis_note'),
    analysisStatus: text('analysis_status', { enum: envelopeStatuses }),
    /** Null means "not yet analysed": the start-up sweep picks these up. */
    analysedAt: text('analysed_at'),
    reviewState: text('review_state', { enum: reviewStates }).notNull().default('submitted'),
    reviewedAt: text('reviewed_at'),
    reviewedBy: text('reviewed_by').references(() => users.id, { onDelete: 'restrict' }),
    reviewNote: text('review_note'),
  },
  (t) => [
    check('inspections_type_check', oneOf(t.type, inspectionTypes)),
    check('inspections_review_state_check', oneOf(t.reviewState, reviewStates)),
    check(
      'inspections_analysis_status_check',
      sql`${col(t.analysisStatus)} IS NULL OR ${oneOf(t.analysisStatus, envelopeStatuses)}`,
    ),
    index('inspections_ride_submitted_idx').on(t.rideId, t.submittedAt),
    index('inspections_inspector_idx').on(t.inspectorId, t.submittedAt),
    index('inspections_review_idx').on(t.reviewState, t.analysisStatus, t.submittedAt),
    index('inspections_reviewed_at_idx').on(t.inspectorId, t.reviewedAt),
    index('inspections_amends_idx').on(t.amendsId),
    index('inspections_analysed_at_idx').on(t.analysedAt),
  ],
);

/**
 * Every reading of every inspection, one row each, for trends and queries (also kept in `record`). Keyed
 * by inspection and the phone's reading id, so an amendment may carry over its original's reading ids.
 */
export const inspectionReadings = sqliteTable(
  'inspection_readings',
  {
    inspectionId: text('inspection_id')
      .notNull()
      .references(() => inspections.id, { onDelete: 'cascade' }),
    id: text('id').notNull(),
    rideId: text('ride_id').notNull(),
    kind: text('kind', { enum: readingKinds }).notNull(),
    joint: integer('joint'),
    label: text('label').notNull(),
    valueSi: real('value_si').notNull(),
    unit: text('unit').notNull(),
    method: text('method', { enum: readingMethods }).notNull(),
    spreadSi: real('spread_si'),
    takenAt: text('taken_at').notNull(),
    note: text('note'),
  },
  (t) => [
    primaryKey({ columns: [t.inspectionId, t.id] }),
    check('inspection_readings_kind_check', oneOf(t.kind, readingKinds)),
    check('inspection_readings_method_check', oneOf(t.method, readingMethods)),
    index('inspection_readings_trend_idx').on(t.rideId, t.kind, t.joint, t.takenAt),
  ],
);

/** Photo bytes, stored once per content (DATA_DIR/photos/<sha256>), however many inspections use them. */
export const photos = sqliteTable(
  'photos',
  {
    sha256: text('sha256').primaryKey(),
    /** From the bytes' own signature, not from what the client said. */
    mime: text('mime', { enum: photoMimes }).notNull(),
    bytes: integer('bytes').notNull(),
    storedAt: text('stored_at').notNull(),
    uploadedBy: text('uploaded_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
  },
  (t) => [
    check('photos_mime_check', oneOf(t.mime, photoMimes)),
    // Each person's upload quota counts their photos in the last hour and day (server/sync/photo-quota.ts).
    index('photos_uploader_idx').on(t.uploadedBy, t.storedAt),
  ],
);

/** A photo as an inspection uses it. No foreign key to `photos`: the record may arrive before the bytes. */
export const inspectionPhotos = sqliteTable(
  'inspection_photos',
  {
    inspectionId: text('inspection_id')
      .notNull()
      .references(() => inspections.id, { onDelete: 'cascade' }),
    id: text('id').notNull(),
    sha256: text('sha256').notNull(),
    /** What the phone declared; the stored bytes' own type is in `photos.mime`. */
    mime: text('mime', { enum: photoMimes }).notNull(),
    bytes: integer('bytes').notNull(),
    caption: text('caption').notNull(),
    joint: integer('joint'),
    checklistItemId: text('checklist_item_id'),
    takenAt: text('taken_at').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.inspectionId, t.id] }),
    check('inspection_photos_mime_check', oneOf(t.mime, photoMimes)),
    index('inspection_photos_sha_idx').on(t.sha256),
  ],
);

/** Push batches already answered: the same batch id gets the same answer, and nothing is written twice. */
export const syncBatches = sqliteTable(
  'sync_batches',
  {
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    batchId: text('batch_id').notNull(),
    receivedAt: text('received_at').notNull(),
    recordCount: integer('record_count').notNull(),
    result: text('result', { mode: 'json' }).$type<PushResult>().notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.batchId] })],
);

export type Inspection = typeof inspections.$inferSelect;
export type InspectionReading = typeof inspectionReadings.$inferSelect;
export type InspectionPhoto = typeof inspectionPhotos.$inferSelect;
export type Photo = typeof photos.$inferSelect;
