import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, sqliteTable, text } from 'drizzle-orm/sqlite-core';

import type { ReadingKind } from '@/features/records/schema';
import { instrumentMethods } from '@/features/instruments/schema';
import { users } from '@/db/server/schema';
import { col } from '@/db/server/checks';

/**
 * The inspection body's measuring instruments with their calibration dates. Rows are kept when an
 * instrument leaves service (`retired_at`), since stored readings name them; readings carry their own
 * snapshot, so a later calibration never changes what an old record says.
 */
export const instruments = sqliteTable(
  'instruments',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    name: text('name').notNull(),
    serial: text('serial').notNull(),
    /** The kind of instrument, one of the reading methods that use one. */
    method: text('method', { enum: instrumentMethods }).notNull(),
    /** The reading kinds it measures: a JSON array. */
    kinds: text('kinds', { mode: 'json' }).$type<ReadingKind[]>().notNull(),
    calibratedOn: text('calibrated_on'),
    calibrationDueOn: text('calibration_due_on'),
    notes: text('notes'),
    retiredAt: text('retired_at'),
    createdAt: text('created_at')
      .notNull()
      .$defaultFn(() => new Date().toISOString()),
    updatedAt: text('updated_at')
      .notNull()
      .$defaultFn(() => new Date().toISOString()),
  },
  (t) => [
    check(
      'instruments_method_check',
      sql`${col(t.method)} IN (${sql.raw(instrumentMethods.map((m) => `'${m}'`).join(', '))})`,
    ),
    check(
      'instruments_dates_check',
      sql`${col(t.calibratedOn)} IS NULL OR ${col(t.calibrationDueOn)} IS NULL OR ${col(t.calibrationDueOn)} >= ${col(t.calibratedOn)}`,
    ),
    index('instruments_name_idx').on(t.name),
  ],
);

/** Settings of the inspection body, one JSON value per key (e.g. `declaration`: `{ text }`). */
export const settings = sqliteTable('settings', {
  key: text('key').primaryKey(),
  value: text('value', { mode: 'json' }).$type<unknown>().notNull(),
  updatedAt: text('updated_at').notNull(),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'restrict' }),
});

export type InstrumentRow = typeof instruments.$inferSelect;
