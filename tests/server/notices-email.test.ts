/**
 * A notice e-mailed through real SMTP: issued on approval, sent by the delivery worker with nodemailer to
 * the mail layer's loopback SMTP server (smtp-server + mailparser), and read back there. The PDF
 * attachment is checked with an independent PDF reader (pdf-parse, on Mozilla's pdf.js). Retries after
 * SMTP failures and after a lost reply must leave exactly one message per recipient.
 */
import { eq } from 'drizzle-orm';

import { noticeDeliveries, notices } from '@/db/server/notices';
import { companies } from '@/db/server/schema';
import { CAUTION_SHORT } from '@/lib/caution-text';
import { noticeDetailSchema, noticeListResponseSchema } from '@/features/notices/schema';
import { retryPolicy } from '@/server/mail/retry';
import { storageOf } from '@/server/storage';
import {
  noticeEmail,
  processDeliveries,
  requeueNotice,
  startDeliveryLoop,
} from '@/server/notices/deliveries';
import { formatCalendarDate } from '@/lib/dates';

import { expectApiError, makeTestServer } from './helpers';
import {
  approveAndIssue,
  appUrl,
  companyOfRide,
  inspectWithFindings,
  makeNoticeServer,
  pdfText,
  type NoticeServer,
} from './notices-fixtures';
import { demoClients } from './registry-helpers';

jest.setTimeout(60_000);

const start = new Date('2026-05-04T09:00:00.000Z');
let s: NoticeServer;
beforeAll(async () => {
  s = await makeNoticeServer(start);
});
afterAll(() => s.close());

const deliveriesOf = (noticeId: string) =>
  s.db.select().from(noticeDeliveries).where(eq(noticeDeliveries.noticeId, noticeId)).all();
const messagesWithKey = (key: string) => s.fake.list().filter((m) => m.idempotencyKey === key);
const later = (ms: number) => new Date(s.now().getTime() + ms);

describe('an approved inspection with findings', () => {
  let issued: { id: string; reference: string; recipients: string[] };
  beforeAll(async () => {
    const inspected = await inspectWithFindings(
      s,
      'Skylark',
      [
        {
          severity: 'fix_by_date',
          description: 'Gondola 2 lap bar latch slow to engage',
          requiredAction: 'Clean and adjust the latch; test every seat',
          dueOn: '2026-05-20',
          photos: [0],
        },
        {
          severity: 'fix_before_operation',
          description: 'Main pivot retaining plate bolt missing',
          requiredAction: 'Fit a new bolt to the maker’s torque and lock it',
          dueOn: '2026-05-06',
        },
      ],
      1,
    );
    issued = approveAndIssue(s, inspected.inspectionId, { note: 'Call us when the bolt is fitted.' });
  });

  test('is e-mailed once to the operator’s notice address, through SMTP, with the PDF attached', async () => {
    const { noticeEmails } = companyOfRide(s.db, 'Skylark');
    expect(issued.reference).toBe('PW-2026-0001');
    expect(issued.recipients).toEqual(noticeEmails);

    const run = await s.deliver();
    expect(run).toMatchObject({ sent: 1, retry: 0, failed: 0 });

    const [row] = deliveriesOf(issued.id);
    expect(row).toMatchObject({ status: 'sent', attempts: 1, recipient: noticeEmails[0] });
    const inbox = messagesWithKey(row.idempotencyKey);
    expect(inbox).toHaveLength(1);
    expect(inbox[0].envelope.to).toEqual(noticeEmails);
    expect(inbox[0].messageId).toBe(row.messageId);
    expect(inbox[0].subject).toContain('PW-2026-0001');
    expect(inbox[0].subject).toContain('Skylark');

    const message = await s.fake.get(inbox[0].id);
    expect(message?.text).toContain(`${appUrl}/notices/${issued.id}`);
    expect(message?.html).toContain(`href="${appUrl}/notices/${issued.id}"`);
    expect(message?.text).toContain(CAUTION_SHORT);
    expect(message?.text).toContain('Due: 20 May 2026');

    expect(message?.attachments).toHaveLength(1);
    const attachment = message!.attachments[0];
    expect(attachment.filename).toBe('PW-2026-0001.pdf');
    expect(attachment.contentType).toBe('application/pdf');
    const text = await pdfText(attachment.content);
    expect(text).toContain('PW-2026-0001');
    expect(text).toContain('Skylark');
    expect(text).toContain('Gondola 2 lap bar latch slow to engage');
    expect(text).toContain('Main pivot retaining plate bolt missing');
    expect(text).toContain(formatCalendarDate('2026-05-20'));
    expect(text).toContain(formatCalendarDate('2026-05-06'));
    expect(text).toContain('Tamsworth Pier Leisure');

    // Nothing more to send: a second run finds the row sent.
    expect(await s.deliver()).toMatchObject({ sent: 0, retry: 0, failed: 0, skipped: 0 });
    expect(messagesWithKey(row.idempotencyKey)).toHaveLength(1);
  });

  test('the link opens the notice for that operator; another company’s operator gets 404', async () => {
    const link = new URL(`${appUrl}/notices/${issued.id}`);
    const id = link.pathname.split('/').pop();
    const own = await s.api.operator.get(`/api/notices/${id}`);
    expect(own.status).toBe(200);
    const notice = noticeDetailSchema.parse(own.body.notice);
    expect(notice.reference).toBe('PW-2026-0001');
    expect(notice.document.url).toBe(link.toString());
    expect(notice.delivery).toMatchObject({ state: 'sent', total: 1, sent: 1 });
    expect(notice.deliveries[0].lastError).toBeNull();
    expect(notice.findings.map((f) => f.description)).toEqual([
      'Gondola 2 lap bar latch slow to engage',
      'Main pivot retaining plate bolt missing',
    ]);

    expectApiError(await s.api.operator2.get(`/api/notices/${id}`), 404, 'not_found');
    expectApiError(await s.api.operator2.get(`/api/notices/${id}/pdf`), 404, 'not_found');
    const list = noticeListResponseSchema.parse((await s.api.operator2.get('/api/notices')).body);
    expect(list.notices.map((n) => n.id)).not.toContain(id);
  });

  test('the PDF route serves the same notice on A4 and Letter (PDF 32000-1 §7.7.3.3 MediaBox)', async () => {
    const a4 = await s.api.operator.get(`/api/notices/${issued.id}/pdf`).buffer(true);
    expect(a4.status).toBe(200);
    expect(a4.headers['content-type']).toBe('application/pdf');
    const letter = await s.api.operator.get(`/api/notices/${issued.id}/pdf?size=LETTER`).buffer(true);
    // ISO 216 A4 is 210 × 297 mm = 595.28 × 841.89 pt; US Letter 8.5 × 11 in = 612 × 792 pt.
    const box = (pdf: Buffer) =>
      /\/MediaBox \[([^\]]+)\]/.exec(pdf.toString('latin1'))?.[1].trim().split(/\s+/);
    expect(
      box(a4.body as Buffer)
        ?.map(Number)
        .map(Math.round),
    ).toEqual([0, 0, 595, 842]);
    expect(box(letter.body as Buffer)?.map(Number)).toEqual([0, 0, 612, 792]);
    expect(await pdfText(letter.body as Buffer)).toContain('Main pivot retaining plate bolt missing');
    expectApiError(
      await s.api.operator.get(`/api/notices/${issued.id}/pdf?size=A3`),
      400,
      'validation_failed',
    );
  });

  test('the admin’s outbox shows the message and its PDF; others may not look', async () => {
    const list = await s.api.admin.get('/api/admin/outbox');
    expect(list.status).toBe(200);
    const entry = list.body.messages.find((m: { subject: string }) => m.subject.includes('PW-2026-0001'));
    expect(entry.attachments[0]).toMatchObject({ index: 0, filename: 'PW-2026-0001.pdf' });
    const one = await s.api.admin.get(`/api/admin/outbox/${entry.id}`);
    expect(one.body.message.text).toContain(`${appUrl}/notices/${issued.id}`);
    const pdf = await s.api.admin.get(`/api/admin/outbox/${entry.id}/attachments/0`).buffer(true);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect((pdf.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expectApiError(await s.api.admin.get(`/api/admin/outbox/${entry.id}/attachments/3`), 404, 'not_found');
    expectApiError(await s.api.supervisor.get('/api/admin/outbox'), 403, 'forbidden');
    expectApiError(await s.api.operator.get(`/api/admin/outbox/${entry.id}/attachments/0`), 403, 'forbidden');
  });
});

test('the delivery loop sends a notice as soon as it is issued, without waiting for its timer', async () => {
  const loop = startDeliveryLoop({
    db: s.db,
    mailer: s.mailer,
    storage: storageOf(s.config),
    intervalMs: 3_600_000,
    now: s.now,
  });
  try {
    await loop.idle();
    const inspected = await inspectWithFindings(s, 'Lantern Wheel', [
      { severity: 'fix_by_date', description: 'Gondola 7 window latch stiff', dueOn: '2026-05-29' },
    ]);
    const issued = approveAndIssue(s, inspected.inspectionId);
    expect(deliveriesOf(issued.id)[0].status).toBe('pending');
    // The nudge runs once the issuing transaction is over (next turn of the event loop).
    await new Promise((resolve) => setImmediate(resolve));
    await loop.idle();
    const [row] = deliveriesOf(issued.id);
    expect(row.status).toBe('sent');
    expect(messagesWithKey(row.idempotencyKey)).toHaveLength(1);
  } finally {
    await loop.stop();
  }
});

describe('retries', () => {
  test('a send refused with a transient SMTP error (451) is retried later and delivered exactly once', async () => {
    const inspected = await inspectWithFindings(s, 'Tidebreaker', [
      { severity: 'fix_by_date', description: 'Sweep arm paint cracked at weld toe', dueOn: '2026-06-01' },
    ]);
    const issued = approveAndIssue(s, inspected.inspectionId);
    s.fake.failNext(1, { code: 451, when: 'data', message: 'Try again later' });
    expect(await s.deliver()).toMatchObject({ retry: 1, sent: 0 });
    const [waiting] = deliveriesOf(issued.id);
    expect(waiting).toMatchObject({ status: 'pending', attempts: 1 });
    expect(waiting.lastError).toContain('451');
    expect(messagesWithKey(waiting.idempotencyKey)).toHaveLength(0);

    // Not due yet: the backoff's first wait is at least base·(1 − jitter) (server/mail/retry.ts).
    expect(new Date(waiting.nextAttemptAt).getTime() - s.now().getTime()).toBeGreaterThanOrEqual(
      retryPolicy.baseMs * (1 - retryPolicy.jitter),
    );
    expect(await s.deliver()).toMatchObject({ sent: 0, retry: 0 });

    s.setNow(later(retryPolicy.baseMs * 2));
    expect(await s.deliver()).toMatchObject({ sent: 1 });
    expect(deliveriesOf(issued.id)[0]).toMatchObject({ status: 'sent', attempts: 2 });
    expect(messagesWithKey(waiting.idempotencyKey)).toHaveLength(1);
  });

  test('a reply lost after the server kept the message: the retry carries the same key and is dropped there', async () => {
    const inspected = await inspectWithFindings(s, 'Twin Comet', [
      { severity: 'note', description: 'Fence gate spring weak' },
    ]);
    const issued = approveAndIssue(s, inspected.inspectionId);
    const duplicatesBefore = s.fake.stats().duplicates;
    s.fake.dropNext(1, { when: 'after-accept' });
    expect(await s.deliver()).toMatchObject({ retry: 1 });
    const [row] = deliveriesOf(issued.id);
    expect(messagesWithKey(row.idempotencyKey)).toHaveLength(1);

    s.setNow(later(retryPolicy.baseMs * 2));
    expect(await s.deliver()).toMatchObject({ sent: 1 });
    expect(s.fake.stats().duplicates).toBe(duplicatesBefore + 1);
    expect(messagesWithKey(row.idempotencyKey)).toHaveLength(1);
    expect(deliveriesOf(issued.id)[0]).toMatchObject({ status: 'sent', attempts: 2 });
  });

  test('a row left “sending” by a crash is taken up after the lease and not delivered twice', async () => {
    const inspected = await inspectWithFindings(s, 'Skylark', [
      { severity: 'fix_by_date', description: 'Drive chain guard loose', dueOn: '2026-06-10' },
    ]);
    const issued = approveAndIssue(s, inspected.inspectionId);
    const [row] = deliveriesOf(issued.id);
    // The crash: the message went out, then the process died before recording it.
    const doc = s.db.select().from(notices).where(eq(notices.id, issued.id)).get()!.document;
    await s.mailer.send({ to: row.recipient, idempotencyKey: row.idempotencyKey, ...noticeEmail(doc) });
    s.db
      .update(noticeDeliveries)
      .set({ status: 'sending', attempts: 1, claimedAt: s.now().toISOString() })
      .where(eq(noticeDeliveries.id, row.id))
      .run();

    // Within the lease the row is left alone (the attempt might still be running).
    expect(await s.deliver()).toMatchObject({ sent: 0 });
    s.setNow(later(20 * 60_000));
    expect(await s.deliver()).toMatchObject({ sent: 1 });
    expect(messagesWithKey(row.idempotencyKey)).toHaveLength(1);
    expect(deliveriesOf(issued.id)[0]).toMatchObject({ status: 'sent', attempts: 2 });
  });

  test('a permanent refusal (550) fails at once; sending again after a fix delivers once', async () => {
    const inspected = await inspectWithFindings(s, 'Tidebreaker', [
      { severity: 'fix_by_date', description: 'Ticket booth step cracked', dueOn: '2026-06-15' },
    ]);
    const issued = approveAndIssue(s, inspected.inspectionId);
    s.fake.failNext(1, { code: 550, when: 'rcpt', message: 'No such mailbox' });
    expect(await s.deliver()).toMatchObject({ failed: 1 });
    const detail = noticeDetailSchema.parse(
      (await s.api.supervisor.get(`/api/notices/${issued.id}`)).body.notice,
    );
    expect(detail.delivery.state).toBe('failed');
    expect(detail.deliveries[0].lastError).toContain('550');
    // Operators see the state, not the SMTP server's words.
    const forOperator = await s.api.operator2.get(`/api/notices/${issued.id}`);
    expect(forOperator.body.notice.deliveries[0].lastError).toBeNull();

    expectApiError(await s.api.operator2.post(`/api/notices/${issued.id}/resend`), 403, 'forbidden');
    expect((await s.api.supervisor.post(`/api/notices/${issued.id}/resend`)).body).toEqual({ queued: 1 });
    expect(await s.deliver()).toMatchObject({ sent: 1 });
    expect(messagesWithKey(deliveriesOf(issued.id)[0].idempotencyKey)).toHaveLength(1);
    // Sending again once everyone has it queues nothing.
    expect((await s.api.supervisor.post(`/api/notices/${issued.id}/resend`)).body).toEqual({ queued: 0 });
  });
});

describe('an operator company without a notice address', () => {
  test('the notice exists and says plainly that nothing was e-mailed; adding an address sends it', async () => {
    const company = companyOfRide(s.db, 'Tidebreaker');
    s.db.update(companies).set({ noticeEmails: [] }).where(eq(companies.id, company.id)).run();
    try {
      const inspected = await inspectWithFindings(s, 'Tidebreaker', [
        { severity: 'fix_by_date', description: 'Queue rail loose', dueOn: '2026-06-20' },
      ]);
      const issued = approveAndIssue(s, inspected.inspectionId);
      expect(issued.recipients).toEqual([]);
      const before = s.fake.list().length;
      await s.deliver();
      expect(s.fake.list()).toHaveLength(before);
      const detail = noticeDetailSchema.parse(
        (await s.api.operator2.get(`/api/notices/${issued.id}`)).body.notice,
      );
      expect(detail.delivery).toEqual({ state: 'no_address', total: 0, sent: 0, failed: 0 });
      expect(detail.deliveries).toEqual([]);

      s.db
        .update(companies)
        .set({ noticeEmails: company.noticeEmails })
        .where(eq(companies.id, company.id))
        .run();
      expect(s.db.transaction((tx) => requeueNotice(tx, issued.id, s.now()))).toBe(1);
      expect(
        await processDeliveries({ db: s.db, mailer: s.mailer, storage: storageOf(s.config) }, s.now()),
      ).toMatchObject({ sent: 1 });
    } finally {
      s.db
        .update(companies)
        .set({ noticeEmails: company.noticeEmails })
        .where(eq(companies.id, company.id))
        .run();
    }
  });
});

test('without a local mailbox (mail to a real SMTP server) the outbox says so', async () => {
  const plain = await makeTestServer();
  try {
    const api = await demoClients(plain.app);
    const err = expectApiError(await api.admin.get('/api/admin/outbox'), 404, 'no_local_mailbox');
    expect(err.message).toMatch(/SMTP_URL/);
  } finally {
    plain.close();
  }
});
