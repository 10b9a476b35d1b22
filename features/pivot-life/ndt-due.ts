/**
 * When each planned NDT at a pivot falls due: the last test of that method plus the plan's interval, or,
 * for a method never tested there, the day the plan took effect. Pure: the server's queue flags, the ride's
 * life, the reminders and the app all use it, so they agree on every date.
 */
import type { NdtMethod, NdtPlan } from '@/features/loads/design-schema';
import type { NdtDue, NdtDueState } from '@/features/pivot-life/schema';
import { addDays, daysBetween } from '@/lib/dates';

/** A test within this many days of its due date is shown as due (not yet overdue). */
export const NDT_DUE_WINDOW_DAYS = 30;

/** What `ndtDue` needs of a record: the method, the day tested (YYYY-MM-DD) and the result. */
export type NdtTest = { method: NdtMethod; testedOn: string; result: string };

/** The day a plan took effect: one day for every method, or a day per method (missing ones: `fallback`). */
export type PlanFrom = string | { byMethod: Partial<Record<NdtMethod, string>>; fallback: string };

const fromOf = (planFrom: PlanFrom, method: NdtMethod) =>
  typeof planFrom === 'string' ? planFrom : (planFrom.byMethod[method] ?? planFrom.fallback);

export function ndtDueState(dueOn: string, today: string, neverTested: boolean): NdtDueState {
  if (neverTested) return 'never_tested';
  const days = daysBetween(today, dueOn);
  if (days < 0) return 'overdue';
  return days <= NDT_DUE_WINDOW_DAYS ? 'due' : 'upcoming';
}

/**
 * One entry per plan of a pivot, in the plan's order. `records` are the pivot's tests in any order; the
 * latest test of a plan's method counts (a later row wins a tie, as it was reported later). A method
 * never tested is due from the day its plan took effect, with state `never_tested` (overdue when that day
 * is past: `isNdtOverdue`).
 */
export function ndtDue(
  plans: readonly NdtPlan[],
  records: readonly NdtTest[],
  today: string,
  planFrom: PlanFrom,
): NdtDue[] {
  const last = new Map<NdtMethod, NdtTest>();
  for (const r of records) {
    const known = last.get(r.method);
    if (!known || r.testedOn >= known.testedOn) last.set(r.method, r);
  }
  return plans.map((plan) => {
    const test = last.get(plan.method);
    const dueOn = test ? addDays(test.testedOn, plan.intervalDays) : fromOf(planFrom, plan.method);
    return {
      method: plan.method,
      intervalDays: plan.intervalDays,
      lastOn: test?.testedOn ?? null,
      lastResult: test?.result ?? null,
      dueOn,
      state: ndtDueState(dueOn, today, !test),
    };
  });
}

/** Past its due date on `today` — tested before or never tested. */
export const isNdtOverdue = (due: NdtDue, today: string) => due.dueOn !== null && due.dueOn < today;

/** The earliest due date of a list (null when none has one). */
export function earliestNdtDue(dues: readonly NdtDue[]): string | null {
  let earliest: string | null = null;
  for (const d of dues) if (d.dueOn && (earliest === null || d.dueOn < earliest)) earliest = d.dueOn;
  return earliest;
}
