import { id, nullableText } from '@/features/registry/schema/fields';
import { pageSchema, pagingQuerySchema, searchQuery, sortQuery } from '@/lib/list-params';
import { listOf } from '@/features/registry/schema/rides';
import { rideClassSchema, rideStatusSchema } from '@/features/rides/schema';
import { z } from 'zod';

import { daysBetween, isRealIsoDay } from '@/lib/dates';
import { inspectionTypes, inspectionTypeVocabulary, labelsOf } from '@/lib/vocabulary';

// ——— schedules and assignments ———

export { inspectionTypes };
export const inspectionTypeSchema = z.enum(inspectionTypes, {
  error: `One of ${inspectionTypes.join(', ')}`,
});
export type InspectionType = z.infer<typeof inspectionTypeSchema>;
export const inspectionTypeLabel = labelsOf(inspectionTypeVocabulary);

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
  // Booked when the repair is done: due from the day it is set.
  after_repair: 0,
};

/** overdue: the due date has passed · due: within the type's window · upcoming: later · unscheduled: no date. */
export const dueStatuses = ['overdue', 'due', 'upcoming', 'unscheduled'] as const;
export const dueStatusSchema = z.enum(dueStatuses);
export type DueStatus = z.infer<typeof dueStatusSchema>;

/**
 * A schedule's due status on `today` (the date on its site's clock): overdue the day after its due date,
 * due within its type's window, else upcoming. The server (server/schedule-due.ts) and the phone, which
 * works it out offline from the ride's `siteTimeZone`, share it.
 */
export function dueStatusOn(type: InspectionType, next: string | null, today: string): DueStatus {
  if (next === null) return 'unscheduled';
  const days = daysBetween(today, next);
  if (days < 0) return 'overdue';
  return days <= dueWindowDays[type] ? 'due' : 'upcoming';
}

/** A calendar date, YYYY-MM-DD. */
export const calendarDate = () =>
  z
    .string({ error: 'Required' })
    .trim()
    .regex(/^\d{4}-\d{2}-\d{2}$/, 'Must be a date, YYYY-MM-DD')
    .refine(isRealIsoDay, 'Not a real date');

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
  /** The zone the ride's site counts its days in; due status and days until due are counted on it. */
  siteTimeZone: z.string().optional(),
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
  /** The ride's current site (absent from older servers). */
  siteId: z.string().nullable().optional(),
  /** The day the planner put it on the round, and its site's place in that day's travel order. */
  plannedOn: z.string().nullable().optional(),
  roundPosition: z.number().int().nullable().optional(),
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
