import { and, asc, count, eq, inArray, isNull, or, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { companies, inspectionSchedules, rides, sites, users } from '@/db/server/schema';
import { roundPlans, roundSiteOrder } from '@/db/server/setups';
import {
  inspectionTypeLabel,
  type Schedule,
  type ScheduleInput,
  type ScheduleListQuery,
  type SchedulePatch,
} from '@/features/registry/schema';
import type { Db } from '@/server/db';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { contains, offsetOf, orderBy } from '@/server/registry/query';
import { mustFindRide } from '@/server/registry/rides';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { dayInZone, daysBetween } from '@/lib/dates';
import {
  dueStatusOf,
  dueStatusSql,
  nextDueOn,
  nextDueSql,
  rideTodaySql,
  siteZoneSql,
  zoneDays,
} from '@/server/schedule-due';

const assignee = alias(users, 'assignee');

function scheduleRows(db: Pick<Db, 'select'>) {
  return (
    db
      .select({
        id: inspectionSchedules.id,
        rideId: inspectionSchedules.rideId,
        rideName: rides.name,
        rideClass: rides.rideClass,
        rideStatus: rides.status,
        siteName: sites.name,
        siteTimeZone: siteZoneSql,
        operatorName: companies.name,
        inspectionType: inspectionSchedules.inspectionType,
        intervalDays: inspectionSchedules.intervalDays,
        lastDoneOn: inspectionSchedules.lastDoneOn,
        dueOn: inspectionSchedules.dueOn,
        assignedToId: inspectionSchedules.assignedTo,
        assignedToName: assignee.name,
        assignedAt: inspectionSchedules.assignedAt,
        notes: inspectionSchedules.notes,
        createdAt: inspectionSchedules.createdAt,
        siteId: rides.siteId,
        plannedOn: roundPlans.plannedOn,
        roundPosition: roundSiteOrder.position,
      })
      .from(inspectionSchedules)
      .innerJoin(rides, eq(rides.id, inspectionSchedules.rideId))
      .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
      .leftJoin(sites, eq(sites.id, rides.siteId))
      .leftJoin(assignee, eq(assignee.id, inspectionSchedules.assignedTo))
      // The planner's day and the travel order of that day (issue #19's rounds).
      .leftJoin(roundPlans, eq(roundPlans.scheduleId, inspectionSchedules.id))
      .leftJoin(
        roundSiteOrder,
        and(eq(roundSiteOrder.day, roundPlans.plannedOn), eq(roundSiteOrder.siteId, rides.siteId)),
      )
  );
}

type Row = ReturnType<ReturnType<typeof scheduleRows>['all']>[number];

/** A schedule as of `now`: due and overdue are counted from the date on its site's clock. */
function toSchedule(row: Row, now: Date): Schedule {
  const { assignedToId, assignedToName, ...rest } = row;
  const today = dayInZone(now, row.siteTimeZone);
  const next = nextDueOn(row);
  return {
    ...rest,
    nextDueOn: next,
    dueStatus: dueStatusOf(row.inspectionType, next, today),
    daysUntilDue: next === null ? null : daysBetween(today, next),
    assignedTo: assignedToId ? { id: assignedToId, name: assignedToName ?? '' } : null,
  };
}

export function listSchedules(db: Db, query: ScheduleListQuery, now: Date, me: string) {
  const today = rideTodaySql(zoneDays(db, now.toISOString()), inspectionSchedules.rideId);
  const assigned =
    query.assignedTo === undefined
      ? undefined
      : query.assignedTo === 'none'
        ? isNull(inspectionSchedules.assignedTo)
        : eq(inspectionSchedules.assignedTo, query.assignedTo === 'me' ? me : query.assignedTo);
  const where = and(
    query.rideId ? eq(inspectionSchedules.rideId, query.rideId) : undefined,
    query.inspectionType?.length
      ? inArray(inspectionSchedules.inspectionType, query.inspectionType)
      : undefined,
    query.dueStatus?.length ? inArray(dueStatusSql(today), query.dueStatus) : undefined,
    assigned,
    query.q
      ? or(contains(rides.name, query.q), contains(sites.name, query.q), contains(companies.name, query.q))
      : undefined,
  );
  const total =
    db
      .select({ n: count() })
      .from(inspectionSchedules)
      .innerJoin(rides, eq(rides.id, inspectionSchedules.rideId))
      .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
      .leftJoin(sites, eq(sites.id, rides.siteId))
      .where(where)
      .get()?.n ?? 0;
  // Undated schedules sort after dated ones, whichever way.
  const undatedLast = sql`${nextDueSql} IS NULL`;
  const rows = scheduleRows(db)
    .where(where)
    .orderBy(
      asc(undatedLast),
      ...orderBy(
        query.sort,
        {
          nextDue: nextDueSql,
          ride: rides.name,
          type: inspectionSchedules.inspectionType,
          assignee: assignee.name,
        },
        [asc(nextDueSql)],
        [rides.name, inspectionSchedules.inspectionType],
      ),
    )
    .limit(query.pageSize)
    .offset(offsetOf(query))
    .all();
  return {
    schedules: rows.map((r) => toSchedule(r, now)),
    total,
    page: query.page,
    pageSize: query.pageSize,
  };
}

/** The inspections assigned to one user, soonest first (undated last). */
export function assignmentsOf(db: Db, userId: string, now: Date): Schedule[] {
  return scheduleRows(db)
    .where(eq(inspectionSchedules.assignedTo, userId))
    .orderBy(asc(sql`${nextDueSql} IS NULL`), asc(nextDueSql), asc(rides.name))
    .all()
    .map((r) => toSchedule(r, now));
}

export function findSchedule(db: Pick<Db, 'select'>, id: string, now: Date): Schedule | null {
  const row = scheduleRows(db).where(eq(inspectionSchedules.id, id)).get();
  return row ? toSchedule(row, now) : null;
}

function mustFindSchedule(db: Pick<Db, 'select'>, id: string, now: Date): Schedule {
  const found = findSchedule(db, id, now);
  if (!found) throw notFound('No such schedule.');
  return found;
}

/** Only an active inspector can be given an inspection. */
function assertInspector(db: Pick<Db, 'select'>, userId: string): void {
  const user = db
    .select({ role: users.role, disabledAt: users.disabledAt })
    .from(users)
    .where(eq(users.id, userId))
    .get();
  if (user?.role !== 'inspector' || user.disabledAt !== null)
    throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
      { path: 'assignedTo', message: 'Choose an active inspector' },
    ]);
}

function summaryOf(s: Schedule) {
  return `${s.rideName}: ${inspectionTypeLabel[s.inspectionType].toLowerCase()} inspection schedule`;
}

export function createSchedule(db: Db, userId: string, input: ScheduleInput, now: Date): Schedule {
  return db.transaction((tx) => {
    mustFindRide(tx, input.rideId);
    if (input.assignedTo) assertInspector(tx, input.assignedTo);
    const existing = tx
      .select({ id: inspectionSchedules.id })
      .from(inspectionSchedules)
      .where(
        and(
          eq(inspectionSchedules.rideId, input.rideId),
          eq(inspectionSchedules.inspectionType, input.inspectionType),
        ),
      )
      .get();
    if (existing)
      throw conflict(
        `This ride already has a ${inspectionTypeLabel[input.inspectionType].toLowerCase()} schedule; change that one.`,
        'schedule_exists',
      );
    const { id } = tx
      .insert(inspectionSchedules)
      .values({
        rideId: input.rideId,
        inspectionType: input.inspectionType,
        intervalDays: input.intervalDays ?? null,
        lastDoneOn: input.lastDoneOn ?? null,
        dueOn: input.dueOn ?? null,
        assignedTo: input.assignedTo ?? null,
        assignedAt: input.assignedTo ? now.toISOString() : null,
        notes: input.notes ?? null,
      })
      .returning({ id: inspectionSchedules.id })
      .get();
    const schedule = mustFindSchedule(tx, id, now);
    recordAudit(tx, {
      userId,
      entity: 'schedule',
      entityId: id,
      action: 'create',
      rideId: input.rideId,
      summary: `${summaryOf(schedule)} added`,
      after: schedule,
    });
    refreshQueue(tx, queueDay(db, now), [input.rideId]);
    return schedule;
  });
}

export function updateSchedule(
  db: Db,
  userId: string,
  id: string,
  patch: SchedulePatch,
  now: Date,
): Schedule {
  return db.transaction((tx) => {
    const before = mustFindSchedule(tx, id, now);
    if (patch.assignedTo) assertInspector(tx, patch.assignedTo);
    const lastDoneOn = patch.lastDoneOn !== undefined ? patch.lastDoneOn : before.lastDoneOn;
    let dueOn = patch.dueOn !== undefined ? patch.dueOn : before.dueOn;
    // A one-off due date is met by an inspection on or after it, unless this change sets a new one.
    if (patch.dueOn === undefined && patch.lastDoneOn && dueOn && dueOn <= patch.lastDoneOn) dueOn = null;
    const assignedTo = patch.assignedTo !== undefined ? patch.assignedTo : (before.assignedTo?.id ?? null);
    const assignmentChanged = assignedTo !== (before.assignedTo?.id ?? null);
    tx.update(inspectionSchedules)
      .set({
        ...(patch.intervalDays !== undefined && { intervalDays: patch.intervalDays }),
        ...(patch.notes !== undefined && { notes: patch.notes }),
        lastDoneOn,
        dueOn,
        assignedTo,
        ...(assignmentChanged && { assignedAt: assignedTo ? now.toISOString() : null }),
      })
      .where(eq(inspectionSchedules.id, id))
      .run();
    const after = mustFindSchedule(tx, id, now);
    recordAudit(tx, {
      userId,
      entity: 'schedule',
      entityId: id,
      action: 'update',
      rideId: after.rideId,
      summary: `${summaryOf(after)} changed`,
      before,
      after,
    });
    refreshQueue(tx, queueDay(db, now), [after.rideId]);
    return after;
  });
}

export function deleteSchedule(db: Db, userId: string, id: string, now: Date): void {
  db.transaction((tx) => {
    const before = mustFindSchedule(tx, id, now);
    tx.delete(inspectionSchedules).where(eq(inspectionSchedules.id, id)).run();
    recordAudit(tx, {
      userId,
      entity: 'schedule',
      entityId: id,
      action: 'delete',
      rideId: before.rideId,
      summary: `${summaryOf(before)} removed`,
      before,
    });
    refreshQueue(tx, queueDay(db, now), [before.rideId]);
  });
}

/** Active inspectors, for the assignment picker. */
export function listInspectors(db: Pick<Db, 'select'>) {
  return db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(and(eq(users.role, 'inspector'), isNull(users.disabledAt)))
    .orderBy(asc(users.name))
    .all();
}
