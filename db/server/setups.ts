/**
 * Travelling rides, shared sites and the inspectors' planned rounds (issue #19). Same conventions as
 * db/server/schema.ts (ISO UTC timestamps, calendar days as YYYY-MM-DD, enumerations checked by the
 * database, CHECKs naming bare columns).
 */
import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

import { inspectionSchedules, rides, sites, users } from '@/db/server/schema';
import { setupStates } from '@/lib/vocabulary';
import { col, oneOf } from '@/db/server/checks';

const id = () =>
  text('id')
    .primaryKey()
    .$defaultFn(() => randomUUID());

/**
 * An event at a site (a fair on a fairground) for a range of days: rides of many operators are set up
 * for it. The site keeps its own holder company; the rides set up there keep theirs.
 */
export const siteEvents = sqliteTable(
  'site_events',
  {
    id: id(),
    siteId: text('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'restrict' }),
    name: text('name').notNull(),
    fromDate: text('from_date').notNull(),
    toDate: text('to_date').notNull(),
    createdAt: text('created_at').notNull(),
  },
  (t) => [
    check('site_events_dates_check', sql`${col(t.fromDate)} <= ${col(t.toDate)}`),
    index('site_events_site_idx').on(t.siteId, t.fromDate),
  ],
);

/**
 * One build-up of a ride at a site, from its build-up day to its pull-down day. A ride's set-ups never
 * overlap. The state moves planned → set up → cleared → pulled down; `setup_changes` records each move.
 */
export const setups = sqliteTable(
  'setups',
  {
    id: id(),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    siteId: text('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'restrict' }),
    eventId: text('event_id').references(() => siteEvents.id, { onDelete: 'restrict' }),
    fromDate: text('from_date').notNull(),
    toDate: text('to_date').notNull(),
    /** Where on the ground ("pitch 14, north row"). */
    pitch: text('pitch'),
    state: text('state', { enum: setupStates }).notNull(),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    createdAt: text('created_at').notNull(),
  },
  (t) => [
    check('setups_state_check', oneOf(t.state, setupStates)),
    check('setups_dates_check', sql`${col(t.fromDate)} <= ${col(t.toDate)}`),
    index('setups_ride_idx').on(t.rideId, t.fromDate),
    index('setups_site_idx').on(t.siteId, t.fromDate),
  ],
);

/** Each move of a set-up's state: who, when, from what to what (null from: the set-up was made). */
export const setupChanges = sqliteTable(
  'setup_changes',
  {
    id: id(),
    setupId: text('setup_id')
      .notNull()
      .references(() => setups.id, { onDelete: 'restrict' }),
    at: text('at').notNull(),
    byUser: text('by_user')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    fromState: text('from_state', { enum: setupStates }),
    toState: text('to_state', { enum: setupStates }).notNull(),
    note: text('note'),
  },
  (t) => [index('setup_changes_setup_idx').on(t.setupId, t.at)],
);

/**
 * The planner's day for a scheduled inspection (one row per schedule): the day of the round it is done
 * on. Without a row, the round takes its due day (an overdue one the week's first day).
 */
export const roundPlans = sqliteTable('round_plans', {
  scheduleId: text('schedule_id')
    .primaryKey()
    .references(() => inspectionSchedules.id, { onDelete: 'cascade' }),
  plannedOn: text('planned_on').notNull(),
  updatedAt: text('updated_at').notNull(),
});

/** The travel order of a day: the sites in the order they are visited (0 first). */
export const roundSiteOrder = sqliteTable(
  'round_site_order',
  {
    day: text('day').notNull(),
    siteId: text('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
  },
  (t) => [
    uniqueIndex('round_site_order_day_site_idx').on(t.day, t.siteId),
    check('round_site_order_position_check', sql`${col(t.position)} >= 0`),
  ],
);
