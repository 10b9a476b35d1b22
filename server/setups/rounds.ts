/**
 * The planner's week (issue #19): every scheduled inspection due in the week or overdue, on the day of the
 * round it is planned for, grouped by site in the day's travel order; and the planner's two writes, an
 * inspection's day and inspector, and a day's order of sites. The inspector's phone gets the same plan in
 * its assignments (`plannedOn`, `roundPosition` on each schedule) with the sync pull.
 */
import { asc, eq, inArray } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { companies, inspectionSchedules, rides, sites, users } from '@/db/server/schema';
import { roundPlans, roundSiteOrder } from '@/db/server/setups';
import {
  weekDays,
  type RoundDay,
  type RoundItem,
  type RoundItemInput,
  type RoundOrderInput,
  type RoundWeek,
} from '@/features/registry/schema';
import { dayInZone } from '@/lib/dates';
import type { Db } from '@/server/db';
import { HttpError, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { updateSchedule } from '@/server/registry/schedules';
import { dueStatusOf, nextDueOn, siteZoneSql } from '@/server/schedule-due';

const assignee = alias(users, 'round_assignee');

/** The planner's week starting on `monday`, as of `now` (due status on each site's clock). */
export function roundWeek(db: Pick<Db, 'select'>, monday: string, now: Date): RoundWeek {
  const days = weekDays(monday);
  const sunday = days[6];
  const rows = db
    .select({
      scheduleId: inspectionSchedules.id,
      rideId: rides.id,
      rideName: rides.name,
      rideStatus: rides.status,
      operatorName: companies.name,
      siteId: rides.siteId,
      siteName: sites.name,
      siteTimeZone: siteZoneSql,
      inspectionType: inspectionSchedules.inspectionType,
      dueOn: inspectionSchedules.dueOn,
      lastDoneOn: inspectionSchedules.lastDoneOn,
      intervalDays: inspectionSchedules.intervalDays,
      plannedOn: roundPlans.plannedOn,
      assignedToId: inspectionSchedules.assignedTo,
      assignedToName: assignee.name,
    })
    .from(inspectionSchedules)
    .innerJoin(rides, eq(rides.id, inspectionSchedules.rideId))
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .leftJoin(sites, eq(sites.id, rides.siteId))
    .leftJoin(assignee, eq(assignee.id, inspectionSchedules.assignedTo))
    .leftJoin(roundPlans, eq(roundPlans.scheduleId, inspectionSchedules.id))
    .all();
  const items: RoundItem[] = [];
  for (const r of rows) {
    const next = nextDueOn(r);
    if (next === null) continue;
    const dueStatus = dueStatusOf(r.inspectionType, next, dayInZone(now, r.siteTimeZone));
    const inWeek = (d: string) => d >= monday && d <= sunday;
    // Planned for a day: shown on that day's week only. Else on its due day, or carried in when overdue.
    const day =
      r.plannedOn ?? (inWeek(next) ? next : dueStatus === 'overdue' && next < monday ? monday : null);
    if (day === null || !inWeek(day)) continue;
    items.push({
      scheduleId: r.scheduleId,
      rideId: r.rideId,
      rideName: r.rideName,
      rideStatus: r.rideStatus,
      operatorName: r.operatorName,
      siteId: r.siteId,
      siteName: r.siteName,
      inspectionType: r.inspectionType,
      nextDueOn: next,
      dueStatus,
      day,
      planned: r.plannedOn !== null,
      assignedTo: r.assignedToId ? { id: r.assignedToId, name: r.assignedToName ?? '' } : null,
    });
  }
  const order = db.select().from(roundSiteOrder).where(inArray(roundSiteOrder.day, days)).all();
  const position = (day: string, siteId: string | null) =>
    order.find((o) => o.day === day && o.siteId === siteId)?.position ?? Number.MAX_SAFE_INTEGER;
  const result: RoundDay[] = days.map((day) => {
    const today = items.filter((i) => i.day === day);
    const siteIds = [...new Set(today.map((i) => i.siteId))];
    const groups = siteIds.map((siteId) => {
      const mine = today
        .filter((i) => i.siteId === siteId)
        .sort((a, b) => a.nextDueOn.localeCompare(b.nextDueOn) || a.rideName.localeCompare(b.rideName));
      return { siteId, siteName: mine[0]?.siteName ?? null, items: mine };
    });
    groups.sort(
      (a, b) =>
        position(day, a.siteId) - position(day, b.siteId) ||
        (a.siteName ?? '\uffff').localeCompare(b.siteName ?? '\uffff'),
    );
    return { day, sites: groups };
  });
  return { week: monday, days: result };
}

/** Puts one scheduled inspection on a day of the round and gives it to an inspector (or to no one). */
export function planRoundItem(db: Db, userId: string, scheduleId: string, input: RoundItemInput, now: Date) {
  return db.transaction((tx) => {
    const schedule = tx
      .select({
        id: inspectionSchedules.id,
        rideId: inspectionSchedules.rideId,
        assignedTo: inspectionSchedules.assignedTo,
        plannedOn: roundPlans.plannedOn,
      })
      .from(inspectionSchedules)
      .leftJoin(roundPlans, eq(roundPlans.scheduleId, inspectionSchedules.id))
      .where(eq(inspectionSchedules.id, scheduleId))
      .get();
    if (!schedule) throw notFound('No such schedule.');
    // The schedule's own update checks the inspector and writes its audit entry and queue rows.
    if (input.assignedTo !== schedule.assignedTo)
      updateSchedule(db, userId, scheduleId, { assignedTo: input.assignedTo }, now);
    const at = now.toISOString();
    tx.insert(roundPlans)
      .values({ scheduleId, plannedOn: input.day, updatedAt: at })
      .onConflictDoUpdate({ target: roundPlans.scheduleId, set: { plannedOn: input.day, updatedAt: at } })
      .run();
    recordAudit(tx, {
      userId,
      entity: 'round',
      entityId: scheduleId,
      action: 'update',
      rideId: schedule.rideId,
      summary: `Round: inspection planned for ${input.day}`,
      before: { day: schedule.plannedOn, assignedTo: schedule.assignedTo },
      after: input,
    });
  });
}

/** A day's travel order: `siteIds` in the order visited; sites left out follow, by name. */
export function orderRoundDay(db: Db, userId: string, input: RoundOrderInput) {
  return db.transaction((tx) => {
    const known = tx.select({ id: sites.id }).from(sites).where(inArray(sites.id, input.siteIds)).all();
    const missing = input.siteIds.findIndex((id) => !known.some((k) => k.id === id));
    if (missing >= 0)
      throw new HttpError(400, 'validation_failed', 'No such site', [
        { path: `siteIds.${missing}`, message: 'No such site' },
      ]);
    const before = tx
      .select({ siteId: roundSiteOrder.siteId })
      .from(roundSiteOrder)
      .where(eq(roundSiteOrder.day, input.day))
      .orderBy(asc(roundSiteOrder.position))
      .all()
      .map((r) => r.siteId);
    tx.delete(roundSiteOrder).where(eq(roundSiteOrder.day, input.day)).run();
    tx.insert(roundSiteOrder)
      .values(input.siteIds.map((siteId, position) => ({ day: input.day, siteId, position })))
      .run();
    recordAudit(tx, {
      userId,
      entity: 'round',
      entityId: input.day,
      action: 'update',
      summary: `Round: travel order of ${input.day} changed`,
      before: { siteIds: before },
      after: { siteIds: input.siteIds },
    });
  });
}
