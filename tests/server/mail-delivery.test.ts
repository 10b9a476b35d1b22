/**
 * Retry policy, error classes and one-delivery bookkeeping, against the loopback SMTP server.
 * Reply classes: RFC 5321 §4.2.1 (4yz transient negative completion, 5yz permanent negative completion).
 * Backoff shape: capped exponential backoff with jitter, as described in "Exponential Backoff And Jitter"
 * (AWS Architecture Blog, 2015) — from memory; the values below are the closed form base·4^(n−1).
 */
import fs from 'node:fs';
import path from 'node:path';

import { deliverOnce, sendingLeaseMs, type DeliveryHooks } from '@/server/mail/deliver';
import { startFakeSmtp, type FakeSmtp } from '@/server/mail/fake-smtp';
import { classifyMailError, createMailer, deliveryKey, type Mailer } from '@/server/mail/mailer';
import { backoffDelayMs, nextAttemptAt, retryPolicy, shouldRetry } from '@/server/mail/retry';

import { makeTempDir } from './helpers';
import { makeSamplePdf, operatorAddress } from './mail-fixtures';

const s = 1000;
const min = 60 * s;
const h = 60 * min;

describe('backoff', () => {
  const noJitter = () => 0.5;

  test('grows ×4 from 30 s and caps at 6 h', () => {
    const schedule = [1, 2, 3, 4, 5, 6, 7, 8].map((n) => backoffDelayMs(n, noJitter));
    expect(schedule).toEqual([30 * s, 2 * min, 8 * min, 32 * min, 128 * min, 6 * h, 6 * h, 6 * h]);
    for (let i = 1; i < schedule.length; i++) expect(schedule[i]).toBeGreaterThanOrEqual(schedule[i - 1]);
  });

  test('jitter stays within ±20 % and never passes the cap', () => {
    expect(backoffDelayMs(1, () => 0)).toBe(24 * s);
    expect(backoffDelayMs(1, () => 0.999999)).toBeCloseTo(36 * s, -1);
    expect(backoffDelayMs(4, () => 0)).toBe(25.6 * min);
    expect(backoffDelayMs(7, () => 0.999999)).toBe(6 * h);
    expect(backoffDelayMs(7, () => 0)).toBe(4.8 * h);
    for (let i = 0; i < 200; i++) {
      const d = backoffDelayMs(3);
      expect(d).toBeGreaterThanOrEqual(6.4 * min);
      expect(d).toBeLessThanOrEqual(9.6 * min);
    }
  });

  test('nextAttemptAt is now plus the delay', () => {
    const now = new Date('2026-06-01T10:00:00Z');
    expect(nextAttemptAt(2, now, noJitter).toISOString()).toBe('2026-06-01T10:02:00.000Z');
    expect(() => nextAttemptAt(0, now)).toThrow();
  });

  test('eight attempts in all, and only for transient errors', () => {
    const transient = { code: 'EENVELOPE', responseCode: 451 };
    expect(retryPolicy.maxAttempts).toBe(8);
    expect(shouldRetry(transient, 1)).toBe(true);
    expect(shouldRetry(transient, 7)).toBe(true);
    expect(shouldRetry(transient, 8)).toBe(false);
    expect(shouldRetry({ code: 'EENVELOPE', responseCode: 550 }, 1)).toBe(false);
  });
});

test.each([
  [421, 'transient'],
  [450, 'transient'],
  [451, 'transient'],
  [452, 'transient'],
  [550, 'permanent'],
  [552, 'permanent'],
  [553, 'permanent'],
  [554, 'permanent'],
])('reply %d is %s (RFC 5321 §4.2.1)', (responseCode, kind) => {
  expect(classifyMailError({ code: 'EMESSAGE', responseCode })).toBe(kind);
});

test.each([
  [{ code: 'ECONNECTION' }, 'transient'],
  [{ code: 'ETIMEDOUT' }, 'transient'],
  [{ code: 'ESOCKET', originalCode: 'ECONNREFUSED' }, 'transient'],
  [{ code: 'EAUTH' }, 'permanent'],
  [{ code: 'EAUTH', responseCode: 535 }, 'permanent'],
  [{ code: 'EAUTH', responseCode: 454 }, 'transient'],
  [new Error('something else'), 'permanent'],
])('%p is %s', (error, kind) => {
  expect(classifyMailError(error)).toBe(kind);
});

/**
 * An in-memory delivery row keeping the claim contract of deliver.ts, as the notices table will:
 * claim only a due `pending` row or a `sending` row older than the lease, in one step.
 */
function memoryDelivery() {
  const row = {
    status: 'pending' as 'pending' | 'sending' | 'sent' | 'failed',
    attempts: 0,
    nextAttemptAt: new Date(0),
    claimedAt: null as Date | null,
    messageId: null as string | null,
    lastError: null as unknown,
  };
  const hooks: DeliveryHooks = {
    claim: (now) => {
      const due = row.status === 'pending' && row.nextAttemptAt <= now;
      const stale =
        row.status === 'sending' &&
        row.claimedAt &&
        now.getTime() - row.claimedAt.getTime() >= sendingLeaseMs;
      if (!due && !stale) return null;
      row.status = 'sending';
      row.attempts += 1;
      row.claimedAt = now;
      return { attempt: row.attempts };
    },
    markSent: (r) => {
      row.status = 'sent';
      row.messageId = r.messageId;
    },
    markRetry: (r) => {
      row.status = 'pending';
      row.nextAttemptAt = r.nextAttemptAt;
      row.lastError = r.error;
    },
    markFailed: (r) => {
      row.status = 'failed';
      row.lastError = r.error;
    },
  };
  return { row, hooks };
}

describe('deliverOnce over SMTP', () => {
  let dir: string;
  let fake: FakeSmtp;
  let mailer: Mailer;
  let clock: Date;
  const now = () => clock;
  const advance = (ms: number) => (clock = new Date(clock.getTime() + ms));

  beforeEach(async () => {
    dir = makeTempDir('pivotwatch-deliver-');
    fake = await startFakeSmtp({ dir: path.join(dir, 'mailbox') });
    mailer = createMailer({ smtpUrl: fake.url, from: 'notices@halvard-inspections.test' });
    clock = new Date('2026-06-01T10:00:00Z');
  });
  afterEach(async () => {
    mailer.close();
    await fake.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  const mail = async () => ({
    to: operatorAddress,
    subject: 'Notice PW-2026-0011: Skyhook Sweep out of service',
    text: 'Open the notice: http://localhost:8080/notices/n-11',
    attachments: [{ filename: 'PW-2026-0011.pdf', content: await makeSamplePdf('PW-2026-0011') }],
    idempotencyKey: deliveryKey('n-11', operatorAddress),
  });

  test('a 451 defers the delivery; the retry when due delivers exactly once', async () => {
    const { row, hooks } = memoryDelivery();
    const message = await mail();
    fake.failNext(1, { code: 451, when: 'data' });

    const first = await deliverOnce({ mailer, mail: message, hooks, now, random: () => 0.5 });
    expect(first).toMatchObject({
      status: 'retry',
      attempt: 1,
      error: { kind: 'transient', responseCode: 451 },
    });
    expect(row).toMatchObject({ status: 'pending', attempts: 1 });
    expect(row.nextAttemptAt.getTime() - clock.getTime()).toBe(30 * s);
    expect(fake.list()).toHaveLength(0);

    advance(10 * s);
    expect(await deliverOnce({ mailer, mail: message, hooks, now })).toEqual({ status: 'skipped' });

    advance(20 * s);
    const second = await deliverOnce({ mailer, mail: message, hooks, now });
    expect(second).toMatchObject({ status: 'sent', attempt: 2 });
    expect(row).toMatchObject({ status: 'sent', attempts: 2 });

    expect(await deliverOnce({ mailer, mail: message, hooks, now })).toEqual({ status: 'skipped' });
    const kept = fake.list();
    expect(kept).toHaveLength(1);
    expect(kept[0].messageId).toBe(row.messageId);
  });

  test('a 550 fails the delivery at once, with the reason kept', async () => {
    const { row, hooks } = memoryDelivery();
    fake.failNext(1, { code: 550, when: 'rcpt', message: 'No such mailbox' });
    const outcome = await deliverOnce({ mailer, mail: await mail(), hooks, now });
    expect(outcome).toMatchObject({
      status: 'failed',
      attempt: 1,
      error: { kind: 'permanent', responseCode: 550 },
    });
    expect(row.status).toBe('failed');
    expect(JSON.stringify(row.lastError)).toContain('No such mailbox');
  });

  test('the last attempt that fails transiently fails the delivery', async () => {
    const { row, hooks } = memoryDelivery();
    row.attempts = retryPolicy.maxAttempts - 1;
    fake.failNext(1, { code: 451, when: 'rcpt' });
    const outcome = await deliverOnce({ mailer, mail: await mail(), hooks, now });
    expect(outcome).toMatchObject({ status: 'failed', attempt: retryPolicy.maxAttempts });
  });

  test('a crash after the server accepted: the stale row is re-sent after the lease, still one copy', async () => {
    const { row, hooks } = memoryDelivery();
    const message = await mail();
    // The process dies after the SMTP transaction and before markSent: simulated by a markSent that throws.
    const crashing: DeliveryHooks = {
      ...hooks,
      markSent: () => {
        throw new Error('process stopped');
      },
    };
    await expect(deliverOnce({ mailer, mail: message, hooks: crashing, now })).rejects.toThrow(
      'process stopped',
    );
    expect(row.status).toBe('sending');
    expect(fake.list()).toHaveLength(1);

    advance(sendingLeaseMs - 1);
    expect(await deliverOnce({ mailer, mail: message, hooks, now })).toEqual({ status: 'skipped' });

    advance(1);
    expect(await deliverOnce({ mailer, mail: message, hooks, now })).toMatchObject({
      status: 'sent',
      attempt: 2,
    });
    expect(fake.list()).toHaveLength(1);
    expect(fake.stats()).toMatchObject({ stored: 1, duplicates: 1 });
  });

  test('a reply lost in transit is retried and the operator still gets one copy', async () => {
    const { hooks } = memoryDelivery();
    const message = await mail();
    fake.dropNext(1, { when: 'after-accept' });
    expect(await deliverOnce({ mailer, mail: message, hooks, now, random: () => 0.5 })).toMatchObject({
      status: 'retry',
      error: { kind: 'transient' },
    });
    advance(30 * s);
    expect(await deliverOnce({ mailer, mail: message, hooks, now })).toMatchObject({ status: 'sent' });
    expect(fake.list()).toHaveLength(1);
  });
});
