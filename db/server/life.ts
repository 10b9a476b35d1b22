/**
 * The operators' running log of their rides (cycles or hours per day), from which each pivot's fatigue
 * damage accumulates (server/pivot-life). Tables added by issue #14. Same conventions as
 * db/server/schema.ts (ISO UTC timestamps, enumerations checked by the database, CHECKs naming bare columns).
 */
import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

import { rides, users } from '@/db/server/schema';
import { col, oneOf } from '@/db/server/checks';

export const runningLogSources = ['typed', 'csv'] as const;
export type RunningLogSource = (typeof runningLogSources)[number];

/**
 * One day of a ride's running: the ride cycles run, or the hours run (converted to ride cycles at the
 * design's ride cycle time when the life is worked out, so a change of ride cycle time re-reads old hours).
 * One row per ride and day: entering a day again replaces it, and the audit log keeps what it said before.
 */
export const runningLog = sqliteTable(
  'running_log',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    /** The calendar day run (YYYY-MM-DD, the operator's own day). */
    day: text('day').notNull(),
    cycles: integer('cycles'),
    hours: real('hours'),
    note: text('note'),
    enteredBy: text('entered_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    enteredAt: text('entered_at').notNull(),
    source: text('source', { enum: runningLogSources }).notNull(),
  },
  (t) => [
    uniqueIndex('running_log_ride_day_idx').on(t.rideId, t.day),
    index('running_log_day_idx').on(t.day),
    check('running_log_source_check', oneOf(t.source, runningLogSources)),
    check('running_log_amount_check', sql`${col(t.cycles)} IS NOT NULL OR ${col(t.hours)} IS NOT NULL`),
    check('running_log_cycles_check', sql`${col(t.cycles)} IS NULL OR ${col(t.cycles)} >= 0`),
    check(
      'running_log_hours_check',
      sql`${col(t.hours)} IS NULL OR (${col(t.hours)} >= 0 AND ${col(t.hours)} <= 24)`,
    ),
  ],
);

export type RunningLogDbRow = typeof runningLog.$inferSelect;
