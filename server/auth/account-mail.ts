/**
 * Account e-mails (invitations and resets) through the mail layer's one-attempt machinery
 * (server/mail/deliver.ts): rows in `account_mail` are claimed, sent and marked like notice deliveries, so a
 * message queued before a restart still goes out, and one cut off mid-send goes out again under the same
 * idempotency key (the local mailbox drops the copy). Once a message is sent its content, which carries a
 * set-password link, is removed from the row.
 */
import { randomUUID } from 'node:crypto';

import { asc } from 'drizzle-orm';

import { accountMail } from '@/db/server/accounts';
import type { Db } from '@/server/db';
import type { Logger } from '@/server/logger';
import { sqliteOf } from '@/server/sqlite-client';
import { deliverOnce, deliveryDue, deliveryRowHooks } from '@/server/mail/deliver';
import type { Mailer } from '@/server/mail/mailer';

export type AccountMailContent = { subject: string; text: string; html: string };

const listeners = new Set<() => void>();

/**
 * Queues one message inside the caller's transaction. The loop is woken on the next turn of the event loop,
 * after the (synchronous) transaction has committed or rolled back.
 */
export function queueAccountMail(
  tx: Pick<Db, 'insert'>,
  row: { userId: string; recipient: string; content: AccountMailContent; now: Date },
): void {
  const id = randomUUID();
  const at = row.now.toISOString();
  tx.insert(accountMail)
    .values({
      id,
      userId: row.userId,
      recipient: row.recipient,
      idempotencyKey: `account.${id}`,
      content: row.content,
      createdAt: at,
      nextAttemptAt: at,
    })
    .run();
  setImmediate(() => {
    for (const listener of listeners) listener();
  });
}

type AccountMailDeps = { db: Db; mailer: Mailer; logger?: Logger };

/** Sends every account e-mail due at `now`, one at a time; returns how many went out. */
export async function processAccountMail(deps: AccountMailDeps, now: Date = new Date()): Promise<number> {
  const rows = deps.db
    .select()
    .from(accountMail)
    .where(deliveryDue(accountMail, now))
    .orderBy(asc(accountMail.nextAttemptAt))
    .limit(50)
    .all();
  let sent = 0;
  for (const row of rows) {
    if (!row.content) continue;
    const outcome = await deliverOnce({
      mailer: deps.mailer,
      mail: { to: row.recipient, idempotencyKey: row.idempotencyKey, ...row.content },
      hooks: deliveryRowHooks(sqliteOf(deps.db), 'account_mail', row.id, { forgetContent: true }),
      now: () => now,
      logger: deps.logger,
    });
    if (outcome.status === 'sent') sent += 1;
  }
  return sent;
}

/** Sends now, every `intervalMs` (retries fall due on their own schedule) and whenever a message is queued. */
export function startAccountMailLoop(deps: AccountMailDeps & { intervalMs?: number }) {
  let running: Promise<void> | null = null;
  let again = false;
  let stopped = false;
  const run = (): void => {
    if (stopped) return;
    if (running) {
      again = true;
      return;
    }
    running = (async () => {
      do {
        again = false;
        try {
          const sent = await processAccountMail(deps);
          if (sent > 0) deps.logger?.info({ sent }, 'account e-mail run');
        } catch (error) {
          deps.logger?.error({ err: error }, 'account e-mail run failed');
        }
      } while (again && !stopped);
    })().finally(() => {
      running = null;
    });
  };
  const timer = setInterval(run, deps.intervalMs ?? 60_000);
  timer.unref();
  listeners.add(run);
  run();
  return {
    idle: async () => {
      while (running) await running;
    },
    stop: async () => {
      stopped = true;
      clearInterval(timer);
      listeners.delete(run);
      while (running) await running;
    },
  };
}
