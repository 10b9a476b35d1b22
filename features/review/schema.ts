/**
 * The review desk's shared shapes: the supervisors' queue, findings, decisions on an inspection, and a
 * ride's trends. Pure zod, no React: the server validates with these and the app parses its answers with
 * them. Severity, urgency and finding state are defined once in lib/vocabulary (with their marks); every
 * screen, e-mail and report takes its words from there (`urgencyInfo` here; findings and `severityInfo` in
 * features/notices/finding-schema.ts).
 */
import { z } from 'zod';

import { calendarDate, inspectionTypes } from '@/features/registry/schema';
import { pageSchema, pagingQuerySchema, searchQuery } from '@/lib/list-params';
import { rideClasses, rideStatuses } from '@/features/rides/schema';
import {
  findingSeverities,
  findingStates,
  incidentKinds,
  urgencies,
  urgencyVocabulary,
  type FindingSeverity,
  type FindingState,
  type Urgency,
} from '@/lib/vocabulary';

// ——— urgency, severity and finding state: defined in lib/vocabulary with their words and marks ———

export { findingSeverities, findingStates, urgencies };
export type { FindingSeverity, FindingState, Urgency };
const urgencySchema = z.enum(urgencies);

/** Each urgency's words (`label`, `description`); the queue sorts by the order of `urgencies`. */
export const urgencyInfo = urgencyVocabulary;

// ——— ride status (rules in features/review/status-rules.ts) ———

const statusReason = z
  .string()
  .trim()
  .max(2000, 'At most 2000 characters')
  .nullish()
  .transform((v) => (v ? v : null));

/**
 * `POST /api/rides/:id/status`: a change of the ride's status outside a decision — a stop, a restriction,
 * or a supervisor's override back towards service. The reason is required (the rules say so, and the
 * operator reads it); the server answers 400 naming `reason` when it is missing.
 */
export const rideStatusChangeInputSchema = z.object({
  status: z.enum(rideStatuses, { error: `One of ${rideStatuses.join(', ')}` }),
  reason: statusReason,
});
export type RideStatusChangeInput = z.input<typeof rideStatusChangeInputSchema>;

export const rideStatusChangeResponseSchema = z.object({
  ride: z.object({ id: z.string(), status: z.enum(rideStatuses), statusReason: z.string().nullable() }),
  notice: z.object({ id: z.string(), reference: z.string() }),
});

// ——— decisions on an inspection ———

/**
 * `POST /api/inspections/:id/decision`. Only a submitted inspection can be decided (409 otherwise).
 * Returning needs a comment for the inspector; approving takes an optional one.
 */
export const decisionInputSchema = z
  .object({
    decision: z.enum(['approve', 'return'], { error: 'approve or return' }),
    note: z
      .string()
      .trim()
      .max(2000, 'At most 2000 characters')
      .nullish()
      .transform((v) => (v ? v : null)),
    /**
     * The ride's status set by this decision (a stop, a restriction…), in the same transaction and on the
     * same single notice. Omitted: the status stays, except that approving a follow-up inspection returns
     * a stopped ride to service when the rules allow it.
     */
    rideStatus: z.object({ status: z.enum(rideStatuses), reason: statusReason }).optional(),
  })
  .superRefine((d, ctx) => {
    if (d.decision === 'return' && !d.note)
      ctx.addIssue({ code: 'custom', path: ['note'], message: 'Tell the inspector what to correct' });
  });
export type DecisionInput = z.input<typeof decisionInputSchema>;

export const decisionResponseSchema = z.object({
  /** The operator's notice issued by an approval with findings; null when none was issued. */
  notice: z.object({ id: z.string(), reference: z.string() }).nullable().optional(),
  inspectionId: z.string(),
  reviewState: z.enum(['submitted', 'approved', 'returned']),
  reviewedAt: z.string(),
  reviewedByName: z.string().nullable(),
  reviewNote: z.string().nullable(),
  /** The ride's status after the decision, and whether the decision changed it. */
  ride: z
    .object({ status: z.enum(rideStatuses), statusReason: z.string().nullable(), changed: z.boolean() })
    .optional(),
});
export type DecisionResponse = z.infer<typeof decisionResponseSchema>;

// ——— approving one's own inspections ———

/**
 * `GET /api/settings/self-approval` (staff) and `PUT` (admins): whether a supervisor (or administrator) may
 * approve an inspection they recorded themselves. Off unless an administrator turns it on: a second pair
 * of eyes on every approval is the safe default.
 */
export const selfApprovalSettingSchema = z.object({
  allowed: z.boolean(),
  updatedAt: z.string().nullable(),
  updatedByName: z.string().nullable(),
});
export type SelfApprovalSetting = z.infer<typeof selfApprovalSettingSchema>;
export const selfApprovalInputSchema = z.strictObject({ allowed: z.boolean({ error: 'true or false' }) });
export const selfApprovalResponseSchema = z.object({ selfApproval: selfApprovalSettingSchema });

// ——— the queue ———

const queueSortKeys = ['urgency', 'newest', 'oldest', 'ride'] as const;
export type QueueSort = (typeof queueSortKeys)[number];

const listOfEnum = <const T extends string>(values: readonly [T, ...T[]]) =>
  z
    .union([z.string(), z.array(z.string())])
    .transform((v) => (Array.isArray(v) ? v : v.split(',')).map((s) => s.trim()).filter(Boolean))
    .pipe(z.array(z.enum(values, { error: `Each one of ${values.join(', ')}` })));

/**
 * `GET /api/review/queue`. Every filter narrows the list; `counts` reflect every filter except `urgency`
 * (so the tiles at the top can be used as filters). `from`/`to` bound the item's date (submission, or
 * the due date for a ride in the queue without a submitted inspection), inclusive, as calendar dates.
 */
export const queueQuerySchema = pagingQuerySchema.extend({
  q: searchQuery(),
  siteId: z.string().trim().min(1).max(64).optional(),
  operatorId: z.string().trim().min(1).max(64).optional(),
  inspectorId: z.string().trim().min(1).max(64).optional(),
  rideClass: listOfEnum(rideClasses).optional(),
  rideStatus: listOfEnum(rideStatuses).optional(),
  urgency: listOfEnum(urgencies).optional(),
  from: calendarDate().optional(),
  to: calendarDate().optional(),
  sort: z.enum(queueSortKeys, { error: `One of ${queueSortKeys.join(', ')}` }).default('urgency'),
  pageSize: z.coerce
    .number({ error: 'Must be a whole number' })
    .int('Must be a whole number')
    .min(1)
    .max(100, 'At most 100')
    .default(25),
});
export type QueueQuery = z.output<typeof queueQuerySchema>;

export const queueItemSchema = z.object({
  /** `i:<inspection id>`, `r:<ride id>` or `n:<incident report id>`. */
  key: z.string(),
  kind: z.enum(['inspection', 'ride', 'incident']),
  inspectionId: z.string().nullable(),
  inspectionType: z.enum(inspectionTypes).nullable(),
  rideId: z.string(),
  rideName: z.string(),
  rideClass: z.enum(rideClasses),
  rideStatus: z.enum(rideStatuses),
  siteId: z.string().nullable(),
  siteName: z.string().nullable(),
  operatorId: z.string(),
  operatorName: z.string(),
  inspectorId: z.string().nullable(),
  inspectorName: z.string().nullable(),
  urgency: urgencySchema,
  /** The item's date: when the inspection was submitted, or the earliest missed due date. */
  at: z.string(),
  /** That date as a day on the site's clock (YYYY-MM-DD): what the From/To filters compare. */
  day: z.string().optional(),
  analysisStatus: z.enum(['within', 'near', 'over']).nullable(),
  failedItems: z.number().int(),
  /** The ride's earliest missed inspection due date, when it has one. */
  overdueSince: z.string().nullable(),
  findingsPastDue: z.number().int(),
  /** The ride's earliest NDT due date when it is past (a planned test overdue or never made); else null. */
  ndtDueOn: z.string().nullable().optional(),
  /**
   * The earliest date a pin or bushing may reach its wear limit (the prediction interval's side), when
   * that falls before the next scheduled inspection; else null.
   */
  wearLimitOn: z.string().nullable().optional(),
  /** The earlier inspection date suggested for that wear; null without a wear flag. */
  wearSuggestedOn: z.string().nullable().optional(),
  /** An operator's incident report awaiting review (kind `incident`): its id and kind. */
  incidentId: z.string().nullable().optional(),
  incidentKind: z.enum(incidentKinds).nullable().optional(),
  /** When the ride's latest daily pre-opening check, which failed, was sent; else null. */
  dailyFailedAt: z.string().nullable().optional(),
  /** The latest day the ride ran without a daily check (features/daily-checks missedDays); else null. */
  dailyMissedOn: z.string().nullable().optional(),
});
export type QueueItem = z.infer<typeof queueItemSchema>;

export const queueResponseSchema = pageSchema.extend({
  items: z.array(queueItemSchema),
  counts: z.object(
    Object.fromEntries(urgencies.map((u) => [u, z.number().int()])) as Record<Urgency, z.ZodNumber>,
  ),
});
export type QueueResponse = z.infer<typeof queueResponseSchema>;

// ——— trends ———

/** `GET /api/rides/:id/trends`: the ride's inspections oldest first, with what drifts. */
export const trendPointSchema = z.object({
  inspectionId: z.string(),
  submittedAt: z.string(),
  type: z.enum(inspectionTypes),
  reviewState: z.enum(['submitted', 'approved', 'returned']),
  analysisStatus: z.enum(['within', 'near', 'over']).nullable(),
  /** Peak force magnitude per pivot (index = joint), null where not analysed. */
  peakForceN: z.array(z.number().nullable()),
  /** Latest pin diameter and diametral clearance per pivot in this inspection, SI (m). */
  pins: z.array(
    z.object({
      joint: z.number().int(),
      diameterM: z.number().nullable(),
      clearanceM: z.number().nullable(),
    }),
  ),
});
export type TrendPoint = z.infer<typeof trendPointSchema>;

export const trendsResponseSchema = z.object({
  rideId: z.string(),
  /** Pivot names and limits from the ride's current design data (null where none is set). */
  joints: z.array(
    z.object({
      joint: z.number().int(),
      name: z.string(),
      maxForceN: z.number().nullable(),
      minPinDiameterM: z.number().nullable(),
      maxClearanceM: z.number().nullable(),
    }),
  ),
  points: z.array(trendPointSchema),
});
export type TrendsResponse = z.infer<typeof trendsResponseSchema>;
