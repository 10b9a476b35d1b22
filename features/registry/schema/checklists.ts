import { changeReasonSchema, designVersionParamsSchema } from '@/features/registry/schema/design';
import { nullableText, requiredText } from '@/features/registry/schema/fields';
import {
  type InspectionType,
  inspectionTypeLabel,
  inspectionTypeSchema,
} from '@/features/registry/schema/schedules';
import { rideClassSchema } from '@/features/rides/schema';
import type { QuantityKind } from '@/lib/units';
import { z } from 'zod';

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

const checklistAreaSchema = z.object({
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

/** The inspection type a template is for; null = the class's general checklist, for any type without its own. */
const templateTypeSchema = inspectionTypeSchema.nullable();

/** POST /api/checklist-templates. */
export const checklistTemplateCreateSchema = z.object({
  name: requiredText(120),
  rideClass: rideClassSchema,
  inspectionType: templateTypeSchema.default(null),
  content: checklistContentSchema,
  reason: changeReasonSchema.optional(),
});
/** PUT /api/checklist-templates/:id: a new version (and optionally a new name). */
export const checklistTemplatePutSchema = z.object({
  name: requiredText(120).optional(),
  inspectionType: templateTypeSchema.optional(),
  content: checklistContentSchema,
  reason: changeReasonSchema,
  basedOnVersion: z.number().int().min(1).optional(),
});

const checklistVersionInfoSchema = z.object({
  version: z.number().int().min(1),
  createdAt: z.string(),
  createdByName: z.string(),
  reason: z.string(),
});
export const checklistTemplateSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  rideClass: rideClassSchema,
  /** Absent from templates a phone cached before types existed: those were general ones. */
  inspectionType: templateTypeSchema.default(null),
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
  /** A type, or `general` for the templates that apply to any type. */
  inspectionType: z.union([inspectionTypeSchema, z.literal('general')]).optional(),
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

/** The words for a template's type in lists and forms. */
export const generalTemplateLabel = 'Any type (general)';
export const templateTypeWords = (type: InspectionType | null | undefined): string =>
  type ? inspectionTypeLabel[type] : generalTemplateLabel;

type Pickable = {
  rideClass: string;
  inspectionType?: InspectionType | null;
  archivedAt: string | null;
  name: string;
  id: string;
};

/**
 * The checklist for an inspection of `type` on a ride of `rideClass`: the class's template for that type,
 * else its general one (`fallback: true`, so the screen can say the type has none of its own). A daily
 * pre-opening check never falls back: the general checklist is an inspector's, not the operator's
 * pre-opening list. Archived templates are never picked; of two for the same class and type (the API
 * refuses a second, older data may hold one) the first by name, then id, is taken.
 */
export function pickChecklistTemplate<T extends Pickable>(
  templates: readonly T[],
  rideClass: string,
  type: InspectionType,
): { template: T | null; fallback: boolean } {
  const usable = templates
    .filter((t) => t.rideClass === rideClass && t.archivedAt === null)
    .sort((a, b) => a.name.localeCompare(b.name) || a.id.localeCompare(b.id));
  const own = usable.find((t) => t.inspectionType === type);
  if (own) return { template: own, fallback: false };
  if (type === 'daily_pre_opening') return { template: null, fallback: false };
  const general = usable.find((t) => (t.inspectionType ?? null) === null);
  return { template: general ?? null, fallback: general !== undefined };
}
