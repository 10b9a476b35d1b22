/**
 * Each pivot's wear trends: the pin diameters and bushing clearances measured at the ride's inspections
 * (those not amended since, as the review desk's trends; the last reading of a kind per pivot in each
 * inspection, dated by the inspection's submission day), projected to the current design's limits by
 * features/fatigue/wear-trend.ts against days and against the ride cycles logged by the operator.
 *
 * The next scheduled inspection is the earliest next due date among the ride's schedules of the types that
 * have measured its wear (a daily pre-opening check does not measure pins, common practice); a ride without
 * such history compares with every schedule but the daily one.
 *
 * Logged cycles at a reading: the ride cycles of the running log up to and including its day (hours turned
 * into ride cycles at the design's ride cycle time); null for a reading before the log's first day. A
 * projection in cycles becomes a date on the log itself when it is already behind us, else at the recent
 * rate: ride cycles per calendar day over the last 90 days of the log.
 */
import { and, asc, eq, inArray, isNotNull, notExists, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { inspectionReadings, inspections } from '@/db/server/inspections';
import { runningLog } from '@/db/server/life';
import { inspectionSchedules } from '@/db/server/schema';
import { projectWear } from '@/features/fatigue/wear-trend';
import type { DesignData } from '@/features/loads/design-schema';
import type { WearTrend } from '@/features/pivot-life/schema';
import { addDays, daysBetween, isoDay } from '@/lib/dates';
import type { Db } from '@/server/db';
import { findDesignVersion } from '@/server/registry/design';
import { nextDueOn } from '@/server/schedule-due';

/** The window the running rate is taken over, calendar days ending on the log's last day. */
export const WEAR_RATE_WINDOW_DAYS = 90;
/** Beyond this a projected date says nothing useful. */
const HORIZON_DAYS = 100 * 365;

const amendment = alias(inspections, 'amendment');

type WearKind = 'pin_diameter' | 'clearance';
type Reading = {
  inspectionId: string;
  type: string;
  on: string;
  joint: number;
  kind: WearKind;
  valueM: number;
};

/** The last pin diameter and clearance per pivot of each inspection not amended since, oldest first. */
function wearReadings(db: Pick<Db, 'select'>, rideId: string): Reading[] {
  const rows = db
    .select({
      inspectionId: inspections.id,
      type: inspections.type,
      submittedAt: inspections.submittedAt,
      joint: inspectionReadings.joint,
      kind: inspectionReadings.kind,
      valueSi: inspectionReadings.valueSi,
    })
    .from(inspectionReadings)
    .innerJoin(inspections, eq(inspections.id, inspectionReadings.inspectionId))
    .where(
      and(
        eq(inspectionReadings.rideId, rideId),
        eq(inspections.rideId, rideId),
        inArray(inspectionReadings.kind, ['pin_diameter', 'clearance']),
        isNotNull(inspectionReadings.joint),
        notExists(
          db.select({ id: amendment.id }).from(amendment).where(eq(amendment.amendsId, inspections.id)),
        ),
      ),
    )
    .orderBy(
      asc(inspections.submittedAt),
      asc(inspections.id),
      asc(inspectionReadings.takenAt),
      sql`"inspection_readings"."rowid"`,
    )
    .all();
  // The last of a kind for a pivot in one inspection is the one that counts, as in the load check.
  const last = new Map<string, Reading>();
  for (const r of rows) {
    if (r.joint === null || !Number.isFinite(r.valueSi)) continue;
    const kind = r.kind as WearKind;
    const key = `${r.inspectionId}|${r.joint}|${kind}`;
    last.delete(key); // re-inserted, so the map keeps the order of the latest
    last.set(key, {
      inspectionId: r.inspectionId,
      type: r.type,
      on: isoDay(r.submittedAt),
      joint: r.joint,
      kind,
      valueM: r.valueSi,
    });
  }
  return [...last.values()];
}

/** The earliest next due date among the schedules of the given types (all but daily when none). */
function nextInspection(db: Pick<Db, 'select'>, rideId: string, types: ReadonlySet<string>): string | null {
  let next: string | null = null;
  for (const s of db
    .select({
      type: inspectionSchedules.inspectionType,
      dueOn: inspectionSchedules.dueOn,
      lastDoneOn: inspectionSchedules.lastDoneOn,
      intervalDays: inspectionSchedules.intervalDays,
    })
    .from(inspectionSchedules)
    .where(eq(inspectionSchedules.rideId, rideId))
    .all()) {
    const counts = types.size ? types.has(s.type) : s.type !== 'daily_pre_opening';
    const due = counts ? nextDueOn(s) : null;
    if (due !== null && (next === null || due < next)) next = due;
  }
  return next;
}

/** Cumulative logged ride cycles by day, and the day a number of cycles is (or will be) reached. */
export type CyclesLog = {
  cyclesAt: (day: string) => number | null;
  dayAtCycles: (cycles: number) => string | null;
  cyclesPerDay: number | null;
};

export function cyclesLog(
  days: readonly { day: string; cycles: number | null; hours: number | null }[],
  rideCycleS: number | null,
): CyclesLog {
  const perDay = (d: { cycles: number | null; hours: number | null }) =>
    d.cycles !== null ? d.cycles : d.hours !== null && rideCycleS ? (d.hours * 3600) / rideCycleS : 0;
  const sorted = [...days].sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0));
  const cumulative: { day: string; total: number }[] = [];
  let total = 0;
  for (const d of sorted) cumulative.push({ day: d.day, total: (total += perDay(d)) });
  if (cumulative.length === 0) return { cyclesAt: () => null, dayAtCycles: () => null, cyclesPerDay: null };
  const first = cumulative[0].day;
  const lastDay = cumulative[cumulative.length - 1].day;
  const windowStart = addDays(lastDay, -(WEAR_RATE_WINDOW_DAYS - 1));
  const rateFrom = windowStart > first ? windowStart : first;
  const inWindow = sorted.filter((d) => d.day >= rateFrom).reduce((s, d) => s + perDay(d), 0);
  const cyclesPerDay = inWindow / (daysBetween(rateFrom, lastDay) + 1);
  return {
    cyclesPerDay,
    cyclesAt(day) {
      if (day < first) return null;
      let at = 0;
      for (const c of cumulative) if (c.day <= day) at = c.total;
      return at;
    },
    dayAtCycles(cycles) {
      for (const c of cumulative) if (c.total >= cycles) return c.day;
      if (!(cyclesPerDay > 0)) return null;
      const ahead = Math.ceil((cycles - total) / cyclesPerDay);
      return ahead > HORIZON_DAYS ? null : addDays(lastDay, ahead);
    },
  };
}

/**
 * Per pivot (by joint), its wear trends: pin diameter, then clearance, each where the pivot has readings
 * of it. Pivots without readings are absent. Limits come from the design in force; without one, the map is
 * empty (there is no pivot to speak of).
 */
export function rideWearTrends(
  db: Pick<Db, 'select'>,
  rideId: string,
  today: string,
): Map<number, WearTrend[]> {
  const out = new Map<number, WearTrend[]>();
  const design: DesignData | undefined = findDesignVersion(db, rideId)?.data;
  if (!design) return out;
  const readings = wearReadings(db, rideId);
  if (readings.length === 0) return out;
  const log = cyclesLog(
    db
      .select({ day: runningLog.day, cycles: runningLog.cycles, hours: runningLog.hours })
      .from(runningLog)
      .where(eq(runningLog.rideId, rideId))
      .all(),
    design.fatigue?.rideCycleS ?? null,
  );
  const next = nextInspection(db, rideId, new Set(readings.map((r) => r.type)));
  const joints = [...new Set(readings.map((r) => r.joint))].sort((a, b) => a - b);
  for (const joint of joints) {
    const pivot = design.pivots.find((p) => p.joint === joint);
    const trends: WearTrend[] = [];
    for (const quantity of ['pin_diameter', 'clearance'] as const) {
      const own = readings.filter((r) => r.joint === joint && r.kind === quantity);
      if (own.length === 0) continue;
      const limitM = !pivot
        ? null
        : quantity === 'pin_diameter'
          ? pivot.minimumDiameterM
          : pivot.maxClearanceM;
      trends.push(
        projectWear({
          quantity,
          readings: own.map((r) => ({ on: r.on, valueM: r.valueM, cycles: log.cyclesAt(r.on) })),
          limitM,
          today,
          nextInspectionOn: next,
          dayAtCycles: log.cyclesPerDay === null ? undefined : log.dayAtCycles,
        }),
      );
    }
    out.set(joint, trends);
  }
  return out;
}
