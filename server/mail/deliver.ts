/**
 * One attempt at one delivery (one notice to one recipient), with the bookkeeping left to the caller's
 * callbacks so the delivery rows stay in the notices code. The contract the callbacks must keep:
 *
 * - `claim(now)` moves the row to `sending`, counts the attempt and records `claimedAt`, in ONE statement
 *   that only matches a row that is due: `pending` with `nextAttemptAt <= now`, or `sending` with
 *   `claimedAt` older than `sendingLeaseMs` (see below). It returns the attempt number, or null when the
 *   row is sent, failed, not due, or held by another worker — then nothing is sent.
 * - `markSent`, `markRetry` (back to `pending` with the next time), `markFailed` record the outcome.
 *
 * The hard case is a crash (or a lost reply) after the SMTP server accepted the message and before
 * `markSent` ran. The row is left in `sending`, and we cannot tell whether the operator got the notice.
 * Two choices: never send it again (at most once; the operator may never hear of a stop-now finding) or
 * send it again after a lease long enough that the first attempt is surely over (at least once; they may
 * get it twice). A notice that never arrives is the worse failure, so a `sending` row older than the lease
 * is claimed again and re-sent with the SAME idempotency key, hence the same Message-ID and
 * X-Pivotwatch-Key: our fake server drops it, and a real one delivers a copy that mail clients can tell is
 * the same message. The lease is far longer than the mailer's timeouts, so a slow attempt still running is
 * never doubled. Claiming before sending also keeps two workers from sending the same row at once.
 */
import type Database from 'better-sqlite3';
import { and, eq, lte, or, type SQL } from 'drizzle-orm';
import type { SQLiteColumn } from 'drizzle-orm/sqlite-core';

import type { Logger } from '@/server/logger';
import {
  describeMailError,
  MailSendError,
  type Mailer,
  type MailErrorInfo,
  type OutgoingMail,
} from '@/server/mail/mailer';
import { nextAttemptAt, retryPolicy, shouldRetry, type RetryPolicy } from '@/server/mail/retry';

/** How long a `sending` row is left alone before it is taken to be a crashed attempt and claimed again. */
export const sendingLeaseMs = 15 * 60_000;

type MaybePromise<T> = T | Promise<T>;

export type DeliveryHooks = {
  /** See the file comment. Returns the attempt number (1 for the first) or null to send nothing. */
  claim: (now: Date) => MaybePromise<{ attempt: number } | null>;
  markSent: (r: { attempt: number; messageId: string; response: string; at: Date }) => MaybePromise<void>;
  markRetry: (r: {
    attempt: number;
    error: MailErrorInfo;
    nextAttemptAt: Date;
    at: Date;
  }) => MaybePromise<void>;
  markFailed: (r: { attempt: number; error: MailErrorInfo; at: Date }) => MaybePromise<void>;
};

export type DeliveryOutcome =
  | { status: 'sent'; attempt: number; messageId: string; response: string }
  | { status: 'retry'; attempt: number; error: MailErrorInfo; nextAttemptAt: Date }
  | { status: 'failed'; attempt: number; error: MailErrorInfo }
  /** The claim found nothing due (already sent, failed, not yet due, or another worker has it). */
  | { status: 'skipped' };

type DeliverOptions = {
  mailer: Mailer;
  /** Exactly one recipient: the idempotency key stands for one notice to one person. */
  mail: OutgoingMail & { to: string };
  hooks: DeliveryHooks;
  now?: () => Date;
  random?: () => number;
  policy?: RetryPolicy;
  logger?: Logger;
};

export async function deliverOnce(opts: DeliverOptions): Promise<DeliveryOutcome> {
  const now = opts.now ?? (() => new Date());
  const policy = opts.policy ?? retryPolicy;
  const claim = await opts.hooks.claim(now());
  if (!claim) return { status: 'skipped' };
  const { attempt } = claim;

  let failure: unknown;
  try {
    const result = await opts.mailer.send(opts.mail);
    if (result.accepted.length > 0) {
      await opts.hooks.markSent({
        attempt,
        messageId: result.messageId,
        response: result.response,
        at: now(),
      });
      return { status: 'sent', attempt, messageId: result.messageId, response: result.response };
    }
    failure = new MailSendError({
      kind: 'permanent',
      message: `The server accepted the message for no recipient: ${result.response}`,
      code: 'EENVELOPE',
      responseCode: null,
      command: 'RCPT TO',
    });
  } catch (error) {
    // markSent failing (the database) must not be taken for a failed send: the mail went out.
    if (!(error instanceof MailSendError)) throw error;
    failure = error;
  }

  const error = describeMailError(failure);
  if (shouldRetry(failure, attempt, policy)) {
    const at = nextAttemptAt(attempt, now(), opts.random, policy);
    await opts.hooks.markRetry({ attempt, error, nextAttemptAt: at, at: now() });
    opts.logger?.warn(
      { key: opts.mail.idempotencyKey, attempt, nextAttemptAt: at, error },
      'delivery deferred',
    );
    return { status: 'retry', attempt, error, nextAttemptAt: at };
  }
  await opts.hooks.markFailed({ attempt, error, at: now() });
  opts.logger?.error({ key: opts.mail.idempotencyKey, attempt, error }, 'delivery failed');
  return { status: 'failed', attempt, error };
}

/**
 * The tables whose rows go through `deliverOnce`: notices (server/notices/deliveries.ts) and account
 * e-mails (server/auth/account-mail.ts). Both have `status`, `next_attempt_at`.
 */
export const deliveryTables = ['notice_deliveries', 'account_mail'] as const;

/**
 * At start-up, before any sending: a row still `sending` was claimed by a process that is gone (only one
 * server may use a DATA_DIR, server/backup/server-lock.ts), so its attempt is surely over and the row is due
 * again now instead of after the lease; a restarted server would otherwise leave it unsent for 15 minutes.
 * It goes out under the same idempotency key, so our mailbox drops a copy and a real server shows one
 * the mail client can tell is the same (the accepted case in the file comment). Returns how many rows.
 */
export function releaseInterruptedSends(sqlite: Database.Database, now: Date): number {
  let released = 0;
  for (const table of deliveryTables) {
    const exists = sqlite.prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = ?").get(table);
    if (!exists) continue;
    released += sqlite
      .prepare(`UPDATE ${table} SET status = 'pending', next_attempt_at = ? WHERE status = 'sending'`)
      .run(now.toISOString()).changes;
  }
  return released;
}

/** One line for a failed attempt, kept on the row: `451 EENVELOPE: mailbox busy`. */
export function mailErrorText(e: MailErrorInfo): string {
  const codes = [e.responseCode, e.code].filter((x) => x !== null).join(' ');
  return codes ? `${codes}: ${e.message}` : e.message;
}

/**
 * The claim/sent/retry/failed updates of one row of a delivery table (`deliveryTables`: the same columns in
 * each). The claim is one statement: only a row that is due — pending and past its time, or left `sending`
 * longer than the lease — can be claimed, so two runs never send the same row together. `forgetContent`
 * clears the message once sent (an account e-mail carries a set-password link).
 */
export function deliveryRowHooks(
  sqlite: Database.Database,
  table: (typeof deliveryTables)[number],
  id: string,
  opts: { forgetContent?: boolean } = {},
): DeliveryHooks {
  return {
    claim: (now) => {
      const row = sqlite
        .prepare(
          `UPDATE ${table} SET status = 'sending', attempts = attempts + 1, claimed_at = @now
           WHERE id = @id AND ((status = 'pending' AND next_attempt_at <= @now)
             OR (status = 'sending' AND claimed_at <= @stale))
           RETURNING attempts`,
        )
        .get({
          id,
          now: now.toISOString(),
          stale: new Date(now.getTime() - sendingLeaseMs).toISOString(),
        }) as { attempts: number } | undefined;
      return row ? { attempt: row.attempts } : null;
    },
    markSent: ({ messageId, at }) => {
      const content = opts.forgetContent ? ', content = NULL' : '';
      sqlite
        .prepare(
          `UPDATE ${table} SET status = 'sent', message_id = ?, sent_at = ?, last_error = NULL${content}
           WHERE id = ?`,
        )
        .run(messageId, at.toISOString(), id);
    },
    markRetry: ({ error, nextAttemptAt: next }) => {
      sqlite
        .prepare(`UPDATE ${table} SET status = 'pending', next_attempt_at = ?, last_error = ? WHERE id = ?`)
        .run(next.toISOString(), mailErrorText(error), id);
    },
    markFailed: ({ error }) => {
      sqlite
        .prepare(`UPDATE ${table} SET status = 'failed', last_error = ? WHERE id = ?`)
        .run(mailErrorText(error), id);
    },
  };
}

/** Rows a run may take at `now`: pending and due, or left `sending` by an attempt that never finished. */
export function deliveryDue(
  t: { status: SQLiteColumn; nextAttemptAt: SQLiteColumn; claimedAt: SQLiteColumn },
  now: Date,
): SQL | undefined {
  return or(
    and(eq(t.status, 'pending'), lte(t.nextAttemptAt, now.toISOString())),
    and(eq(t.status, 'sending'), lte(t.claimedAt, new Date(now.getTime() - sendingLeaseMs).toISOString())),
  );
}
