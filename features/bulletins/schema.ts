/**
 * Makers' safety bulletins, shared by the phone and the server: the register's shapes, which rides a
 * bulletin applies to (by maker and model), where it stands on each ride, and the checklist item an open
 * bulletin adds to an inspection.
 */
import { z } from 'zod';

import { documentHashSchema } from '@/features/documents/schema';
import { calendarDate } from '@/features/registry/schema/schedules';
import { nullableText, requiredText } from '@/features/registry/schema/fields';
import { listOf } from '@/features/registry/schema/rides';
import { pageSchema, pagingQuerySchema, searchQuery } from '@/lib/list-params';
import {
  type BulletinSeverity,
  type BulletinState,
  bulletinSeverities,
  bulletinSeverityVocabulary,
  bulletinStates,
  bulletinStateVocabulary,
  labelsOf,
} from '@/lib/vocabulary';

export { bulletinSeverities, bulletinStates };
export type { BulletinSeverity, BulletinState };
export const bulletinSeveritySchema = z.enum(bulletinSeverities);
export const bulletinSeverityLabel = labelsOf(bulletinSeverityVocabulary);
export const bulletinStateLabel = labelsOf(bulletinStateVocabulary);

/**
 * The key makers and models are matched by: case and spaces ignored, so "Orrin Ride Works" / "PX-15"
 * in the register finds a ride entered as "orrin rideworks" / "px-15 ". Unicode lower case, the same on
 * the phone and the server.
 */
export const matchKey = (text: string) => text.toLowerCase().replace(/\s+/gu, '');

/** Whether a bulletin for `maker` and `models` applies to a ride with this maker and model. */
export function bulletinApplies(
  bulletin: { maker: string; models: readonly string[] },
  ride: { maker: string | null; model: string | null },
): boolean {
  if (ride.maker === null || ride.model === null) return false;
  if (matchKey(bulletin.maker) !== matchKey(ride.maker)) return false;
  const model = matchKey(ride.model);
  return bulletin.models.some((m) => matchKey(m) === model);
}

// ——— the register ———

/**
 * POST /api/bulletins. A deadline is a date or "before the next operation" (not both); neither means the
 * maker set none. The PDF is the maker's document, uploaded first (PUT /api/documents/:sha256).
 */
const bulletinFields = z.object({
  maker: requiredText(120),
  models: z
    .array(requiredText(80), { error: 'Must be a list of models' })
    .min(1, 'Name at least one model')
    .max(50, 'At most 50 models')
    .refine((ms) => new Set(ms.map(matchKey)).size === ms.length, 'A model is named twice'),
  reference: requiredText(60),
  title: requiredText(200),
  issuedOn: calendarDate(),
  severity: bulletinSeveritySchema,
  requiredAction: requiredText(2000),
  deadlineOn: calendarDate().nullable().optional(),
  beforeNextOperation: z.boolean({ error: 'Must be true or false' }).optional(),
  documentSha256: documentHashSchema.nullable().optional(),
  notes: nullableText(2000).optional(),
});

export const bulletinInputSchema = bulletinFields.superRefine((b, ctx) => {
  if (b.deadlineOn && b.beforeNextOperation)
    ctx.addIssue({
      code: 'custom',
      path: ['deadlineOn'],
      message: 'Give a date or "before the next operation", not both',
    });
  if (b.deadlineOn && b.deadlineOn < b.issuedOn)
    ctx.addIssue({ code: 'custom', path: ['deadlineOn'], message: 'Earlier than the issue date' });
});
export type BulletinInput = z.output<typeof bulletinInputSchema>;

/** PATCH /api/bulletins/:id: any subset; the rules above are checked on the bulletin as it would become. */
export const bulletinPatchSchema = bulletinFields.partial();
export type BulletinPatch = z.output<typeof bulletinPatchSchema>;

export const bulletinSchema = z.object({
  id: z.string(),
  maker: z.string(),
  models: z.array(z.string()),
  reference: z.string(),
  title: z.string(),
  issuedOn: z.string(),
  severity: bulletinSeveritySchema,
  requiredAction: z.string(),
  deadlineOn: z.string().nullable(),
  beforeNextOperation: z.boolean(),
  documentSha256: z.string().nullable(),
  notes: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  /** Rides it applies to (those the reader may see), and on how many it is done. */
  rideCount: z.number().int(),
  doneCount: z.number().int(),
});
export type Bulletin = z.infer<typeof bulletinSchema>;

export const bulletinListQuerySchema = pagingQuerySchema.extend({
  q: searchQuery(),
  severity: listOf(bulletinSeverities).optional(),
});
export type BulletinListQuery = z.input<typeof bulletinListQuerySchema>;
export const bulletinListResponseSchema = pageSchema.extend({ bulletins: z.array(bulletinSchema) });

// ——— on each ride ———

/** What was recorded about a bulletin on one ride: done, or found not done at an inspection. */
export const bulletinActionSchema = z.object({
  outcome: z.enum(['done', 'not_done']),
  /** The day it was done (or found not done): the inspection's day, or the day the supervisor gave. */
  on: z.string(),
  byName: z.string(),
  note: z.string().nullable(),
  /** The inspection that recorded it; null when a supervisor recorded it on the ride's page. */
  inspectionId: z.string().nullable(),
  recordedAt: z.string(),
});
export type BulletinAction = z.infer<typeof bulletinActionSchema>;

export const rideBulletinSchema = z.object({
  bulletin: bulletinSchema.omit({ rideCount: true, doneCount: true }),
  rideId: z.string(),
  rideName: z.string(),
  siteName: z.string().nullable(),
  state: z.enum(bulletinStates),
  /** When it was done, and by whom (the first record of it done). */
  done: bulletinActionSchema.nullable(),
  /** The latest inspection that found it not done, while it is open. */
  lastNotDone: bulletinActionSchema.nullable(),
});
export type RideBulletin = z.infer<typeof rideBulletinSchema>;
export const rideBulletinsResponseSchema = z.object({ bulletins: z.array(rideBulletinSchema) });
export const bulletinResponseSchema = z.object({
  bulletin: bulletinSchema,
  rides: z.array(rideBulletinSchema),
});

/** POST /api/rides/:rideId/bulletins/:bulletinId/done: a supervisor records it done, with what was seen. */
export const bulletinDoneInputSchema = z.object({
  on: calendarDate(),
  note: requiredText(2000),
});
export type BulletinDoneInput = z.output<typeof bulletinDoneInputSchema>;

/**
 * Open (not overdue yet), overdue or done on the ride's `today`: "before the next operation" is overdue as
 * soon as it is open, a date once it has passed.
 */
export function bulletinStateOn(
  b: { deadlineOn: string | null; beforeNextOperation: boolean },
  done: boolean,
  today: string,
): BulletinState {
  if (done) return 'done';
  if (b.beforeNextOperation) return 'overdue';
  return b.deadlineOn !== null && b.deadlineOn < today ? 'overdue' : 'open';
}

// ——— on the phone: the open ones reach the inspector's checklist ———

/** An open bulletin as the phone keeps it with its ride (the sync pull's `openBulletins`). */
export const openBulletinSchema = z.object({
  id: z.string().min(1),
  reference: z.string(),
  title: z.string(),
  requiredAction: z.string(),
  severity: z.string(),
  deadlineOn: z.string().nullable(),
  beforeNextOperation: z.boolean(),
});
export type OpenBulletin = z.infer<typeof openBulletinSchema>;

const ITEM_PREFIX = 'bulletin:';
/** The area an inspection's bulletin items are listed under. */
export const BULLETIN_AREA = 'Maker bulletins';

/** The checklist item id of a bulletin: `bulletin:<id>`, never a template item's (those have no colon). */
export const bulletinItemId = (bulletinId: string) => `${ITEM_PREFIX}${bulletinId}`;

/** The bulletin an answer is about, or null when it is a template item. */
export const bulletinIdOfItem = (itemId: string): string | null =>
  itemId.startsWith(ITEM_PREFIX) ? itemId.slice(ITEM_PREFIX.length) : null;

/**
 * The checklist item for an open bulletin: Pass means the inspector saw the required action done, Fail
 * that it is not, Not applicable leaves it open.
 */
export function bulletinChecklistItem(b: OpenBulletin) {
  const text = `Bulletin ${b.reference}: ${b.requiredAction}`;
  return {
    itemId: bulletinItemId(b.id),
    area: BULLETIN_AREA,
    text: text.length > 500 ? `${text.slice(0, 499)}…` : text,
    result: null,
  };
}
