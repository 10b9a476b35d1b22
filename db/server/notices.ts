import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

import { inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import { companies, rides, users } from '@/db/server/schema';
import type { NoticeDocument } from '@/features/notices/schema';
import { deliveryStatuses, noticeKinds } from '@/lib/vocabulary';
import { col, oneOf } from '@/db/server/checks';

/*
 * Notices to operators and what follows them: deliveries by e-mail, the operator's corrective actions,
 * and the reminders about findings coming due. Same conventions as db/server/schema.ts (ISO UTC
 * timestamps, enumerations checked by the database, CHECKs naming bare columns).
 */

export type DeliveryStatus = (typeof deliveryStatuses)[number];
export const deliveryKinds = ['notice', 'reminder'] as const;
export type DeliveryKind = (typeof deliveryKinds)[number];
export const reminderStages = ['due_soon', 'past_due'] as const;
export type ReminderStage = (typeof reminderStages)[number];

/**
 * A notice as issued. `document` is the frozen content (never updated after the insert); only the
 * acknowledgement columns change. The reference is sequential within the calendar year of issue
 * (`year` + `seq`, unique), e.g. PW-2026-0007.
 */
export const notices = sqliteTable(
  'notices',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    reference: text('reference').notNull().unique(),
    year: integer('year').notNull(),
    seq: integer('seq').notNull(),
    kind: text('kind', { enum: noticeKinds }).notNull(),
    inspectionId: text('inspection_id').references(() => inspections.id, { onDelete: 'restrict' }),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    operatorCompanyId: text('operator_company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'restrict' }),
    issuedAt: text('issued_at').notNull(),
    issuedBy: text('issued_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    document: text('document', { mode: 'json' }).$type<NoticeDocument>().notNull(),
    acknowledgedAt: text('acknowledged_at'),
    acknowledgedBy: text('acknowledged_by').references(() => users.id, { onDelete: 'restrict' }),
  },
  (t) => [
    check('notices_kind_check', oneOf(t.kind, noticeKinds)),
    check('notices_seq_check', sql`${col(t.seq)} >= 1`),
    check(
      'notices_inspection_check',
      sql`${col(t.kind)} <> 'inspection' OR ${col(t.inspectionId)} IS NOT NULL`,
    ),
    uniqueIndex('notices_year_seq_idx').on(t.year, t.seq),
    // One notice per approved inspection: issuing again finds the first.
    uniqueIndex('notices_inspection_idx')
      .on(t.inspectionId)
      .where(sql`${col(t.kind)} = 'inspection'`),
    index('notices_operator_idx').on(t.operatorCompanyId, t.issuedAt),
    index('notices_ride_idx').on(t.rideId, t.issuedAt),
    index('notices_issued_idx').on(t.issuedAt),
  ],
);

/** The findings a notice lists (its document's findings), for reading a finding's notices and back. */
export const noticeFindings = sqliteTable(
  'notice_findings',
  {
    noticeId: text('notice_id')
      .notNull()
      .references(() => notices.id, { onDelete: 'cascade' }),
    findingId: text('finding_id')
      .notNull()
      .references(() => findings.id, { onDelete: 'restrict' }),
  },
  (t) => [
    primaryKey({ columns: [t.noticeId, t.findingId] }),
    index('notice_findings_finding_idx').on(t.findingId),
  ],
);

/**
 * Outgoing e-mail, one row per message and recipient: a notice (with its PDF, rendered when sent) or a
 * reminder about findings coming due (its text kept in `content`). `idempotency_key` is the message's
 * identity (notice id + recipient, or the reminder's findings × stage + recipient): a retry re-sends
 * under the same key and Message-ID, never as a new message.
 */
export const noticeDeliveries = sqliteTable(
  'notice_deliveries',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    kind: text('kind', { enum: deliveryKinds }).notNull().default('notice'),
    noticeId: text('notice_id').references(() => notices.id, { onDelete: 'restrict' }),
    operatorCompanyId: text('operator_company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'restrict' }),
    recipient: text('recipient').notNull(),
    idempotencyKey: text('idempotency_key').notNull().unique(),
    /** A reminder's subject, text and html; null for notices (built from the notice when sent). */
    content: text('content', { mode: 'json' }).$type<{ subject: string; text: string; html: string }>(),
    status: text('status', { enum: deliveryStatuses }).notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    createdAt: text('created_at').notNull(),
    nextAttemptAt: text('next_attempt_at').notNull(),
    /** When the current or last attempt began; a row left `sending` long after this was interrupted. */
    claimedAt: text('claimed_at'),
    lastError: text('last_error'),
    messageId: text('message_id'),
    sentAt: text('sent_at'),
  },
  (t) => [
    check('notice_deliveries_status_check', oneOf(t.status, deliveryStatuses)),
    check('notice_deliveries_kind_check', oneOf(t.kind, deliveryKinds)),
    check(
      'notice_deliveries_shape_check',
      sql`(${col(t.kind)} = 'notice' AND ${col(t.noticeId)} IS NOT NULL) OR (${col(t.kind)} = 'reminder' AND ${col(t.content)} IS NOT NULL)`,
    ),
    // The worker's claim: due pending rows, oldest first.
    index('notice_deliveries_due_idx').on(t.status, t.nextAttemptAt),
    index('notice_deliveries_notice_idx').on(t.noticeId),
    index('notice_deliveries_company_idx').on(t.operatorCompanyId, t.createdAt),
  ],
);

/** What the operator reports having done about a finding, with evidence photos (already uploaded). */
export const correctiveActions = sqliteTable(
  'corrective_actions',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    findingId: text('finding_id')
      .notNull()
      .references(() => findings.id, { onDelete: 'restrict' }),
    reportedBy: text('reported_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    reportedAt: text('reported_at').notNull(),
    note: text('note').notNull(),
    photoShas: text('photo_shas', { mode: 'json' })
      .$type<string[]>()
      .notNull()
      .default(sql`'[]'`),
  },
  (t) => [index('corrective_actions_finding_idx').on(t.findingId, t.reportedAt)],
);

/** Reminders already sent: one per finding and stage, whatever happens to the job or the clock. */
export const findingReminders = sqliteTable(
  'finding_reminders',
  {
    findingId: text('finding_id')
      .notNull()
      .references(() => findings.id, { onDelete: 'cascade' }),
    stage: text('stage', { enum: reminderStages }).notNull(),
    sentAt: text('sent_at').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.findingId, t.stage] }),
    check('finding_reminders_stage_check', oneOf(t.stage, reminderStages)),
  ],
);

export type NoticeRow = typeof notices.$inferSelect;
export type NoticeDeliveryRow = typeof noticeDeliveries.$inferSelect;
export type CorrectiveActionRow = typeof correctiveActions.$inferSelect;
