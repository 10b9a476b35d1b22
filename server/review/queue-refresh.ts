/**
 * Keeps the review queue's read model (`review_queue`) in step with what decides it. The queue is read far
 * more often than it changes, so its rows are computed on write, and reading a page is one indexed query.
 *
 * Call `refreshQueue(db, today, rideIds)` in the same transaction as any change to what decides a ride's
 * rows: an inspection arriving, analysed or decided; findings added, changed or closed; schedules; the
 * ride's name, class, status, site or operator. A rename of a site, company or person refreshes their
 * rides. `ensureQueueFresh` rebuilds everything once per calendar day, since "overdue" and "past due"
 * change with the date alone.
 */
import { sql, type SQL } from 'drizzle-orm';

import { findings, reviewQueue } from '@/db/server/review';
import { inspections } from '@/db/server/inspections';
import { companies, inspectionSchedules, rides, sites, users } from '@/db/server/schema';
import type { Db } from '@/server/db';
import { nextDueSql } from '@/server/registry/schedules';

type Tx = Pick<Db, 'run'>;

/** Today as the queue sees it: the UTC calendar date. */
export const queueToday = (now: Date = new Date()) => now.toISOString().slice(0, 10);

let generation = 0;

/**
 * Bumped by every refresh (even one whose transaction then rolls back: a needless bump only costs a
 * recount), so readers may keep figures derived from the queue for as long as it stays the same.
 */
export const queueGeneration = (): number => generation;

/**
 * Recomputes the queue rows of the given rides (all rides when `rideIds` is omitted) for `today`
 * (YYYY-MM-DD). Idempotent; cheap for a few rides, a second or so for tens of thousands.
 */
export function refreshQueue(db: Tx, today: string, rideIds?: readonly string[]): void {
  if (rideIds && rideIds.length === 0) return;
  generation++;
  const ids = rideIds ? JSON.stringify([...new Set(rideIds)]) : null;
  const onlyRides = (column: SQL): SQL =>
    ids === null ? sql`1` : sql`${column} IN (SELECT value FROM json_each(${ids}))`;

  db.run(sql`DELETE FROM ${reviewQueue} WHERE ${onlyRides(sql`${reviewQueue.rideId}`)}`);
  db.run(sql`
    WITH
      ride_due AS (
        SELECT ${inspectionSchedules.rideId} AS ride_id, MIN(${nextDueSql}) AS overdue_since
        FROM ${inspectionSchedules}
        WHERE ${nextDueSql} < ${today} AND ${onlyRides(sql`${inspectionSchedules.rideId}`)}
        GROUP BY ${inspectionSchedules.rideId}
      ),
      ride_past AS (
        SELECT f.ride_id AS ride_id, COUNT(*) AS n, MIN(f.due_on) AS first_due
        FROM ${findings} f
        WHERE f.state <> 'closed' AND f.due_on IS NOT NULL AND f.due_on < ${today}
          AND ${onlyRides(sql`f.ride_id`)}
        GROUP BY f.ride_id
      ),
      pending AS (
        SELECT i.* FROM ${inspections} i
        WHERE i.review_state = 'submitted'
          AND NOT EXISTS (SELECT 1 FROM ${inspections} a WHERE a.amends_id = i.id)
          AND ${onlyRides(sql`i.ride_id`)}
      )
    INSERT INTO ${reviewQueue} (
      key, kind, inspection_id, inspection_type, ride_id, ride_name, ride_class, ride_status, site_id,
      site_name, operator_id, operator_name, inspector_id, inspector_name, urgency, at, analysis_status,
      failed_items, overdue_since, findings_past_due, search
    )
    SELECT
      'i:' || i.id, 'inspection', i.id, i.type, r.id, r.name, r.ride_class, r.status, r.site_id,
      s.name, r.operator_company_id, c.name, i.inspector_id, u.name,
      CASE
        WHEN i.analysis_status = 'over' THEN 0
        WHEN i.failed_items > 0 THEN 1
        WHEN i.analysis_status = 'near' THEN 2
        WHEN d.overdue_since IS NOT NULL THEN 3
        WHEN p.n > 0 THEN 4
        ELSE 5
      END,
      -- Phones may send a local offset; in UTC every item's date sorts and compares as text.
      COALESCE(strftime('%Y-%m-%dT%H:%M:%fZ', i.submitted_at), i.submitted_at),
      i.analysis_status, i.failed_items, d.overdue_since, COALESCE(p.n, 0),
      lower(r.name || ' ' || COALESCE(r.serial, '') || ' ' || COALESCE(s.name, '') || ' ' || c.name || ' ' || u.name)
    FROM pending i
      JOIN ${rides} r ON r.id = i.ride_id
      JOIN ${companies} c ON c.id = r.operator_company_id
      JOIN ${users} u ON u.id = i.inspector_id
      LEFT JOIN ${sites} s ON s.id = r.site_id
      LEFT JOIN ride_due d ON d.ride_id = r.id
      LEFT JOIN ride_past p ON p.ride_id = r.id
    UNION ALL
    SELECT
      'r:' || r.id, 'ride', NULL, NULL, r.id, r.name, r.ride_class, r.status, r.site_id,
      s.name, r.operator_company_id, c.name, NULL, NULL,
      CASE WHEN d.overdue_since IS NOT NULL THEN 3 ELSE 4 END,
      COALESCE(d.overdue_since, p.first_due), NULL, 0, d.overdue_since, COALESCE(p.n, 0),
      lower(r.name || ' ' || COALESCE(r.serial, '') || ' ' || COALESCE(s.name, '') || ' ' || c.name)
    FROM ${rides} r
      JOIN ${companies} c ON c.id = r.operator_company_id
      LEFT JOIN ${sites} s ON s.id = r.site_id
      LEFT JOIN ride_due d ON d.ride_id = r.id
      LEFT JOIN ride_past p ON p.ride_id = r.id
    WHERE (d.overdue_since IS NOT NULL OR p.n > 0)
      AND NOT EXISTS (SELECT 1 FROM pending i WHERE i.ride_id = r.id)
      AND ${onlyRides(sql`r.id`)}
  `);
}

const sweptOn = new WeakMap<object, string>();

/**
 * The day to refresh a few rides for, from a write path: the day the whole queue was last rebuilt for, so
 * every row is judged against the same date (a pinned test clock included); before any rebuild, today.
 */
export const queueDay = (db: Db, now: Date = new Date()): string => sweptOn.get(db) ?? queueToday(now);

/** Rebuilds the whole queue the first time it is read on a new calendar day (and after start-up). */
export function ensureQueueFresh(db: Db, today: string): void {
  if (sweptOn.get(db) === today) return;
  db.transaction((tx) => refreshQueue(tx, today));
  sweptOn.set(db, today);
}
