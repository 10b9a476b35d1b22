/**
 * Operators' incident reports: something that happened on a ride (someone hurt or something damaged, a
 * near miss, an unplanned stop), with when, what, riders affected, downtime and photos. Same conventions as
 * db/server/schema.ts (ISO UTC timestamps, enumerations checked by the database, CHECKs naming bare
 * columns). A report is never changed after it is made, apart from the inspection body's review.
 */
import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';

import { rides, users } from '@/db/server/schema';
import { incidentKinds } from '@/lib/vocabulary';
import { col, oneOf } from '@/db/server/checks';

export const incidents = sqliteTable(
  'incidents',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    kind: text('kind', { enum: incidentKinds }).notNull(),
    /** When it happened (UTC instant), entered on the site's clock. */
    occurredAt: text('occurred_at').notNull(),
    /** The site's zone the times were entered on, kept so they read back as typed. */
    timeZone: text('time_zone').notNull(),
    what: text('what').notNull(),
    ridersAffected: integer('riders_affected').notNull(),
    anyoneHurt: integer('anyone_hurt', { mode: 'boolean' }).notNull(),
    /** Downtime, when the ride stopped: both UTC instants, either may be unknown. */
    stoppedAt: text('stopped_at'),
    runningAgainAt: text('running_again_at'),
    /** Photos (SHA-256 of bytes already uploaded), a JSON array. */
    photoShas: text('photo_shas', { mode: 'json' })
      .$type<string[]>()
      .notNull()
      .default(sql`'[]'`),
    /** The reporter took the ride out of service with this report (and so asked for an inspection). */
    stoppedRide: integer('stopped_ride', { mode: 'boolean' }).notNull().default(false),
    reportedBy: text('reported_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    reportedAt: text('reported_at').notNull(),
    /** The inspection body's review: who closed the report, when, and their note. */
    reviewedAt: text('reviewed_at'),
    reviewedBy: text('reviewed_by').references(() => users.id, { onDelete: 'restrict' }),
    reviewNote: text('review_note'),
  },
  (t) => [
    check('incidents_kind_check', oneOf(t.kind, incidentKinds)),
    check('incidents_riders_check', sql`${col(t.ridersAffected)} >= 0`),
    check(
      'incidents_downtime_check',
      sql`${col(t.stoppedAt)} IS NULL OR ${col(t.runningAgainAt)} IS NULL OR ${col(t.runningAgainAt)} >= ${col(t.stoppedAt)}`,
    ),
    check(
      'incidents_review_check',
      sql`${col(t.reviewedAt)} IS NULL OR (${col(t.reviewedBy)} IS NOT NULL AND ${col(t.reviewNote)} IS NOT NULL)`,
    ),
    index('incidents_ride_idx').on(t.rideId, t.occurredAt),
    index('incidents_open_idx').on(t.reviewedAt, t.rideId),
  ],
);

export type IncidentDbRow = typeof incidents.$inferSelect;
