/**
 * Request and response shapes of the ride register API (operator companies, sites, rides, design data and
 * its versions, audit entries), shared by the server's validation and the app's forms and API client.
 * Pure zod: no React. Nullable text fields take a string or null; an empty string counts as null. In an
 * update (PATCH) a field left out stays as it is, and null clears it.
 */
import { z } from 'zod';

import { designFileFormats } from '@/features/registry/csv';
import { designDataSchema } from '@/features/registry/design-data';
import type { QuantityKind } from '@/features/units';
import {
  rideClasses,
  rideClassSchema,
  rideStatuses,
  rideStatusSchema,
  rideSummarySchema,
} from '@/features/rides/schema';

// ——— small field builders ———

const requiredText = (max: number) =>
  z.string({ error: 'Required' }).trim().min(1, 'Required').max(max, `At most ${max} characters`);

/** Optional text that may also be cleared: '' and null both store null. */
const nullableText = (max: number) =>
  z
    .union([z.string().trim().max(max, `At most ${max} characters`), z.null()], {
      error: 'Must be text or null',
    })
    .transform((v) => (v === '' ? null : v));

const email = () =>
  z
    .string({ error: 'Required' })
    .trim()
    .toLowerCase()
    .pipe(z.email({ error: 'Must be an e-mail address' }));

const id = () => requiredText(64);

/** An ISO 8601 timestamp, stored as given in UTC. */
const timestamp = () =>
  z
    .string({ error: 'Required' })
    .trim()
    .refine(
      (v) => /^\d{4}-\d{2}-\d{2}(T[\d:.]+(Z|[+-]\d{2}:?\d{2})?)?$/.test(v) && !Number.isNaN(Date.parse(v)),
      {
        message: 'Must be a date or date-time, e.g. 2025-05-01 or 2025-05-01T08:30:00Z',
      },
    )
    .transform((v) => new Date(v).toISOString());

/** Page and size for every paged list; pages count from 1. */
export const pagingQuerySchema = z.object({
  page: z.coerce.number({ error: 'Must be a whole number' }).int('Must be a whole number').min(1).default(1),
  pageSize: z.coerce
    .number({ error: 'Must be a whole number' })
    .int('Must be a whole number')
    .min(1)
    .max(200, 'At most 200')
    .default(50),
});
export const pageSchema = z.object({
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});

/** `?sort=name` or `?sort=-name` (descending) from a fixed list of keys. */
export function sortQuery<const K extends string>(keys: readonly K[]) {
  const values = [...keys, ...keys.map((k) => `-${k}` as const)] as [K | `-${K}`, ...(K | `-${K}`)[]];
  return z.enum(values, {
    error: `One of ${keys.join(', ')}, each optionally with a leading - (descending)`,
  });
}

/** A free-text search term; blank counts as none. */
export const searchQuery = () =>
  z
    .string()
    .trim()
    .max(100, 'At most 100 characters')
    .optional()
    .transform((v) => (v ? v : undefined));

// ——— operator companies ———

export const companyContactSchema = z.object({
  name: requiredText(80),
  role: nullableText(80).optional(),
  email: z
    .union([email(), z.literal(''), z.null()])
    .optional()
    .transform((v) => (v ? v : null)),
  phone: nullableText(40).optional(),
});

/** A contact as stored and returned: every field present, null when not given. */
export const storedContactSchema = z.object({
  name: z.string(),
  role: z.string().nullable(),
  email: z.string().nullable(),
  phone: z.string().nullable(),
});
export type CompanyContact = z.infer<typeof storedContactSchema>;

/** POST /api/companies (always an operator company); PATCH takes any subset. */
export const companyInputSchema = z.object({
  name: requiredText(120),
  /** Where notices go. */
  noticeEmails: z.array(email()).max(20, 'At most 20 addresses').optional(),
  phone: nullableText(40).optional(),
  address: nullableText(300).optional(),
  contacts: z.array(companyContactSchema).max(30, 'At most 30 contacts').optional(),
});
export type CompanyInput = z.output<typeof companyInputSchema>;
export const companyPatchSchema = companyInputSchema.partial();

export const companySchema = z.object({
  id: z.string(),
  kind: z.enum(['inspection_body', 'operator']),
  name: z.string(),
  noticeEmails: z.array(z.string()),
  phone: z.string().nullable(),
  address: z.string().nullable(),
  contacts: z.array(storedContactSchema),
  createdAt: z.string(),
  siteCount: z.number().int(),
  rideCount: z.number().int(),
});
export type Company = z.infer<typeof companySchema>;

export const companySortKeys = ['name', 'createdAt'] as const;
export const companyListQuerySchema = pagingQuerySchema.extend({
  q: searchQuery(),
  sort: sortQuery(companySortKeys).optional(),
});
export const companyListResponseSchema = pageSchema.extend({ companies: z.array(companySchema) });
export const companyResponseSchema = z.object({ company: companySchema });

// ——— sites ———

export const siteKinds = ['park', 'fairground', 'travelling_setup'] as const;
export const siteKindSchema = z.enum(siteKinds, { error: `One of ${siteKinds.join(', ')}` });
export const siteKindLabel: Record<(typeof siteKinds)[number], string> = {
  park: 'Park',
  fairground: 'Fairground',
  travelling_setup: 'Travelling set-up',
};

export const siteInputSchema = z.object({
  name: requiredText(120),
  kind: siteKindSchema,
  address: nullableText(300).optional(),
  locality: nullableText(120).optional(),
  operatorCompanyId: id(),
});
export type SiteInput = z.output<typeof siteInputSchema>;
export const sitePatchSchema = siteInputSchema.partial();

export const siteSchema = z.object({
  id: z.string(),
  name: z.string(),
  kind: siteKindSchema,
  address: z.string().nullable(),
  locality: z.string().nullable(),
  operatorCompanyId: z.string(),
  operatorName: z.string(),
  createdAt: z.string(),
  rideCount: z.number().int(),
});
export type Site = z.infer<typeof siteSchema>;

export const siteSortKeys = ['name', 'kind', 'operator', 'locality'] as const;
export const siteListQuerySchema = pagingQuerySchema.extend({
  q: searchQuery(),
  operatorId: z.string().trim().min(1).optional(),
  kind: siteKindSchema.optional(),
  sort: sortQuery(siteSortKeys).optional(),
});
export const siteListResponseSchema = pageSchema.extend({ sites: z.array(siteSchema) });
export const siteResponseSchema = z.object({ site: siteSchema });

// ——— rides ———

const year = () =>
  z
    .number({ error: 'Must be a year' })
    .int('Must be a year')
    .min(1850, 'Must be 1850 or later')
    .max(2100, 'Must be 2100 or earlier');

/**
 * POST /api/rides. A ride that is restricted or out of service must say why (the operator's notice would
 * be empty otherwise); in service clears the reason. `statusSince` defaults to now when the status is set
 * or changed.
 */
export const rideInputSchema = z.object({
  name: requiredText(80),
  rideClass: rideClassSchema,
  description: nullableText(200).optional(),
  maker: nullableText(120).optional(),
  model: nullableText(80).optional(),
  serial: nullableText(80).optional(),
  year: year().nullable().optional(),
  siteId: z.union([id(), z.null()]).optional(),
  operatorCompanyId: id(),
  status: rideStatusSchema.optional(),
  statusReason: nullableText(500).optional(),
  statusSince: timestamp().optional(),
});
export type RideInput = z.output<typeof rideInputSchema>;
/** PATCH /api/rides/:id: any subset; the status rule is checked on the ride as it would become. */
export const ridePatchSchema = rideInputSchema.partial();
export type RidePatch = z.output<typeof ridePatchSchema>;

export const rideResponseSchema = z.object({ ride: rideSummarySchema });

/** Several values of one filter, as `?status=a,b` or `?status=a&status=b`. */
function listOf<const T extends string>(values: readonly T[]) {
  const one = z.enum(values as [T, ...T[]], { error: `One of ${values.join(', ')}` });
  return z.preprocess(
    (v) => (Array.isArray(v) ? v.join(',') : v),
    z
      .string()
      .transform((v) =>
        v
          .split(',')
          .map((s) => s.trim())
          .filter(Boolean),
      )
      .pipe(z.array(one)),
  );
}

export const rideSortKeys = [
  'name',
  'status',
  'rideClass',
  'operator',
  'site',
  'maker',
  'year',
  'statusSince',
] as const;
export type RideSortKey = (typeof rideSortKeys)[number];

/**
 * `GET /api/rides` query. Without `sort` the list comes by operator, then name. `q` searches name, maker,
 * model, serial, site and operator.
 */
export const rideListQuerySchema = pagingQuerySchema.extend({
  q: searchQuery(),
  status: listOf(rideStatuses).optional(),
  rideClass: listOf(rideClasses).optional(),
  siteId: z.string().trim().min(1).optional(),
  operatorId: z.string().trim().min(1).optional(),
  sort: sortQuery(rideSortKeys).optional(),
});
export type RideListQuery = z.output<typeof rideListQuerySchema>;

/** `GET /api/rides`: `rides` keeps the list item shape of `rideListResponseSchema`, plus the page. */
export const rideListPageSchema = pageSchema.extend({ rides: z.array(rideSummarySchema) });
export type RideListPage = z.infer<typeof rideListPageSchema>;

export const idParamsSchema = z.object({ id: id() });
export const rideIdParamsSchema = idParamsSchema;

// ——— design data ———

export const designOrigins = ['editor', 'import_csv', 'import_json', 'seed'] as const;
export const designOriginSchema = z.enum(designOrigins);
export type DesignOrigin = z.infer<typeof designOriginSchema>;

/**
 * Whether a version is the one analyses and phones use. A version that loosens a limit waits (`pending`)
 * until a second person approves it; `rejected` ones stay in the history. Versions stored before approval
 * existed are in force; the fields are optional so those records, cached on phones, still parse.
 */
export const designApprovalStates = ['pending', 'in_force', 'rejected'] as const;
export const designApprovalStateSchema = z.enum(designApprovalStates);
export type DesignApprovalState = z.infer<typeof designApprovalStateSchema>;

/** A version without its data, for version lists. */
export const designVersionInfoSchema = z.object({
  id: z.string(),
  version: z.number().int().min(1),
  createdAt: z.string(),
  createdByName: z.string(),
  reason: z.string(),
  origin: designOriginSchema,
  approvalState: designApprovalStateSchema.optional(),
  /** The proposer's user id: the app offers approval only to someone else. */
  createdById: z.string().optional(),
  /** The version in force it was compared with when it was made (null: the first version). */
  basedOnVersion: z.number().int().nullable().optional(),
  decidedAt: z.string().nullable().optional(),
  decidedByName: z.string().nullable().optional(),
  decisionReason: z.string().nullable().optional(),
});
export type DesignVersionInfo = z.infer<typeof designVersionInfoSchema>;

/** One stored version of a ride's design data: who made it, when and why. Versions never change. */
export const designVersionSchema = designVersionInfoSchema.extend({ data: designDataSchema });
export type DesignVersion = z.infer<typeof designVersionSchema>;

/**
 * `GET /api/rides/:id`: the ride as lists show it, and its current design data. `design` is null when the
 * ride has no design data yet, and always null for operators (they may not see design data).
 */
export const rideDetailResponseSchema = z.object({
  ride: rideSummarySchema,
  design: designVersionSchema.nullable(),
});
export type RideDetailResponse = z.infer<typeof rideDetailResponseSchema>;

/** A reason for a change, kept with the version it makes. */
export const changeReasonSchema = requiredText(500);

/**
 * PUT /api/rides/:id/design: a new version. `basedOnVersion` (the version the editor started from) turns
 * a concurrent edit into a 409 instead of silently replacing someone else's version; 0 means "no design
 * data yet".
 */
export const designPutBodySchema = z.object({
  reason: changeReasonSchema,
  data: designDataSchema,
  basedOnVersion: z.number().int().min(0).optional(),
});
export type DesignPutBody = z.output<typeof designPutBodySchema>;

export const designResponseSchema = z.object({ design: designVersionSchema });

/**
 * `GET /api/rides/:id/design/pending` (admins and supervisors): the revision waiting for approval and the
 * version in force it would replace, so the comparison is drawn from both.
 */
export const designPendingResponseSchema = z.object({
  pending: designVersionSchema.nullable(),
  current: designVersionSchema.nullable(),
});
export type DesignPendingResponse = z.infer<typeof designPendingResponseSchema>;

/** `POST /api/rides/:id/design/versions/:version/decision`: a second person approves or rejects, with why. */
export const designDecisionBodySchema = z.object({
  decision: z.enum(['approve', 'reject'], { error: 'approve or reject' }),
  reason: changeReasonSchema,
});
export type DesignDecisionBody = z.output<typeof designDecisionBodySchema>;
export const designVersionListResponseSchema = z.object({ versions: z.array(designVersionInfoSchema) });
export const designVersionParamsSchema = z.object({
  id: id(),
  version: z.coerce.number({ error: 'Must be a whole number' }).int('Must be a whole number').min(1),
});

// ——— audit log ———

export const auditEntities = [
  'company',
  'site',
  'ride',
  'design',
  'checklist_template',
  'schedule',
  'inspection',
  'finding',
  'notice',
  'corrective_action',
  'instrument',
  'setting',
] as const;
export const auditEntitySchema = z.enum(auditEntities);
export type AuditEntity = z.infer<typeof auditEntitySchema>;
export const auditActions = ['create', 'update', 'delete'] as const;
export const auditActionSchema = z.enum(auditActions);
export type AuditAction = z.infer<typeof auditActionSchema>;

// ——— checklist templates ———

/**
 * What a measurement item records. The unit kinds are those of `features/units` (stored in SI, shown in
 * the user's units); `count` is a plain number with its own label (an hour meter, an insulation reading in
 * MΩ), for quantities the unit module does not convert.
 */
export const measurementKinds = [
  'lengthSmall',
  'length',
  'angle',
  'rate',
  'time',
  'moment',
  'force',
  'mass',
  'accel',
  'pressure',
  'frequency',
  'count',
] as const satisfies readonly (QuantityKind | 'count')[];
export const measurementKindSchema = z.enum(measurementKinds, {
  error: `One of ${measurementKinds.join(', ')}`,
});
export type MeasurementKind = z.infer<typeof measurementKindSchema>;

const itemId = () =>
  z
    .string()
    .trim()
    .min(1)
    .max(64)
    .regex(/^[A-Za-z0-9_.-]+$/, 'Letters, digits, _ . - only');

/**
 * The pivot values a checklist item can be checked against from the ride's design data. Each is also a
 * kind of reading (same words), so the checklist value becomes that pivot's reading: entered once.
 */
export const designLimitQuantities = ['pin_diameter', 'clearance', 'speed', 'amplitude'] as const;
export type DesignLimitQuantity = (typeof designLimitQuantities)[number];
export const designLimitKind: Record<DesignLimitQuantity, MeasurementKind> = {
  pin_diameter: 'lengthSmall',
  clearance: 'lengthSmall',
  speed: 'rate',
  amplitude: 'angle',
};

const limitNumber = () => z.number({ error: 'Must be a finite number' });

/**
 * What a measured item is checked against. `design`: a limit of pivot `joint` (0 = the ground pivot) in
 * the ride's design data, so each ride of the class is checked against its own documents. `template`: a
 * limit written here, in SI of the item's measurement kind, for values the design data does not hold
 * (brake air gap…); `joint` optionally says which pivot it belongs to.
 */
export const checklistLimitSchema = z.discriminatedUnion(
  'source',
  [
    z.object({
      source: z.literal('design'),
      joint: z.int({ error: 'Must be a whole number' }).min(0).max(9),
      quantity: z.enum(designLimitQuantities, { error: `One of ${designLimitQuantities.join(', ')}` }),
    }),
    z
      .object({
        source: z.literal('template'),
        joint: z.int({ error: 'Must be a whole number' }).min(0).max(9).nullable().default(null),
        min: limitNumber().nullable().default(null),
        max: limitNumber().nullable().default(null),
      })
      .superRefine((l, ctx) => {
        if (l.min === null && l.max === null)
          ctx.addIssue({ code: 'custom', path: ['max'], message: 'Give a minimum, a maximum or both' });
        if (l.min !== null && l.max !== null && !(l.min < l.max))
          ctx.addIssue({ code: 'custom', path: ['max'], message: 'Must be above the minimum' });
      }),
  ],
  { error: 'source must be design or template' },
);
export type ChecklistLimit = z.infer<typeof checklistLimitSchema>;

/**
 * One checklist item. `id` stays the same across template versions, so inspections can say which item a
 * finding belongs to; leave it out for a new item and the server assigns one.
 */
export const checklistItemSchema = z
  .object({
    id: itemId().optional(),
    text: requiredText(300),
    guidance: nullableText(1000).optional(),
    photoRequired: z.boolean({ error: 'true or false' }).default(false),
    measurementRequired: z.boolean({ error: 'true or false' }).default(false),
    measurementKind: measurementKindSchema.nullable().optional(),
    /** What to write beside the reading ("pin Ø, two stations × two directions", "MΩ"). */
    measurementLabel: nullableText(120).optional(),
    /** The limit the value is checked against when entered; none for a value only recorded. */
    limit: checklistLimitSchema.nullable().optional(),
  })
  .superRefine((item, ctx) => {
    if (item.measurementRequired && !item.measurementKind)
      ctx.addIssue({ code: 'custom', path: ['measurementKind'], message: 'Say what kind of measurement' });
    const limit = item.limit;
    if (!limit) return;
    if (!item.measurementRequired)
      ctx.addIssue({
        code: 'custom',
        path: ['limit'],
        message: 'Only an item that takes a value has a limit',
      });
    else if (item.measurementKind === 'count')
      // Envelope values carry a unit the reviewer and the notice can show; a plain number has none.
      ctx.addIssue({
        code: 'custom',
        path: ['limit'],
        message: 'A limit needs a measured quantity with a unit, not a plain number',
      });
    else if (limit.source === 'design' && item.measurementKind !== designLimitKind[limit.quantity])
      ctx.addIssue({
        code: 'custom',
        path: ['measurementKind'],
        message: `A ${limit.quantity.replace('_', ' ')} limit needs measurement kind ${designLimitKind[limit.quantity]}`,
      });
  });

export const checklistAreaSchema = z.object({
  id: itemId().optional(),
  title: requiredText(120),
  items: z.array(checklistItemSchema).min(1, 'Give at least one item').max(100, 'At most 100 items'),
});

/** A template's areas and items, as one version stores them. Ids must be unique within the template. */
export const checklistContentSchema = z
  .object({
    areas: z.array(checklistAreaSchema).min(1, 'Give at least one area').max(30, 'At most 30 areas'),
  })
  .superRefine((content, ctx) => {
    const seen = new Set<string>();
    const check = (id: string | undefined, path: (string | number)[]) => {
      if (id === undefined) return;
      if (seen.has(id)) ctx.addIssue({ code: 'custom', path, message: `Id ${id} is used twice` });
      seen.add(id);
    };
    content.areas.forEach((area, a) => {
      check(area.id, ['areas', a, 'id']);
      area.items.forEach((item, i) => check(item.id, ['areas', a, 'items', i, 'id']));
    });
  });
export type ChecklistContentInput = z.input<typeof checklistContentSchema>;

/** Stored content: every area and item has its id and every optional field is present. */
export const storedChecklistItemSchema = z.object({
  id: z.string(),
  text: z.string(),
  guidance: z.string().nullable(),
  photoRequired: z.boolean(),
  measurementRequired: z.boolean(),
  measurementKind: measurementKindSchema.nullable(),
  measurementLabel: z.string().nullable(),
  /** Absent from versions stored before items could have limits. */
  limit: checklistLimitSchema.nullable().optional(),
});
export const storedChecklistContentSchema = z.object({
  areas: z.array(z.object({ id: z.string(), title: z.string(), items: z.array(storedChecklistItemSchema) })),
});
export type ChecklistContent = z.infer<typeof storedChecklistContentSchema>;
export type ChecklistItem = z.infer<typeof storedChecklistItemSchema>;

/** POST /api/checklist-templates. */
export const checklistTemplateCreateSchema = z.object({
  name: requiredText(120),
  rideClass: rideClassSchema,
  content: checklistContentSchema,
  reason: changeReasonSchema.optional(),
});
/** PUT /api/checklist-templates/:id: a new version (and optionally a new name). */
export const checklistTemplatePutSchema = z.object({
  name: requiredText(120).optional(),
  content: checklistContentSchema,
  reason: changeReasonSchema,
  basedOnVersion: z.number().int().min(1).optional(),
});

export const checklistVersionInfoSchema = z.object({
  version: z.number().int().min(1),
  createdAt: z.string(),
  createdByName: z.string(),
  reason: z.string(),
});
export const checklistTemplateSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  rideClass: rideClassSchema,
  createdAt: z.string(),
  archivedAt: z.string().nullable(),
  currentVersion: z.number().int(),
  updatedAt: z.string(),
  updatedByName: z.string(),
  areaCount: z.number().int(),
  itemCount: z.number().int(),
});
export type ChecklistTemplateSummary = z.infer<typeof checklistTemplateSummarySchema>;
export const checklistTemplateSchema = checklistTemplateSummarySchema.extend({
  version: checklistVersionInfoSchema.extend({ content: storedChecklistContentSchema }),
});
export type ChecklistTemplate = z.infer<typeof checklistTemplateSchema>;

export const checklistTemplateListQuerySchema = z.object({
  rideClass: rideClassSchema.optional(),
  includeArchived: z
    .enum(['true', 'false', '1', '0'], { error: 'true or false' })
    .optional()
    .transform((v) => v === 'true' || v === '1'),
});
export const checklistTemplateListResponseSchema = z.object({
  templates: z.array(checklistTemplateSummarySchema),
});
export const checklistTemplateResponseSchema = z.object({ template: checklistTemplateSchema });
export const checklistVersionListResponseSchema = z.object({ versions: z.array(checklistVersionInfoSchema) });
export const checklistVersionParamsSchema = designVersionParamsSchema;

// ——— schedules and assignments ———

export const inspectionTypes = [
  'daily_pre_opening',
  'periodic',
  'annual',
  'setup_after_assembly',
  'follow_up',
] as const;
export const inspectionTypeSchema = z.enum(inspectionTypes, {
  error: `One of ${inspectionTypes.join(', ')}`,
});
export type InspectionType = z.infer<typeof inspectionTypeSchema>;
export const inspectionTypeLabel: Record<InspectionType, string> = {
  daily_pre_opening: 'Daily pre-opening',
  periodic: 'Periodic',
  annual: 'Annual',
  setup_after_assembly: 'Set-up after assembly',
  follow_up: 'Follow-up',
};

/**
 * How many days ahead an inspection counts as due rather than upcoming: a daily check is due on its day,
 * an annual one a month ahead so it can be booked.
 */
export const dueWindowDays: Record<InspectionType, number> = {
  daily_pre_opening: 0,
  periodic: 7,
  annual: 30,
  setup_after_assembly: 3,
  follow_up: 7,
};

/** overdue: the due date has passed · due: within the type's window · upcoming: later · unscheduled: no date. */
export const dueStatuses = ['overdue', 'due', 'upcoming', 'unscheduled'] as const;
export const dueStatusSchema = z.enum(dueStatuses);
export type DueStatus = z.infer<typeof dueStatusSchema>;

/** A calendar date, YYYY-MM-DD. */
export const calendarDate = () =>
  z
    .string({ error: 'Required' })
    .trim()
    .regex(/^\d{4}-\d{2}-\d{2}$/, 'Must be a date, YYYY-MM-DD')
    .refine((v) => {
      const d = new Date(`${v}T00:00:00Z`);
      return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === v;
    }, 'Not a real date');

/**
 * POST /api/schedules. The next due date is `dueOn` when given (a one-off date: a set-up, a follow-up),
 * else the last inspection plus the interval. Set `lastDoneOn` when an inspection is done; an explicit
 * `dueOn` on or before it is then cleared unless the same change sets a new one.
 */
export const scheduleInputSchema = z.object({
  rideId: id(),
  inspectionType: inspectionTypeSchema,
  intervalDays: z
    .number({ error: 'Must be a whole number of days' })
    .int('Must be a whole number of days')
    .min(1, 'At least 1 day')
    .max(3660, 'At most 10 years')
    .nullable()
    .optional(),
  lastDoneOn: calendarDate().nullable().optional(),
  dueOn: calendarDate().nullable().optional(),
  /** An inspector's user id; null leaves it unassigned. */
  assignedTo: z.union([id(), z.null()]).optional(),
  notes: nullableText(1000).optional(),
});
export type ScheduleInput = z.output<typeof scheduleInputSchema>;
/** PATCH /api/schedules/:id: any subset, except the ride and the inspection type. */
export const schedulePatchSchema = scheduleInputSchema.omit({ rideId: true, inspectionType: true }).partial();
export type SchedulePatch = z.output<typeof schedulePatchSchema>;

export const scheduleSchema = z.object({
  id: z.string(),
  rideId: z.string(),
  rideName: z.string(),
  rideClass: rideClassSchema,
  rideStatus: rideStatusSchema,
  siteName: z.string().nullable(),
  operatorName: z.string(),
  inspectionType: inspectionTypeSchema,
  intervalDays: z.number().int().nullable(),
  lastDoneOn: z.string().nullable(),
  dueOn: z.string().nullable(),
  /** `dueOn`, or the last inspection plus the interval; null when neither gives a date. */
  nextDueOn: z.string().nullable(),
  dueStatus: dueStatusSchema,
  /** Days from today to `nextDueOn` (negative when overdue); null when unscheduled. */
  daysUntilDue: z.number().int().nullable(),
  assignedTo: z.object({ id: z.string(), name: z.string() }).nullable(),
  assignedAt: z.string().nullable(),
  notes: z.string().nullable(),
  createdAt: z.string(),
});
export type Schedule = z.infer<typeof scheduleSchema>;

export const scheduleSortKeys = ['nextDue', 'ride', 'type', 'assignee'] as const;
export const scheduleListQuerySchema = pagingQuerySchema.extend({
  rideId: z.string().trim().min(1).optional(),
  inspectionType: listOf(inspectionTypes).optional(),
  dueStatus: listOf(dueStatuses).optional(),
  /** An inspector's id, `me`, or `none` for unassigned. */
  assignedTo: z.string().trim().min(1).optional(),
  q: searchQuery(),
  sort: sortQuery(scheduleSortKeys).optional(),
});
export type ScheduleListQuery = z.output<typeof scheduleListQuerySchema>;
export const scheduleListResponseSchema = pageSchema.extend({ schedules: z.array(scheduleSchema) });
export const scheduleResponseSchema = z.object({ schedule: scheduleSchema });
export const assignmentListResponseSchema = z.object({ assignments: z.array(scheduleSchema) });
export const inspectorListResponseSchema = z.object({
  inspectors: z.array(z.object({ id: z.string(), name: z.string(), email: z.string() })),
});

// ——— design data import and export ———

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

// ——— audit log ———

export const auditEntrySchema = z.object({
  id: z.string(),
  at: z.string(),
  userId: z.string().nullable(),
  userName: z.string().nullable(),
  entity: auditEntitySchema,
  entityId: z.string(),
  action: auditActionSchema,
  rideId: z.string().nullable(),
  summary: z.string(),
  /** The record before the change (null for a create) and after it (null for a delete). */
  before: z.unknown(),
  after: z.unknown(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

/** `GET /api/audit`: newest first unless `sort=at`; `from`/`to` are inclusive instants or dates. */
export const auditListQuerySchema = pagingQuerySchema.extend({
  entity: listOf(auditEntities).optional(),
  action: listOf(auditActions).optional(),
  entityId: z.string().trim().min(1).optional(),
  rideId: z.string().trim().min(1).optional(),
  userId: z.string().trim().min(1).optional(),
  from: timestamp().optional(),
  to: z
    .string()
    .trim()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined) return undefined;
      // A bare date means the whole of that day.
      const dateOnly = /^\d{4}-\d{2}-\d{2}$/.test(v);
      const parsed = timestamp().safeParse(dateOnly ? `${v}T23:59:59.999Z` : v);
      if (!parsed.success) {
        ctx.addIssue({ code: 'custom', message: 'Must be a date or date-time, e.g. 2025-05-01' });
        return z.NEVER;
      }
      return parsed.data;
    }),
  q: searchQuery(),
  sort: sortQuery(['at'] as const).optional(),
});
export type AuditListQuery = z.output<typeof auditListQuerySchema>;
export const auditListResponseSchema = pageSchema.extend({ entries: z.array(auditEntrySchema) });
