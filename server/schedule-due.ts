/**
 * When a schedule falls due: the next due date and its due status, in TypeScript for one schedule and in
 * SQL for whole lists. The schedules service and the review queue's overdue rows both use them, so they
 * sit below both.
 */
import { sql } from 'drizzle-orm';

import { inspectionSchedules } from '@/db/server/schema';
import { dueWindowDays, inspectionTypes, type DueStatus } from '@/features/registry/schema';
import { addDays, daysBetween } from '@/lib/dates';

/** The next due date: the explicit one, else last done + interval; null when neither gives one. */
export function nextDueOn(s: {
  dueOn: string | null;
  lastDoneOn: string | null;
  intervalDays: number | null;
}) {
  if (s.dueOn) return s.dueOn;
  if (s.lastDoneOn && s.intervalDays) return addDays(s.lastDoneOn, s.intervalDays);
  return null;
}

export function dueStatusOf(type: keyof typeof dueWindowDays, next: string | null, today: string): DueStatus {
  if (next === null) return 'unscheduled';
  const days = daysBetween(today, next);
  if (days < 0) return 'overdue';
  return days <= dueWindowDays[type] ? 'due' : 'upcoming';
}

// The same two rules in SQL, for filtering and sorting whole lists in the database.
export const nextDueSql = sql`COALESCE(${inspectionSchedules.dueOn}, CASE WHEN ${inspectionSchedules.lastDoneOn} IS NOT NULL AND ${inspectionSchedules.intervalDays} IS NOT NULL THEN date(${inspectionSchedules.lastDoneOn}, '+' || ${inspectionSchedules.intervalDays} || ' days') END)`;
const windowSql = sql.raw(
  `CASE "inspection_schedules"."inspection_type" ${inspectionTypes.map((t) => `WHEN '${t}' THEN ${dueWindowDays[t]}`).join(' ')} END`,
);
export const dueStatusSql = (today: string) =>
  sql<DueStatus>`CASE WHEN ${nextDueSql} IS NULL THEN 'unscheduled' WHEN ${nextDueSql} < ${today} THEN 'overdue' WHEN ${nextDueSql} <= date(${today}, '+' || (${windowSql}) || ' days') THEN 'due' ELSE 'upcoming' END`;
