/**
 * NDT records per pivot (method, technician, result, report PDF by SHA-256) and each ride's pivot-life
 * flags the review queue reads (earliest NDT due date, earliest projected wear limit). Tables added by
 * issue #14.
 */
import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, primaryKey, sqliteTable, text } from 'drizzle-orm/sqlite-core';

import { rides, users } from '@/db/server/schema';
import { ndtMethods } from '@/features/loads/design-schema';
import { ndtResults } from '@/features/pivot-life/ndt-schema';
import { col, oneOf } from '@/db/server/checks';

/**
 * One non-destructive test at one pivot, as the technician reported it. Rows are only added: a wrong
 * record is corrected by a later one, so the history of what was reported stays whole.
 */
export const ndtRecords = sqliteTable(
  'ndt_records',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    /** The pivot: the joint number of the design data's pivot. */
    joint: integer('joint').notNull(),
    testedOn: text('tested_on').notNull(),
    method: text('method', { enum: ndtMethods }).notNull(),
    technician: text('technician').notNull(),
    /** EN ISO 9712 certification level of the technician: 1, 2 or 3. */
    level: integer('level').notNull(),
    result: text('result', { enum: ndtResults }).notNull(),
    note: text('note'),
    /** The report PDF in DATA_DIR/ndt-reports/<sha256>; null when none was uploaded. */
    reportSha256: text('report_sha256'),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    createdAt: text('created_at').notNull(),
  },
  (t) => [
    check('ndt_records_method_check', oneOf(t.method, ndtMethods)),
    check('ndt_records_result_check', oneOf(t.result, ndtResults)),
    check('ndt_records_level_check', sql`${col(t.level)} IN (1, 2, 3)`),
    check('ndt_records_joint_check', sql`${col(t.joint)} >= 0`),
    check(
      'ndt_records_report_check',
      sql`${col(t.reportSha256)} IS NULL OR length(${col(t.reportSha256)}) = 64`,
    ),
    index('ndt_records_ride_idx').on(t.rideId, t.joint, t.method, t.testedOn),
    index('ndt_records_report_idx').on(t.reportSha256),
  ],
);

/** Report PDFs, stored once per content (DATA_DIR/ndt-reports/<sha256>). */
export const ndtReports = sqliteTable('ndt_reports', {
  sha256: text('sha256').primaryKey(),
  bytes: integer('bytes').notNull(),
  storedAt: text('stored_at').notNull(),
  uploadedBy: text('uploaded_by')
    .notNull()
    .references(() => users.id, { onDelete: 'restrict' }),
});

/**
 * What a ride's pivot life says the review queue should know, kept by server/pivot-life/flags.ts whenever
 * an NDT record, an analysis, the running log, the design data or a schedule changes. The queue reads it
 * in SQL (it sits below pivot-life and may not compute it).
 */
export const rideLifeFlags = sqliteTable('ride_life_flags', {
  rideId: text('ride_id')
    .primaryKey()
    .references(() => rides.id, { onDelete: 'cascade' }),
  /** The earliest NDT due date over the ride's pivots and planned methods; null without NDT plans. */
  ndtDueOn: text('ndt_due_on'),
  /** The earliest cautious (prediction-interval) date a pin or bushing is projected to reach its limit. */
  wearLimitOn: text('wear_limit_on'),
  /** An earlier inspection date to suggest, when that limit falls before the next scheduled inspection. */
  wearSuggestedOn: text('wear_suggested_on'),
  updatedAt: text('updated_at').notNull(),
});

export const ndtReminderStages = ['due_soon', 'past_due'] as const;
export type NdtReminderStage = (typeof ndtReminderStages)[number];

/**
 * Which NDT reminders an operator was sent: each planned test (ride, pivot, method) for each due date gets
 * each stage once, so a daily run never repeats itself, and a new test (a new due date) starts afresh.
 */
export const ndtReminders = sqliteTable(
  'ndt_reminders',
  {
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'cascade' }),
    joint: integer('joint').notNull(),
    method: text('method', { enum: ndtMethods }).notNull(),
    dueOn: text('due_on').notNull(),
    stage: text('stage', { enum: ndtReminderStages }).notNull(),
    sentAt: text('sent_at').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.rideId, t.joint, t.method, t.dueOn, t.stage] }),
    check('ndt_reminders_stage_check', oneOf(t.stage, ndtReminderStages)),
    check('ndt_reminders_method_check', oneOf(t.method, ndtMethods)),
  ],
);
