/**
 * The inspection body's instrument register and its declaration text: shapes shared by the server's
 * validation, the admin screens, the pull and the phone's reading form. Pure zod, no React.
 *
 * Calibration rule (also in README): an instrument may be used up to and including its calibration due
 * date; from the day after, the phone refuses it and the server refuses a reading taken with it. Within
 * `CALIBRATION_WARNING_DAYS` of the due date the phone flags it. Dates compare as UTC calendar dates.
 */
import { z } from 'zod';

import {
  type ReadingKind,
  instrumentMethods,
  readingKinds,
  readingKindSchema,
  readingMethods,
} from '@/features/records/schema';
import { daysBetween, formatDate, isoDay } from '@/lib/dates';

export type ReadingMethod = (typeof readingMethods)[number];
export { instrumentMethods };

/** How many days before its due date an instrument is flagged on the phone. */
const CALIBRATION_WARNING_DAYS = 14;

/**
 * The methods an inspector can choose for each kind of reading (common practice for amusement-ride pin,
 * bushing and motion checks). `tap_timer` is set only by the tap timer itself, `typed` only by older app
 * versions, so neither is offered.
 */
export const methodsForKind: Record<ReadingKind, readonly ReadingMethod[]> = {
  speed: ['tachometer', 'stopwatch', 'other'],
  period: ['stopwatch', 'other'],
  amplitude: ['gauge', 'other'],
  pin_diameter: ['micrometer', 'gauge', 'other'],
  clearance: ['dial_indicator', 'gauge', 'other'],
  other: ['micrometer', 'dial_indicator', 'gauge', 'stopwatch', 'tachometer', 'other'],
};

const instrumentMethodSchema = z.enum(instrumentMethods, { error: 'Choose the kind of instrument' });

/** Short names of the methods for records and lists (the picker uses `methodChoiceLabel`). */
export const readingMethodWords: Record<ReadingMethod, string> = {
  typed: 'Typed in',
  tap_timer: 'Tap timer',
  stopwatch: 'Stopwatch',
  tachometer: 'Tachometer',
  micrometer: 'Micrometer',
  dial_indicator: 'Dial indicator',
  gauge: 'Gauge',
  other: 'Other',
};

/** The picker's words: the short names, with a hint where the short one would leave the inspector asking. */
export const methodChoiceLabel: Record<ReadingMethod, string> = {
  ...readingMethodWords,
  gauge: 'Gauge (feeler, caliper, angle)',
  other: 'Other (say how)',
};

const requiredText = (max: number) =>
  z.string({ error: 'Required' }).trim().min(1, 'Required').max(max, `At most ${max} characters`);
const isoDate = () => z.iso.date({ error: 'Must be a date (YYYY-MM-DD)' });

/** One instrument as the API and the pull send it. `retiredAt` set: kept for old records, never offered. */
export const instrumentSchema = z.object({
  id: z.string().min(1),
  name: z.string(),
  serial: z.string(),
  method: z.enum(readingMethods),
  kinds: z.array(readingKindSchema),
  calibratedOn: z.string().nullable(),
  /** YYYY-MM-DD; null for an instrument that needs no calibration (say why in the notes). */
  calibrationDueOn: z.string().nullable(),
  notes: z.string().nullable(),
  retiredAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Instrument = z.infer<typeof instrumentSchema>;

const instrumentFields = z.object({
  name: requiredText(120),
  serial: requiredText(80),
  method: instrumentMethodSchema,
  kinds: z
    .array(readingKindSchema, { error: 'Choose the readings it measures' })
    .min(1, 'Choose at least one kind of reading')
    .max(readingKinds.length)
    .transform((k) => [...new Set(k)]),
  calibratedOn: isoDate().nullable(),
  calibrationDueOn: isoDate().nullable(),
  notes: z
    .string()
    .trim()
    .max(2000, 'At most 2000 characters')
    .nullable()
    .transform((v) => (v === '' ? null : v)),
  retired: z.boolean({ error: 'Must be true or false' }),
});

const datesInOrder = (v: { calibratedOn?: string | null; calibrationDueOn?: string | null }) =>
  !v.calibratedOn || !v.calibrationDueOn || v.calibrationDueOn >= v.calibratedOn;
const datesMessage = { message: 'Must not be before the calibration date', path: ['calibrationDueOn'] };

/** POST /api/instruments. */
export const instrumentInputSchema = instrumentFields
  .extend({
    calibratedOn: instrumentFields.shape.calibratedOn.optional().default(null),
    notes: instrumentFields.shape.notes.optional().default(null),
    retired: instrumentFields.shape.retired.optional().default(false),
  })
  .refine(datesInOrder, datesMessage);
export type InstrumentInput = z.output<typeof instrumentInputSchema>;

/** PATCH /api/instruments/:id: fields left out stay; the server checks the date order on the result. */
export const instrumentPatchSchema = instrumentFields.partial().refine(datesInOrder, datesMessage);
export type InstrumentPatch = z.output<typeof instrumentPatchSchema>;

export const instrumentResponseSchema = z.object({ instrument: instrumentSchema });
export const instrumentListResponseSchema = z.object({ instruments: z.array(instrumentSchema) });

// ——— calibration ———

export type CalibrationStatus =
  | { state: 'not_required' }
  | { state: 'current'; daysLeft: number }
  | { state: 'due_soon'; daysLeft: number }
  | { state: 'past_due'; daysPast: number };

/** Where an instrument's calibration stands on `onDate` (YYYY-MM-DD): usable through its due date. */
export function calibrationStatus(dueOn: string | null, onDate: string): CalibrationStatus {
  if (dueOn === null) return { state: 'not_required' };
  const daysLeft = daysBetween(onDate, dueOn);
  if (daysLeft < 0) return { state: 'past_due', daysPast: -daysLeft };
  return daysLeft <= CALIBRATION_WARNING_DAYS
    ? { state: 'due_soon', daysLeft }
    : { state: 'current', daysLeft };
}

/** True when a reading taken at `takenAt` (ISO instant) used an instrument past its due date. */
export const pastDueAt = (dueOn: string | null, takenAt: string) =>
  calibrationStatus(dueOn, isoDay(takenAt)).state === 'past_due';

/** The words for a status, e.g. "Calibration due in 6 days (2026-12-09)". */
export function calibrationWords(dueOn: string | null, status: CalibrationStatus): string {
  // In the app's one date format (lib/dates.ts), like every date it shows.
  const due = dueOn === null ? '' : formatDate(dueOn);
  switch (status.state) {
    case 'not_required':
      return 'No calibration date';
    case 'current':
      return `Calibrated, next due ${due}`;
    case 'due_soon':
      return status.daysLeft === 0
        ? `Calibration due today (${due})`
        : `Calibration due in ${status.daysLeft} day${status.daysLeft === 1 ? '' : 's'} (${due})`;
    case 'past_due':
      return `Calibration past due since ${due} — not to be used`;
  }
}

/** The register's instruments an inspector may choose for a reading of `kind` taken by `method`. */
export function instrumentsFor(list: Instrument[], kind: ReadingKind, method: ReadingMethod): Instrument[] {
  return list
    .filter((i) => i.retiredAt === null && i.method === method && i.kinds.includes(kind))
    .sort((a, b) => a.name.localeCompare(b.name) || a.serial.localeCompare(b.serial));
}

/** "Micrometer · Outside micrometer 125–150 mm (MC-2231)", as a record states it; older records show their method. */
export function measuredWithWords(r: {
  method: ReadingMethod;
  instrument?: { name: string; serial: string } | null;
}): string {
  const method = readingMethodWords[r.method];
  if (r.instrument) return `${method} · ${r.instrument.name} (${r.instrument.serial})`;
  return r.instrument === null ? `${method} · none from the register` : method;
}

// ——— the declaration ———

/** Used until an administrator sets the inspection body's own text. */
export const DEFAULT_DECLARATION_TEXT =
  'I carried out this inspection myself, at the ride, on the date recorded. The checklist answers, ' +
  'readings and photos are what I saw and measured, using the methods and instruments stated against ' +
  'each reading. Nothing in this record was filled in on my behalf, and anything I could not check is ' +
  'marked as such.';

/** PUT /api/settings/declaration. */
export const declarationSettingInputSchema = z.object({ text: requiredText(4000) });

export const declarationSettingSchema = z.object({
  text: z.string(),
  /** Null while the default text is in use. */
  updatedAt: z.string().nullable(),
  updatedByName: z.string().nullable(),
});
export type DeclarationSetting = z.infer<typeof declarationSettingSchema>;
export const declarationSettingResponseSchema = z.object({ declaration: declarationSettingSchema });
