/**
 * Travelling rides' set-ups, events at shared sites and the inspectors' planned rounds (issue #19): the
 * shapes the server validates with and the app parses with, and the pure rules both share (the week of a
 * day, the order of a round). Pure zod: no React.
 */
import { z } from 'zod';

import { id, nullableText, requiredText } from '@/features/registry/schema/fields';
import { calendarDate, dueStatusSchema, inspectionTypeSchema } from '@/features/registry/schema/schedules';
import { rideStatusSchema } from '@/features/rides/schema';
import { addDays, daysBetween } from '@/lib/dates';
import { labelsOf, setupStates, setupStateVocabulary } from '@/lib/vocabulary';

export { setupStates };
export const setupStateSchema = z.enum(setupStates);
export type SetupState = z.infer<typeof setupStateSchema>;
export const setupStateLabel = labelsOf(setupStateVocabulary);
export { setupStateVocabulary };

/** Set-ups last at most a season; a longer one is a typing mistake. */
export const MAX_SETUP_DAYS = 366;

export function setupDatesInOrder(v: { fromDate: string; toDate: string }, ctx: z.RefinementCtx) {
  if (v.toDate < v.fromDate)
    ctx.addIssue({
      code: 'custom',
      path: ['toDate'],
      message: 'The pull-down day is before the build-up day',
    });
  else if (daysBetween(v.fromDate, v.toDate) > MAX_SETUP_DAYS)
    ctx.addIssue({
      code: 'custom',
      path: ['toDate'],
      message: `At most ${MAX_SETUP_DAYS} days after build-up`,
    });
}

// ——— events at shared sites ———

/** POST /api/site-events: a fair (or any event) at a site for a range of days. */
export const siteEventFieldsSchema = z.object({
  name: requiredText(120),
  fromDate: calendarDate(),
  toDate: calendarDate(),
});
export const siteEventInputSchema = siteEventFieldsSchema
  .extend({ siteId: id() })
  .superRefine(setupDatesInOrder);
export type SiteEventInput = z.output<typeof siteEventInputSchema>;

export const siteEventSchema = z.object({
  id: z.string(),
  siteId: z.string(),
  siteName: z.string(),
  name: z.string(),
  fromDate: z.string(),
  toDate: z.string(),
});
export type SiteEvent = z.infer<typeof siteEventSchema>;
export const siteEventListResponseSchema = z.object({ events: z.array(siteEventSchema) });
export const siteEventResponseSchema = z.object({ event: siteEventSchema });

// ——— set-ups ———

/**
 * POST /api/setups: a ride's build-up at a site. It books the ride's set-up inspection, due on the build-up
 * day and assigned to `assignedTo` when given. A set-up whose build-up day has come starts at once.
 */
export const setupFieldsSchema = z.object({
  siteId: id(),
  eventId: z.union([id(), z.null()]).optional(),
  fromDate: calendarDate(),
  toDate: calendarDate(),
  pitch: nullableText(200).optional(),
  assignedTo: z.union([id(), z.null()]).optional(),
});
export const setupInputSchema = setupFieldsSchema.extend({ rideId: id() }).superRefine(setupDatesInOrder);
export type SetupInput = z.output<typeof setupInputSchema>;

/** POST /api/setups/:id/state: built (the ride stops until its set-up inspection is approved) or pulled down. */
export const setupStateInputSchema = z.object({
  state: z.enum(['set_up', 'pulled_down'], { error: 'Either set_up or pulled_down' }),
  note: nullableText(500).optional(),
});
export type SetupStateInput = z.output<typeof setupStateInputSchema>;

export const setupChangeSchema = z.object({
  at: z.string(),
  byName: z.string(),
  fromState: setupStateSchema.nullable(),
  toState: setupStateSchema,
  note: z.string().nullable(),
});
export type SetupChange = z.infer<typeof setupChangeSchema>;

export const setupSchema = z.object({
  id: z.string(),
  rideId: z.string(),
  rideName: z.string(),
  operatorName: z.string(),
  siteId: z.string(),
  siteName: z.string(),
  eventId: z.string().nullable(),
  eventName: z.string().nullable(),
  fromDate: z.string(),
  toDate: z.string(),
  pitch: z.string().nullable(),
  state: setupStateSchema,
  createdAt: z.string(),
  changes: z.array(setupChangeSchema),
});
export type Setup = z.infer<typeof setupSchema>;
export const setupListQuerySchema = z.object({
  rideId: z.string().trim().min(1).optional(),
  siteId: z.string().trim().min(1).optional(),
  eventId: z.string().trim().min(1).optional(),
});
export const setupListResponseSchema = z.object({ setups: z.array(setupSchema) });
export const setupResponseSchema = z.object({ setup: setupSchema });

/** The words a ride's page and Today show while a set-up waits for its inspection. */
export const setupPendingWords = (siteName: string) =>
  `Set up at ${siteName}: it may not run there until its set-up inspection is approved.`;

// ——— the planned round ———

/** Monday of the week `day` falls in (ISO 8601 weeks start on Monday). */
export function weekStartOf(day: string): string {
  const weekday = new Date(`${day}T00:00:00Z`).getUTCDay(); // 0 Sunday … 6 Saturday
  return addDays(day, -((weekday + 6) % 7));
}
export const weekDays = (monday: string) => Array.from({ length: 7 }, (_, i) => addDays(monday, i));

export const roundWeekQuerySchema = z.object({ week: calendarDate().optional() });

/** One inspection on the planner: a schedule due in the week or overdue, on the day it is planned for. */
export const roundItemSchema = z.object({
  scheduleId: z.string(),
  rideId: z.string(),
  rideName: z.string(),
  rideStatus: rideStatusSchema,
  operatorName: z.string(),
  siteId: z.string().nullable(),
  siteName: z.string().nullable(),
  inspectionType: inspectionTypeSchema,
  nextDueOn: z.string(),
  dueStatus: dueStatusSchema,
  /** The day of the round it is on: planned, else its due day, else (overdue) the week's first day. */
  day: z.string(),
  planned: z.boolean(),
  assignedTo: z.object({ id: z.string(), name: z.string() }).nullable(),
});
export type RoundItem = z.infer<typeof roundItemSchema>;

export const roundSiteSchema = z.object({
  siteId: z.string().nullable(),
  siteName: z.string().nullable(),
  items: z.array(roundItemSchema),
});
export const roundDaySchema = z.object({ day: z.string(), sites: z.array(roundSiteSchema) });
export type RoundDay = z.infer<typeof roundDaySchema>;
export const roundWeekSchema = z.object({ week: z.string(), days: z.array(roundDaySchema) });
export type RoundWeek = z.infer<typeof roundWeekSchema>;

/** PUT /api/rounds/items/:scheduleId: the day it is done on and who does it (null: unassigned). */
export const roundItemInputSchema = z.object({
  day: calendarDate(),
  assignedTo: z.union([id(), z.null()]),
});
export type RoundItemInput = z.output<typeof roundItemInputSchema>;

/** PUT /api/rounds/order: a day's sites in the order they are visited. */
export const roundOrderInputSchema = z.object({
  day: calendarDate(),
  siteIds: z
    .array(id())
    .min(1, 'At least one site')
    .max(100, 'At most 100 sites')
    .refine((ids) => new Set(ids).size === ids.length, 'A site is listed twice'),
});
export type RoundOrderInput = z.output<typeof roundOrderInputSchema>;

/**
 * The order of an inspector's Today: planned days first (earliest first), then the travel order of the
 * day's sites, then due date and name. Shared by the phone (offline) and the tests.
 */
export type RoundPlace = {
  plannedOn?: string | null;
  roundPosition?: number | null;
  nextDueOn?: string | null;
  name: string;
};
export function compareRoundPlaces(a: RoundPlace, b: RoundPlace): number {
  const day = (p: RoundPlace) => p.plannedOn ?? '9999-12-31';
  const pos = (p: RoundPlace) => p.roundPosition ?? Number.MAX_SAFE_INTEGER;
  const due = (p: RoundPlace) => p.nextDueOn ?? '9999-12-31';
  return (
    day(a).localeCompare(day(b)) ||
    pos(a) - pos(b) ||
    due(a).localeCompare(due(b)) ||
    a.name.localeCompare(b.name)
  );
}
