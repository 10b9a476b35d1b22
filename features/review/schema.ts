/**
 * The review desk's shared shapes: the supervisors' queue, findings, decisions on an inspection, and a
 * ride's trends. Pure zod, no React: the server validates with these and the app parses its answers with
 * them. Severity and urgency are defined here once; every screen, e-mail and report takes its words from
 * `severityInfo` and `urgencyInfo`.
 */
import { z } from 'zod';

import { calendarDate, inspectionTypes } from '@/features/registry/schema';
import { pageSchema, pagingQuerySchema, searchQuery } from '@/lib/list-params';
import { rideClasses, rideStatuses } from '@/features/rides/schema';

// ——— urgency: why something is in the queue, most urgent first ———

/**
 * An item's urgency is the first of these that applies to it; the queue sorts by this order.
 * - `over`: the server's load check put a value over its limit
 * - `failed`: checklist items marked failed
 * - `near`: a value near its limit
 * - `overdue`: the ride has an inspection past its due date
 * - `past_due`: the ride has findings still open after their due date
 * - `awaiting`: a submitted inspection with nothing flagged, waiting for sign-off
 */
export const urgencies = ['over', 'failed', 'near', 'overdue', 'past_due', 'awaiting'] as const;
export type Urgency = (typeof urgencies)[number];
export const urgencySchema = z.enum(urgencies);

export const urgencyInfo: Record<Urgency, { label: string; description: string }> = {
  over: { label: 'Over limit', description: 'A computed or measured value is over its design limit.' },
  failed: { label: 'Failed items', description: 'Checklist items were marked failed.' },
  near: { label: 'Near limit', description: 'A value is near its design limit.' },
  overdue: { label: 'Overdue', description: 'An inspection of the ride is past its due date.' },
  past_due: { label: 'Findings past due', description: 'Open findings are past their due date.' },
  awaiting: { label: 'Awaiting sign-off', description: 'Submitted with nothing flagged.' },
};

// ——— findings ———

/** Finding severity, mildest first. The scale is ours; its words are used everywhere unchanged. */
export const findingSeverities = ['note', 'fix_by_date', 'fix_before_operation', 'stop_now'] as const;
export type FindingSeverity = (typeof findingSeverities)[number];
export const findingSeveritySchema = z.enum(findingSeverities, {
  error: `One of ${findingSeverities.join(', ')}`,
});

export const severityInfo: Record<
  FindingSeverity,
  {
    label: string;
    description: string;
    /** May the ride run while the finding is open? */ mayOperate: boolean;
  }
> = {
  note: {
    label: 'Note',
    description: 'An observation to watch at the next inspection. No action is required.',
    mayOperate: true,
  },
  fix_by_date: {
    label: 'Fix by date',
    description: 'The ride may operate; the deficiency must be corrected by the due date.',
    mayOperate: true,
  },
  fix_before_operation: {
    label: 'Fix before operation',
    description: 'The ride must not carry riders until the deficiency is corrected and verified.',
    mayOperate: false,
  },
  stop_now: {
    label: 'Stop now',
    description: 'Stop the ride at once and apply lockout/tagout; escalate to a qualified engineer.',
    mayOperate: false,
  },
};

/**
 * Where a finding stands. `open` until the operator reports a corrective action (`action_reported`);
 * the supervisor or inspector then verifies and closes it, or reopens it with a comment.
 */
export const findingStates = ['open', 'action_reported', 'closed'] as const;
export type FindingState = (typeof findingStates)[number];
export const findingStateSchema = z.enum(findingStates);

const sha256 = z.string().regex(/^[0-9a-f]{64}$/, 'Must be a photo reference (64 hex digits)');

const findingFields = {
  severity: findingSeveritySchema,
  description: z
    .string({ error: 'Required' })
    .trim()
    .min(1, 'Say what was found')
    .max(2000, 'At most 2000 characters'),
  /** The rule, standard clause or maker's instruction the deficiency breaches. */
  ruleRef: z
    .string()
    .trim()
    .max(300, 'At most 300 characters')
    .nullish()
    .transform((v) => (v ? v : null)),
  requiredAction: z
    .string()
    .trim()
    .max(2000, 'At most 2000 characters')
    .nullish()
    .transform((v) => (v ? v : null)),
  dueOn: calendarDate()
    .nullish()
    .transform((v) => v ?? null),
  /** Photos of the same inspection the finding points at (their SHA-256). */
  photoShas: z
    .array(sha256)
    .max(12, 'At most 12 photos')
    .default([])
    .transform((v) => [...new Set(v)]),
};

type FindingFields = {
  severity: FindingSeverity;
  requiredAction: string | null;
  dueOn: string | null;
};

/** Rules across fields, shared by create and (after merging with the stored finding) by update. */
export function findingProblems(f: FindingFields): { path: string; message: string }[] {
  const problems: { path: string; message: string }[] = [];
  if (f.severity !== 'note' && !f.requiredAction)
    problems.push({ path: 'requiredAction', message: 'Say what must be done' });
  if (f.severity === 'fix_by_date' && !f.dueOn)
    problems.push({ path: 'dueOn', message: 'A fix-by-date finding needs a due date' });
  return problems;
}

/** `POST /api/inspections/:id/findings`. */
export const findingInputSchema = z.object(findingFields).superRefine((f, ctx) => {
  for (const p of findingProblems(f)) ctx.addIssue({ code: 'custom', path: [p.path], message: p.message });
});
export type FindingInput = z.input<typeof findingInputSchema>;

/**
 * `PATCH /api/findings/:id`: any of the fields; `expectedUpdatedAt` (the `updatedAt` the editor started
 * from) makes a concurrent edit answer 409 instead of silently overwriting.
 */
export const findingPatchSchema = z
  .object({
    severity: findingFields.severity.optional(),
    description: findingFields.description.optional(),
    ruleRef: findingFields.ruleRef.optional(),
    requiredAction: findingFields.requiredAction.optional(),
    dueOn: findingFields.dueOn.optional(),
    photoShas: z.array(sha256).max(12, 'At most 12 photos').optional(),
    expectedUpdatedAt: z.string().min(1).optional(),
  })
  .refine((p) => Object.keys(p).some((k) => k !== 'expectedUpdatedAt'), { message: 'Nothing to change' });
export type FindingPatch = z.input<typeof findingPatchSchema>;

export const findingSchema = z.object({
  id: z.string(),
  inspectionId: z.string(),
  rideId: z.string(),
  /**
   * What people call the finding by: its number on the ride (1, 2, 3… over all the ride's inspections,
   * never reused), or its number in its inspection for a finding stored before rides numbered them.
   */
  number: z.number().int(),
  /** 1, 2, 3… within its inspection. */
  inspectionNumber: z.number().int().optional(),
  severity: findingSeveritySchema,
  description: z.string(),
  ruleRef: z.string().nullable(),
  requiredAction: z.string().nullable(),
  dueOn: z.string().nullable(),
  photoShas: z.array(z.string()),
  state: findingStateSchema,
  createdAt: z.string(),
  createdByName: z.string().nullable(),
  updatedAt: z.string(),
  updatedByName: z.string().nullable(),
  closedAt: z.string().nullable(),
  closedByName: z.string().nullable(),
  /** The last comment on closing or reopening. */
  stateNote: z.string().nullable(),
  /** What the verifier accepted as evidence on closing. */
  closeEvidence: z
    .object({
      photoShas: z.array(z.string()),
      reference: z.string().nullable(),
      correctiveActions: z.number().int(),
    })
    .nullable()
    .optional(),
});
export type Finding = z.infer<typeof findingSchema>;
export const findingResponseSchema = z.object({ finding: findingSchema });
export const findingListResponseSchema = z.object({ findings: z.array(findingSchema) });

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
  /** `i:<inspection id>` or `r:<ride id>`. */
  key: z.string(),
  kind: z.enum(['inspection', 'ride']),
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
  analysisStatus: z.enum(['within', 'near', 'over']).nullable(),
  failedItems: z.number().int(),
  /** The ride's earliest missed inspection due date, when it has one. */
  overdueSince: z.string().nullable(),
  findingsPastDue: z.number().int(),
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
