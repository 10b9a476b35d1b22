import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

import { inspections } from '@/db/server/inspections';
import { rides, users } from '@/db/server/schema';
import {
  envelopeStatuses,
  findingSeverities,
  findingStates,
  incidentKinds,
  inspectionTypes,
  rideClasses,
  rideStatuses,
  urgencies,
} from '@/lib/vocabulary';
import { col, oneOf } from '@/db/server/checks';

/*
 * The review desk's tables: findings a supervisor writes on an inspection, and the queue's read model.
 * Same conventions as db/server/schema.ts (ISO UTC timestamps, enumerations checked by the database,
 * CHECKs naming bare columns).
 */

/** A deficiency or observation recorded against an inspection, with what must be done and by when. */
export const findings = sqliteTable(
  'findings',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    inspectionId: text('inspection_id')
      .notNull()
      .references(() => inspections.id, { onDelete: 'restrict' }),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    /** 1, 2, 3… within the inspection; never reused, even after a delete. */
    number: integer('number').notNull(),
    severity: text('severity', { enum: findingSeverities }).notNull(),
    description: text('description').notNull(),
    ruleRef: text('rule_ref'),
    requiredAction: text('required_action'),
    /** YYYY-MM-DD. */
    dueOn: text('due_on'),
    /** SHA-256 of photos of the same inspection. */
    photoShas: text('photo_shas', { mode: 'json' })
      .$type<string[]>()
      .notNull()
      .default(sql`'[]'`),
    state: text('state', { enum: findingStates }).notNull().default('open'),
    stateNote: text('state_note'),
    createdAt: text('created_at').notNull(),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    updatedAt: text('updated_at').notNull(),
    updatedBy: text('updated_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    closedAt: text('closed_at'),
    closedBy: text('closed_by').references(() => users.id, { onDelete: 'restrict' }),
    /**
     * 1, 2, 3… within the ride, over all its inspections; never reused. What people call the finding by
     * ("finding 7" of Tidebreaker). Null only on rows stored before it existed, until they are numbered.
     */
    rideNumber: integer('ride_number'),
    /** What the verifier accepted as evidence on closing: photos and/or a document reference. */
    closeEvidence: text('close_evidence', { mode: 'json' }).$type<{
      photoShas: string[];
      reference: string | null;
      correctiveActions: number;
    }>(),
  },
  (t) => [
    check('findings_severity_check', oneOf(t.severity, findingSeverities)),
    check('findings_state_check', oneOf(t.state, findingStates)),
    uniqueIndex('findings_inspection_number_idx').on(t.inspectionId, t.number),
    index('findings_ride_idx').on(t.rideId, t.state, t.dueOn),
    index('findings_open_due_idx').on(t.state, t.dueOn),
  ],
);

/**
 * Every change of a ride's operating status made under the status rules (`features/review/status-rules.ts`):
 * the event, who and when, the reason, and the decision or finding it belongs to. Overrides are found here
 * (the review queue stops flagging a returned inspection once a later override resolved it).
 */
export const rideStatusChanges = sqliteTable(
  'ride_status_changes',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    at: text('at').notNull(),
    byUser: text('by_user')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    event: text('event').notNull(),
    fromStatus: text('from_status', { enum: rideStatuses }).notNull(),
    toStatus: text('to_status', { enum: rideStatuses }).notNull(),
    override: integer('override', { mode: 'boolean' }).notNull().default(false),
    reason: text('reason'),
    inspectionId: text('inspection_id').references(() => inspections.id, { onDelete: 'restrict' }),
    findingId: text('finding_id'),
    noticeId: text('notice_id'),
  },
  (t) => [index('ride_status_changes_ride_idx').on(t.rideId, t.at)],
);

/**
 * The supervisors' queue, kept ready to read: one row per submitted inspection awaiting a decision, and
 * one per ride that needs attention without one (an overdue inspection, findings past due). Rebuilt for a
 * ride whenever something that decides its rows changes, and for every ride once a day (the "overdue" and
 * "past due" tests move with the date alone). `urgency` is the index into `urgencies`, so sorting by it
 * is sorting by urgency.
 */
export const reviewQueue = sqliteTable(
  'review_queue',
  {
    key: text('key').primaryKey(),
    kind: text('kind', { enum: ['inspection', 'ride', 'incident'] }).notNull(),
    inspectionId: text('inspection_id'),
    inspectionType: text('inspection_type', { enum: inspectionTypes }),
    rideId: text('ride_id').notNull(),
    rideName: text('ride_name').notNull(),
    rideClass: text('ride_class', { enum: rideClasses }).notNull(),
    rideStatus: text('ride_status', { enum: rideStatuses }).notNull(),
    siteId: text('site_id'),
    siteName: text('site_name'),
    operatorId: text('operator_id').notNull(),
    operatorName: text('operator_name').notNull(),
    inspectorId: text('inspector_id'),
    inspectorName: text('inspector_name'),
    urgency: integer('urgency').notNull(),
    at: text('at').notNull(),
    /**
     * The item's day on its site's clock (the inspection body's default zone for a ride without one): the
     * day `at` falls on there, or `at` itself when it is a date. The From/To filters compare it.
     */
    day: text('day').notNull().default(''),
    analysisStatus: text('analysis_status', { enum: envelopeStatuses }),
    failedItems: integer('failed_items').notNull().default(0),
    overdueSince: text('overdue_since'),
    findingsPastDue: integer('findings_past_due').notNull().default(0),
    /** The ride's earliest NDT due date (from ride_life_flags), when it has NDT plans. */
    ndtDueOn: text('ndt_due_on'),
    /** A pin or bushing projected (cautiously) to reach its limit before the next scheduled inspection. */
    wearLimitOn: text('wear_limit_on'),
    /** The earlier inspection date suggested for it. */
    wearSuggestedOn: text('wear_suggested_on'),
    /** An operator's incident report awaiting review (kind `incident`): its id and kind. */
    incidentId: text('incident_id'),
    incidentKind: text('incident_kind', { enum: incidentKinds }),
    /** When the ride's latest daily pre-opening check was sent, when it failed an item or a test run. */
    dailyFailedAt: text('daily_failed_at'),
    /** The latest day (site's calendar, within the last 14) the ride ran with no daily check. */
    dailyMissedOn: text('daily_missed_on'),
    /** Lower-cased ride, serial, site, operator and inspector names, for the free-text search. */
    search: text('search').notNull(),
  },
  (t) => [
    check(
      'review_queue_urgency_check',
      sql`${col(t.urgency)} BETWEEN 0 AND ${sql.raw(String(urgencies.length - 1))}`,
    ),
    index('review_queue_urgency_idx').on(t.urgency, t.at, t.key),
    index('review_queue_at_idx').on(t.at, t.key),
    index('review_queue_ride_name_idx').on(t.rideName, t.key),
    index('review_queue_ride_idx').on(t.rideId),
    index('review_queue_site_idx').on(t.siteId, t.urgency, t.at),
    index('review_queue_operator_idx').on(t.operatorId, t.urgency, t.at),
    index('review_queue_inspector_idx').on(t.inspectorId, t.urgency, t.at),
    index('review_queue_class_idx').on(t.rideClass, t.urgency, t.at),
    index('review_queue_status_idx').on(t.rideStatus, t.urgency, t.at),
  ],
);

export type FindingRow = typeof findings.$inferSelect;
export type ReviewQueueRow = typeof reviewQueue.$inferSelect;
