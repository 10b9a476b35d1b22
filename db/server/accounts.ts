import { randomUUID } from 'node:crypto';

import { check, index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';

import { users } from '@/db/server/schema';
import { passwordLinkPurposes } from '@/features/auth/password-schema';
import { deliveryStatuses } from '@/lib/vocabulary';
import { oneOf } from '@/db/server/checks';

/*
 * People's accounts beyond the users table: the single-use links that set a password (an invitation or an
 * administrator's reset) and the e-mails that carry them. Same conventions as db/server/schema.ts (ISO UTC
 * timestamps, enumerations checked by the database, CHECKs naming bare columns).
 */

/**
 * A set-password link. Only the SHA-256 of its token is kept: someone who reads the database (or a backup)
 * cannot use a link still waiting in a person's inbox. A link is used once (`usedAt`), and a newer link
 * for the same person replaces an older one (the older gets `usedAt` too, see server/auth/people.ts).
 */
export const passwordLinks = sqliteTable(
  'password_links',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    purpose: text('purpose', { enum: passwordLinkPurposes }).notNull(),
    tokenSha256: text('token_sha256').notNull().unique(),
    expiresAt: text('expires_at').notNull(),
    usedAt: text('used_at'),
    /** The administrator who sent it; null when the system did (none yet). */
    createdBy: text('created_by').references(() => users.id, { onDelete: 'restrict' }),
    createdAt: text('created_at').notNull(),
  },
  (t) => [
    check('password_links_purpose_check', oneOf(t.purpose, passwordLinkPurposes)),
    index('password_links_user_idx').on(t.userId, t.createdAt),
  ],
);
export type PasswordLinkRow = typeof passwordLinks.$inferSelect;

/**
 * Account e-mails (invitations, resets) waiting to go or gone, one row per message, sent by the same
 * claim/send/mark machinery as notices (server/mail/deliver.ts), so a message queued before a restart still
 * goes out after it, and one interrupted mid-send goes out again under the same idempotency key. The
 * content holds the link, so it is cleared once the message is sent.
 */
export const accountMail = sqliteTable(
  'account_mail',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    recipient: text('recipient').notNull(),
    idempotencyKey: text('idempotency_key').notNull().unique(),
    content: text('content', { mode: 'json' }).$type<{ subject: string; text: string; html: string }>(),
    status: text('status', { enum: deliveryStatuses }).notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    createdAt: text('created_at').notNull(),
    nextAttemptAt: text('next_attempt_at').notNull(),
    claimedAt: text('claimed_at'),
    lastError: text('last_error'),
    messageId: text('message_id'),
    sentAt: text('sent_at'),
  },
  (t) => [
    check('account_mail_status_check', oneOf(t.status, deliveryStatuses)),
    index('account_mail_due_idx').on(t.status, t.nextAttemptAt),
    index('account_mail_user_idx').on(t.userId, t.createdAt),
  ],
);
export type AccountMailRow = typeof accountMail.$inferSelect;
