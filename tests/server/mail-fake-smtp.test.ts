/**
 * The mailer and the loopback mailbox, over real SMTP (nodemailer client, smtp-server on 127.0.0.1).
 * Reply-code classes follow RFC 5321 §4.2.1: 4yz transient negative, 5yz permanent negative.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import { simpleParser } from 'mailparser';

import { startFakeSmtp, type FakeSmtp } from '@/server/mail/fake-smtp';
import { idempotencyKeyHeader, openMailbox } from '@/server/mail/mailbox';
import { createMailer, deliveryKey, MailSendError, messageIdFor, type Mailer } from '@/server/mail/mailer';

import { makeTempDir } from './helpers';
import { makeSamplePdf, operatorAddress, secondOperatorAddress } from './mail-fixtures';

const from = 'Halvard Ride Inspection Services <notices@halvard-inspections.test>';
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

let dir: string;
let fake: FakeSmtp;
let mailer: Mailer;

beforeEach(async () => {
  dir = makeTempDir('pivotwatch-mail-');
  fake = await startFakeSmtp({ dir: path.join(dir, 'mailbox') });
  mailer = createMailer({ smtpUrl: fake.url, from });
});
afterEach(async () => {
  mailer.close();
  await fake.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

const notice = (key: string, to = operatorAddress) => ({
  to,
  subject: 'Notice PW-2026-0007: Skyhook Sweep restricted',
  text: 'Open the notice: http://localhost:8080/notices/n-7\n\nResults support, never replace, the judgement of a competent inspector.',
  html: '<p><a href="http://localhost:8080/notices/n-7">Open the notice</a></p>',
  idempotencyKey: key,
});

const expectSendError = async (promise: Promise<unknown>) => {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(MailSendError);
  return error as MailSendError;
};

test('a notice with a PDF arrives through SMTP and parses back byte-identical', async () => {
  const pdf = await makeSamplePdf();
  expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-'); // PDF header, ISO 32000-1 §7.5.2
  const key = deliveryKey('n-7', operatorAddress);

  const result = await mailer.send({
    ...notice(key),
    attachments: [{ filename: 'PW-2026-0007.pdf', content: pdf, contentType: 'application/pdf' }],
  });
  expect(result.accepted).toEqual([operatorAddress]);
  expect(result.rejected).toEqual([]);
  expect(result.response).toMatch(/^250 /);
  expect(result.messageId).toBe(messageIdFor(key, 'halvard-inspections.test'));

  const [entry, ...rest] = fake.list();
  expect(rest).toHaveLength(0);
  expect(entry).toMatchObject({
    envelope: { from: 'notices@halvard-inspections.test', to: [operatorAddress] },
    to: [operatorAddress],
    subject: 'Notice PW-2026-0007: Skyhook Sweep restricted',
    messageId: result.messageId,
    idempotencyKey: key,
    attachments: [
      { index: 0, filename: 'PW-2026-0007.pdf', contentType: 'application/pdf', size: pdf.length },
    ],
  });

  const message = await fake.get(entry.id);
  expect(message?.text).toContain('http://localhost:8080/notices/n-7');
  expect(message?.html).toContain('href="http://localhost:8080/notices/n-7"');
  const attachment = await fake.attachment(entry.id, 0);
  expect(attachment?.content.equals(pdf)).toBe(true);
  expect(sha256(attachment!.content)).toBe(sha256(pdf));

  // The raw .eml on disk is the message as sent; parse it independently of the mailbox code.
  const raw = fs.readFileSync(path.join(dir, 'mailbox', `${entry.id}.eml`));
  const reparsed = await simpleParser(raw);
  expect(reparsed.headers.get(idempotencyKeyHeader.toLowerCase())).toBe(key);
  expect(reparsed.messageId).toBe(result.messageId);
  expect(reparsed.attachments[0].content.equals(pdf)).toBe(true);
  expect(await fake.get('../../etc/passwd')).toBeNull();
});

test('kept messages survive a restart, newest first, and still count as delivered', async () => {
  await mailer.send(notice('notice.n-1.a'));
  await mailer.send(notice('notice.n-2.a'));
  const before = fake.list();
  expect(before.map((m) => m.idempotencyKey)).toEqual(['notice.n-2.a', 'notice.n-1.a']);

  mailer.close();
  await fake.close();
  fake = await startFakeSmtp({ dir: path.join(dir, 'mailbox') });
  mailer = createMailer({ smtpUrl: fake.url, from });

  expect(fake.list()).toEqual(before);
  expect((await fake.get(before[1].id))?.subject).toBe(notice('x').subject);
  await mailer.send(notice('notice.n-1.a'));
  expect(fake.list()).toHaveLength(2);
  expect(fake.stats().duplicates).toBe(1);
});

test('a key already held by a recipient is not kept twice; another recipient still gets it', async () => {
  const first = await mailer.send(notice('notice.n-3.a'));
  const again = await mailer.send(notice('notice.n-3.a'));
  expect(again.messageId).toBe(first.messageId);
  expect(again.accepted).toEqual([operatorAddress]);
  expect(fake.list()).toHaveLength(1);

  await mailer.send(notice('notice.n-3.a', secondOperatorAddress.toUpperCase()));
  await mailer.send(notice('notice.n-3.a', secondOperatorAddress));
  expect(fake.list()).toHaveLength(2);
  expect(fake.stats()).toMatchObject({ stored: 2, duplicates: 2 });
});

test('451 at RCPT is a transient error; the retry delivers and the mailbox holds one copy', async () => {
  fake.failNext(1, { code: 451, when: 'rcpt' });
  const error = await expectSendError(mailer.send(notice('notice.n-4.a')));
  expect(error.kind).toBe('transient');
  expect(error.info).toMatchObject({ responseCode: 451, code: 'EENVELOPE' });
  expect(fake.list()).toHaveLength(0);

  await mailer.send(notice('notice.n-4.a'));
  expect(fake.list()).toHaveLength(1);
  expect(fake.pendingFaults()).toBe(0);
});

test('554 after DATA is a permanent error and nothing is kept', async () => {
  fake.failNext(1, { code: 554, when: 'data', message: 'Message refused by policy' });
  const error = await expectSendError(mailer.send(notice('notice.n-5.a')));
  expect(error.kind).toBe('permanent');
  expect(error.info.responseCode).toBe(554);
  expect(error.message).toContain('Message refused by policy');
  expect(fake.list()).toHaveLength(0);
});

test('421 at MAIL FROM is transient; faults apply to the next n transactions only', async () => {
  fake.failNext(2, { code: 421, when: 'mail' });
  expect((await expectSendError(mailer.send(notice('notice.n-6.a')))).kind).toBe('transient');
  expect((await expectSendError(mailer.send(notice('notice.n-6.a')))).kind).toBe('transient');
  await mailer.send(notice('notice.n-6.a'));
  expect(fake.list()).toHaveLength(1);
});

test('a connection cut during DATA is transient and keeps nothing', async () => {
  const pdf = await makeSamplePdf();
  fake.dropNext(1, { when: 'data' });
  const error = await expectSendError(
    mailer.send({ ...notice('notice.n-8.a'), attachments: [{ filename: 'n.pdf', content: pdf }] }),
  );
  expect(error.kind).toBe('transient');
  expect(fake.list()).toHaveLength(0);

  await mailer.send({ ...notice('notice.n-8.a'), attachments: [{ filename: 'n.pdf', content: pdf }] });
  expect(fake.list()).toHaveLength(1);
});

test('a reply lost after the server kept the message: the retry with the same key delivers exactly once', async () => {
  fake.dropNext(1, { when: 'after-accept' });
  const error = await expectSendError(mailer.send(notice('notice.n-9.a')));
  expect(error.kind).toBe('transient');
  expect(fake.list()).toHaveLength(1); // the client could not know, but the message is there

  await mailer.send(notice('notice.n-9.a'));
  expect(fake.list()).toHaveLength(1);
  expect(fake.stats()).toMatchObject({ stored: 1, duplicates: 1 });
});

test('a server that cannot be reached is a transient error', async () => {
  const url = fake.url;
  await fake.close();
  const error = await expectSendError(createMailer({ smtpUrl: url, from }).send(notice('notice.n-10.a')));
  expect(error.kind).toBe('transient');
});

test('keys that cannot travel in a header are refused before connecting', async () => {
  const error = await expectSendError(mailer.send(notice('has a space')));
  expect(error.kind).toBe('permanent');
  expect(fake.list()).toHaveLength(0);
});

test('the fake listens on loopback only', async () => {
  await expect(startFakeSmtp({ host: '0.0.0.0', dir: path.join(dir, 'other') })).rejects.toThrow(/loopback/);
});

test('clear() empties the mailbox and forgets delivered keys', async () => {
  await mailer.send(notice('notice.n-11.a'));
  fake.clear();
  expect(fake.list()).toEqual([]);
  expect(fs.readdirSync(path.join(dir, 'mailbox')).filter((n) => n.endsWith('.eml'))).toEqual([]);
  await mailer.send(notice('notice.n-11.a'));
  expect(fake.list()).toHaveLength(1);
});

test('an .eml the index never recorded (never acknowledged) is removed when the mailbox opens', async () => {
  await mailer.send(notice('notice.n-12.a'));
  const mailboxDir = path.join(dir, 'mailbox');
  fs.writeFileSync(path.join(mailboxDir, 'half-written.eml'), 'Subject: lost\r\n\r\n');
  const reopened = openMailbox(mailboxDir);
  expect(reopened.list()).toHaveLength(1);
  expect(fs.existsSync(path.join(mailboxDir, 'half-written.eml'))).toBe(false);
});
