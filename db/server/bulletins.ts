/**
 * Makers' safety bulletins (server/bulletins). A bulletin names its maker and the models it applies to;
 * which rides those are is worked out from the rides' own maker and model (`matchKey`, case and spaces
 * ignored), so a ride added later is covered too. What was done about a bulletin on a ride is a list of
 * actions, only ever added to: done (by an inspection's passed checklist item, or a supervisor's record
 * with a note) or found not done at an inspection.
 */
import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

import { documents } from '@/db/server/documents';
import { inspections } from '@/db/server/inspections';
import { rides, users } from '@/db/server/schema';
import { bulletinSeverities } from '@/lib/vocabulary';
import { col } from '@/db/server/checks';

export const bulletins = sqliteTable(
  'bulletins',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    maker: text('maker').notNull(),
    /** `matchKey(maker)`: what rides are matched by. */
    makerKey: text('maker_key').notNull(),
    reference: text('reference').notNull(),
    title: text('title').notNull(),
    /** YYYY-MM-DD, as the maker dated it. */
    issuedOn: text('issued_on').notNull(),
    severity: text('severity', { enum: bulletinSeverities }).notNull(),
    requiredAction: text('required_action').notNull(),
    /** YYYY-MM-DD; null with `before_next_operation` or when the maker set no deadline. */
    deadlineOn: text('deadline_on'),
    beforeNextOperation: integer('before_next_operation', { mode: 'boolean' }).notNull().default(false),
    documentSha256: text('document_sha256').references(() => documents.sha256, { onDelete: 'restrict' }),
    notes: text('notes'),
    createdAt: text('created_at').notNull(),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    updatedAt: text('updated_at').notNull(),
  },
  (t) => [
    check(
      'bulletins_severity_check',
      sql`${col(t.severity)} IN (${sql.raw(bulletinSeverities.map((v) => `'${v}'`).join(', '))})`,
    ),
    check(
      'bulletins_deadline_check',
      sql`NOT (${col(t.beforeNextOperation)} = 1 AND ${col(t.deadlineOn)} IS NOT NULL)`,
    ),
    // A maker numbers its bulletins once.
    uniqueIndex('bulletins_maker_reference_idx').on(t.makerKey, t.reference),
    index('bulletins_document_idx').on(t.documentSha256),
  ],
);

/** The models a bulletin applies to, with their match keys. */
export const bulletinModels = sqliteTable(
  'bulletin_models',
  {
    bulletinId: text('bulletin_id')
      .notNull()
      .references(() => bulletins.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    model: text('model').notNull(),
    modelKey: text('model_key').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.bulletinId, t.modelKey] }),
    index('bulletin_models_key_idx').on(t.modelKey),
  ],
);

export const bulletinOutcomes = ['done', 'not_done'] as const;

/** What was done about a bulletin on one ride; rows are only ever added. */
export const bulletinActions = sqliteTable(
  'bulletin_actions',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    bulletinId: text('bulletin_id')
      .notNull()
      .references(() => bulletins.id, { onDelete: 'restrict' }),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    outcome: text('outcome', { enum: bulletinOutcomes }).notNull(),
    /** YYYY-MM-DD: the inspection's day on the ride's clock, or the day the supervisor gave. */
    on: text('on').notNull(),
    byUserId: text('by_user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    note: text('note'),
    inspectionId: text('inspection_id').references(() => inspections.id, { onDelete: 'restrict' }),
    recordedAt: text('recorded_at').notNull(),
  },
  (t) => [
    check(
      'bulletin_actions_outcome_check',
      sql`${col(t.outcome)} IN (${sql.raw(bulletinOutcomes.map((v) => `'${v}'`).join(', '))})`,
    ),
    index('bulletin_actions_ride_idx').on(t.rideId, t.bulletinId),
    index('bulletin_actions_bulletin_idx').on(t.bulletinId),
    index('bulletin_actions_recorded_idx').on(t.recordedAt),
  ],
);
