/**
 * An inspection as the phone records it and the server stores it. Client-generated UUIDs make every
 * record idempotent: re-sending the same record never creates a second one. Values are SI; `unit`
 * keeps the unit the inspector typed in, for the record.
 */
import { z } from 'zod';

import { photoPlaceSchema, photoTakenAtSourceSchema } from '@/features/photos/metadata-schema';
import { motionRecordsSchema } from '@/features/records/motion-record-schema';
import { inspectionTypeSchema } from '@/features/registry/schema';
import { checkResults, checkResultVocabulary, labelsOf, photoMimes } from '@/lib/vocabulary';

const uuid = () => z.uuid({ error: 'Must be a UUID' });
const isoTime = () => z.iso.datetime({ offset: true, error: 'Must be an ISO date-time' });
const num = () =>
  z.number({ error: (i) => (i.input === undefined ? 'Required' : 'Must be a finite number') });
/** A number as the inspector typed it, normalised (lib/measured-format.ts normaliseEntered): "0.40". */
const enteredText = () =>
  z
    .string()
    .max(40)
    .regex(/^-?\d+(\.\d*)?$/, 'Must be the number as typed: digits with at most one decimal point');

// One list of inspection types for schedules and inspections alike.
export { inspectionTypeLabel, inspectionTypeSchema, inspectionTypes } from '@/features/registry/schema';
export type { InspectionType } from '@/features/registry/schema';

export { checkResults };
export const checkResultSchema = z.enum(checkResults);
export type CheckResult = z.infer<typeof checkResultSchema>;
export const checkResultLabel = labelsOf(checkResultVocabulary);

/** One checklist item's answer; the item's text is copied so the record reads on its own later. */
export const checklistAnswerSchema = z.object({
  itemId: z.string().min(1).max(80),
  area: z.string().max(120),
  text: z.string().min(1).max(500),
  result: checkResultSchema.nullable(),
  note: z.string().max(2000).optional(),
  /** For items that ask for a measurement: the value in SI and the unit it was typed in. */
  measurement: z
    .object({
      valueSI: num(),
      unit: z.string().max(20),
      /** The value exactly as typed, in `unit`; displays echo it and its decimals are its precision. */
      entered: enteredText().optional(),
      /** The reading that holds this value when the item measures a pivot quantity: entered once, shared. */
      readingId: z.string().min(1).max(80).optional(),
      /** The value against its limit as the inspector saw it at entry (features/inspections/checklist-limits). */
      status: z.enum(['within', 'near', 'over']).optional(),
    })
    .nullable()
    .optional(),
  /** Why an item whose value is over its limit is still marked Pass; the server refuses a Pass without it. */
  overLimitReason: z.string().trim().max(1000).optional(),
});
export type ChecklistAnswer = z.infer<typeof checklistAnswerSchema>;

export const readingKinds = ['speed', 'period', 'amplitude', 'pin_diameter', 'clearance', 'other'] as const;
export const readingKindSchema = z.enum(readingKinds);
export type ReadingKind = z.infer<typeof readingKindSchema>;

export const readingKindLabel: Record<ReadingKind, string> = {
  speed: 'Speed',
  period: 'Period',
  amplitude: 'Amplitude',
  pin_diameter: 'Pin diameter',
  clearance: 'Bushing clearance',
  other: 'Other',
};

/** The methods that use a physical instrument: the kinds of instrument the register holds. */
export const instrumentMethods = [
  'stopwatch',
  'tachometer',
  'micrometer',
  'dial_indicator',
  'gauge',
  'other',
] as const;

export const readingMethods = ['typed', 'tap_timer', ...instrumentMethods] as const;

/**
 * The instrument register entry a reading was taken with, copied at the time so the record reads on its
 * own later (the register changes with every calibration). `calibrationDueOn` is YYYY-MM-DD.
 */
export const instrumentSnapshotSchema = z.object({
  id: z.string().min(1).max(80),
  name: z.string().min(1).max(120),
  serial: z.string().max(80),
  calibrationDueOn: z.iso.date({ error: 'Must be a date (YYYY-MM-DD)' }).nullable(),
});
export type InstrumentSnapshot = z.infer<typeof instrumentSnapshotSchema>;

/** The inspector's statement at submit: the inspection body's text as shown, who made it and when. */
export const declarationSchema = z.object({
  text: z.string().trim().min(1).max(4000),
  declaredAt: isoTime(),
  declaredBy: z.string().min(1).max(80),
  declaredByName: z.string().min(1).max(200),
});
export type Declaration = z.infer<typeof declarationSchema>;

/**
 * One measured value. SI by kind: speed rad/s, period s, amplitude rad, diameter and clearance m.
 * `joint` ties it to a pivot (0 = the ground pivot) where it belongs to one.
 */
export const readingSchema = z.object({
  id: uuid(),
  kind: readingKindSchema,
  joint: z.int().min(0).max(9).nullable(),
  label: z.string().trim().min(1).max(120),
  valueSI: num(),
  unit: z.string().max(20),
  /** The value exactly as typed, in `unit` (e.g. "0.40"); its decimals are its precision. */
  entered: enteredText().optional(),
  /** What the inspector chose; the app never picks one for them (older records kept the app's guess). */
  method: z.enum(readingMethods),
  /** Chosen from the register; null when the inspector said none of the register's was used. */
  instrument: instrumentSnapshotSchema.nullable().optional(),
  /** Spread of the measurement (same unit as valueSI), e.g. a tap timer's standard deviation. */
  spreadSI: num().min(0).nullable().optional(),
  takenAt: isoTime(),
  note: z.string().max(2000).optional(),
  /**
   * Present when the value was far from the design motion (features/inspections/plausibility.ts) and the
   * inspector confirmed it rather than measuring again: the design value it was compared with (in the
   * reading's SI unit), the ratio found, when they confirmed, and what they said about it.
   */
  plausibility: z
    .object({
      designSI: num().positive(),
      ratio: num().min(0),
      confirmedAt: isoTime(),
      note: z.string().trim().max(500).optional(),
    })
    .optional(),
});
export type Reading = z.infer<typeof readingSchema>;

/** A photo's record; its bytes travel separately, addressed by their SHA-256. */
export const photoRefSchema = z.object({
  id: uuid(),
  sha256: z.string().regex(/^[0-9a-f]{64}$/, 'Must be a lower-case hex SHA-256'),
  mime: z.enum(photoMimes),
  bytes: z.int().positive(),
  caption: z.string().max(500),
  joint: z.int().min(0).max(9).nullable(),
  checklistItemId: z.string().max(80).nullable(),
  /** When the photo was taken: the camera's EXIF time when it had one, else the device clock at capture. */
  takenAt: isoTime(),
  /** Where `takenAt` came from; absent from records made before phones said. */
  takenAtSource: photoTakenAtSourceSchema.optional(),
  /** Where it was taken, only when the inspector allows it (features/photos/exif.ts `photoFacts`). */
  place: photoPlaceSchema.optional(),
});
export type PhotoRef = z.infer<typeof photoRefSchema>;

/** What the phone computed before submitting, so the server can say where its own analysis differs. */
export const devicePreviewSchema = z.object({
  engineVersion: z.string().max(20),
  status: z.enum(['within', 'near', 'over']).nullable(),
  peakForceN: z.array(num()).max(10),
});
export type DevicePreview = z.infer<typeof devicePreviewSchema>;

/**
 * A test run before opening, as a daily pre-opening check records it (the maker's empty cycles): how many
 * cycles were run and whether the ride behaved. A failed run, like a failed item, means it must not open.
 */
export const testRunSchema = z.object({
  cycles: z.int({ error: 'Must be a whole number' }).min(0).max(1000),
  result: z.enum(['pass', 'fail'], { error: 'pass or fail' }),
  note: z.string().max(2000).optional(),
});
export type TestRun = z.infer<typeof testRunSchema>;

/** A submitted inspection. Immutable once accepted; a correction is a new record with `amendsId`. */
export const inspectionRecordSchema = z.object({
  id: uuid(),
  rideId: z.string().min(1),
  /** The design-data version the inspector's phone held; the server analyses against it. */
  designVersionId: z.string().min(1).nullable(),
  /** The checklist template and version the answers belong to. */
  templateId: z.string().min(1).nullable(),
  templateVersion: z.int().min(1).nullable(),
  type: inspectionTypeSchema,
  /**
   * The user id of the person who recorded it on the phone. The server refuses a record whose author is not
   * the signed-in user, so a shared phone can never send one person's work under another's name. Absent
   * from records stored before phones wrote it (those go under the token's user, as before).
   */
  authorId: z.string().min(1).max(100).optional(),
  startedAt: isoTime(),
  submittedAt: isoTime(),
  checklist: z.array(checklistAnswerSchema).max(500),
  readings: z.array(readingSchema).max(500),
  photos: z.array(photoRefSchema).max(100),
  notes: z.string().max(10_000).optional(),
  preview: devicePreviewSchema.nullable(),
  amendsId: uuid().nullable().optional(),
  /** Required by the server for every record it accepts now; absent from records stored before. */
  declaration: declarationSchema.optional(),
  /** Ride cycles recorded with the phone's motion sensors (features/records/motion-record-schema.ts). */
  motionRecords: motionRecordsSchema.optional(),
  /** A daily pre-opening check's test runs (only that type carries them). */
  testRuns: z.array(testRunSchema).max(20).optional(),
});
export type InspectionRecord = z.infer<typeof inspectionRecordSchema>;

/** The most records one push may carry (the phone's batches are this size, see features/sync/push.ts). */
export const PUSH_MAX_RECORDS = 200;

/** POST /api/sync/push: a batch of records with a key that makes re-sending the batch harmless. */
export const pushBatchSchema = z.object({
  batchId: uuid(),
  records: z.array(z.unknown()).min(1).max(PUSH_MAX_RECORDS),
  /**
   * The phone's signature of each record, by record id: Ed25519 with the key it registered for this
   * sign-in (POST /api/devices/keys) over `recordHashOf(record)` (features/ledger) of the record as parsed by
   * `inspectionRecordSchema`. The server accepts no record without a valid one.
   */
  signatures: z.record(z.string(), z.object({ keyId: z.string(), signature: z.string() })).optional(),
});

/** Per-record outcome: accepted (new or already had), or rejected with reasons naming fields. */
export const pushResultSchema = z.object({
  batchId: z.string(),
  results: z.array(
    z.object({
      id: z.string().nullable(),
      status: z.enum(['accepted', 'duplicate', 'rejected']),
      issues: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
    }),
  ),
});
export type PushResult = z.infer<typeof pushResultSchema>;

/** A reason a draft cannot be sent yet, on its item when it has one. */
export type DraftProblem = { itemId: string | null; message: string };

/** The motion quantities checked for plausibility against the design motion. */
export type MotionReadingKind = 'speed' | 'period' | 'amplitude';

/** A reading the inspector confirmed although it lies far from the design motion, as the analysis reports it. */
export type ConfirmedOutOfRange = {
  readingId: string;
  label: string;
  kind: MotionReadingKind;
  valueSI: number;
  designSI: number;
  ratio: number;
  confirmedAt: string;
  note?: string;
  /** False when a later reading of the same quantity replaced it in the load check. */
  usedByLoadCheck: boolean;
};
