/**
 * The status rules' side of a travelling ride's set-ups (issue #19): whether the ride is stopped only for
 * its current set-up, the set-up inspection's booking on the ride's schedule, and what the approval of a
 * set-up inspection does to the set-up. Set-ups are made and moved in `server/setups`, above this layer;
 * the decision path (`decisions.ts`) reaches them only through here.
 */
import { and, asc, desc, eq, inArray } from 'drizzle-orm';

import { rideStatusChanges } from '@/db/server/review';
import { inspectionSchedules } from '@/db/server/schema';
import { setupChanges, setups } from '@/db/server/setups';
import type { Db } from '@/server/db';
import { createSchedule, updateSchedule } from '@/server/registry/schedules';
import { recordAudit } from '@/server/registry/audit';

/** The ride's set-up that is built and not yet cleared, if any. */
export function setUpAwaitingInspection(tx: Pick<Db, 'select'>, rideId: string) {
  return (
    tx
      .select({ id: setups.id, siteId: setups.siteId, fromDate: setups.fromDate })
      .from(setups)
      .where(and(eq(setups.rideId, rideId), eq(setups.state, 'set_up')))
      .get() ?? null
  );
}

/**
 * True when the ride's last change of status was the start of its current set-up: then the set-up is
 * the only cause of the stop, and its approved inspection may return the ride to service.
 */
export function stoppedForSetup(tx: Pick<Db, 'select'>, rideId: string): boolean {
  if (!setUpAwaitingInspection(tx, rideId)) return false;
  const last = tx
    .select({ event: rideStatusChanges.event })
    .from(rideStatusChanges)
    .where(eq(rideStatusChanges.rideId, rideId))
    .orderBy(desc(rideStatusChanges.at))
    .get();
  return last?.event === 'setup_started';
}

/**
 * Books the set-up inspection on the ride's `setup_after_assembly` schedule: due on the build-up day of
 * its earliest set-up still waiting for one (planned or built), assigned to `assignedTo` when given. With
 * none waiting, a booked due date is withdrawn. `db` because the schedule's writes run as savepoints.
 */
export function bookSetupInspection(
  db: Db,
  tx: Pick<Db, 'select'>,
  userId: string,
  rideId: string,
  now: Date,
  assignedTo?: string | null,
) {
  const waiting = tx
    .select({ fromDate: setups.fromDate })
    .from(setups)
    .where(and(eq(setups.rideId, rideId), inArray(setups.state, ['planned', 'set_up'])))
    .orderBy(asc(setups.fromDate))
    .get();
  const schedule = tx
    .select({ id: inspectionSchedules.id, dueOn: inspectionSchedules.dueOn })
    .from(inspectionSchedules)
    .where(
      and(
        eq(inspectionSchedules.rideId, rideId),
        eq(inspectionSchedules.inspectionType, 'setup_after_assembly'),
      ),
    )
    .get();
  const dueOn = waiting?.fromDate ?? null;
  const assign = assignedTo !== undefined ? { assignedTo } : {};
  if (schedule) {
    if (schedule.dueOn !== dueOn || assignedTo !== undefined)
      updateSchedule(db, userId, schedule.id, { dueOn, ...assign }, now);
  } else if (dueOn)
    createSchedule(
      db,
      userId,
      {
        rideId,
        inspectionType: 'setup_after_assembly',
        dueOn,
        ...assign,
        notes: 'Booked by a set-up: the ride runs at its new site after this inspection is approved.',
      },
      now,
    );
}

/** Records one move of a set-up's state (the set-up's own history, read by the ride's logbook). */
export function recordSetupChange(
  tx: Pick<Db, 'insert'>,
  input: {
    setupId: string;
    userId: string;
    from: string | null;
    to: string;
    note?: string | null;
    now: Date;
  },
) {
  tx.insert(setupChanges)
    .values({
      setupId: input.setupId,
      at: input.now.toISOString(),
      byUser: input.userId,
      fromState: input.from as (typeof setups.$inferSelect)['state'] | null,
      toState: input.to as (typeof setups.$inferSelect)['state'],
      note: input.note ?? null,
    })
    .run();
}

/**
 * After an approved set-up inspection with nothing forbidding operation: the built set-up is cleared to
 * run, and the schedule is booked for the next set-up waiting, if any.
 */
export function setupInspectionApproved(
  db: Db,
  tx: Pick<Db, 'select' | 'insert' | 'update'>,
  userId: string,
  rideId: string,
  clean: boolean,
  now: Date,
) {
  const current = setUpAwaitingInspection(tx, rideId);
  if (current && clean) {
    tx.update(setups).set({ state: 'cleared' }).where(eq(setups.id, current.id)).run();
    recordSetupChange(tx, {
      setupId: current.id,
      userId,
      from: 'set_up',
      to: 'cleared',
      note: 'Set-up inspection approved',
      now,
    });
    recordAudit(tx, {
      userId,
      entity: 'setup',
      entityId: current.id,
      action: 'update',
      rideId,
      summary: 'Set-up cleared to run: its set-up inspection was approved',
      before: { state: 'set_up' },
      after: { state: 'cleared' },
    });
  }
  bookSetupInspection(db, tx, userId, rideId, now);
}
