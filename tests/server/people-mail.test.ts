/**
 * Account e-mails through real SMTP (the loopback mailbox, a real smtp-server) with the same one-attempt
 * machinery as notices: an invitation queued in the database is sent by whichever process runs the loop
 * next (so it survives a restart), exactly once, a refused attempt is retried, and once sent the link is
 * no longer kept in the row.
 */
import path from 'node:path';

import { eq } from 'drizzle-orm';

import { accountMail } from '@/db/server/accounts';
import { processAccountMail } from '@/server/auth/account-mail';
import { createPerson } from '@/server/auth/people';
import { findSessionUser } from '@/server/auth/service';
import { loadConfig } from '@/server/config';
import { openDb } from '@/server/db';
import { startFakeSmtp, type FakeSmtp } from '@/server/mail/fake-smtp';
import { createMailer, type Mailer } from '@/server/mail/mailer';
import { seedDemoData } from '@/server/seed/demo';

import { makeTempDir, userIdOf } from './helpers';

const dataDir = makeTempDir();
const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, WEB_DIR: `${dataDir}/none` });
const database = openDb(dataDir);
const db = database.db;
let fake: FakeSmtp;
let mailer: Mailer;
beforeAll(async () => {
  await seedDemoData(db, config);
  fake = await startFakeSmtp({ dir: path.join(dataDir, 'mailbox') });
  mailer = createMailer({ smtpUrl: fake.url, from: 'accounts@halvard-inspections.test' });
});
afterAll(async () => {
  mailer.close();
  await fake.close();
  database.close();
});

test('a queued invitation is delivered once, retried after a refusal, and its link is then dropped from the row', async () => {
  const admin = findSessionUser(db, userIdOf(db, 'admin@pivotwatch.test'))!;
  const now = new Date();
  await createPerson(
    db,
    admin,
    { email: 'ines.farrow@halvard.test', name: 'Ines Farrow', role: 'supervisor', companyId: null },
    { now, appUrl: 'https://pw.example.test' },
  );
  // Nothing has sent it yet: as after a restart, the row alone carries it.
  const queued = db
    .select()
    .from(accountMail)
    .where(eq(accountMail.recipient, 'ines.farrow@halvard.test'))
    .get();
  expect(queued).toMatchObject({ status: 'pending', attempts: 0 });
  expect(queued?.content?.text).toMatch(/https:\/\/pw\.example\.test\/set-password\?token=/);

  // A temporary refusal (RFC 5321 §4.2.1: 4yz is transient) leaves it pending for a later attempt.
  fake.failNext(1, { code: 451, when: 'mail' });
  expect(await processAccountMail({ db, mailer }, now)).toBe(0);
  const deferred = db.select().from(accountMail).where(eq(accountMail.id, queued!.id)).get();
  expect(deferred).toMatchObject({ status: 'pending', attempts: 1 });

  const later = new Date(deferred!.nextAttemptAt);
  expect(await processAccountMail({ db, mailer }, later)).toBe(1);
  expect(await processAccountMail({ db, mailer }, new Date(later.getTime() + 3_600_000))).toBe(0);

  const inbox = fake.list().filter((m) => m.envelope.to.includes('ines.farrow@halvard.test'));
  expect(inbox).toHaveLength(1);
  const message = await fake.get(inbox[0].id);
  expect(message?.subject).toBe('Your Pivotwatch account');
  expect(message?.text).toContain(queued!.content!.text.split('\n').find((l) => l.includes('set-password')));
  const sent = db.select().from(accountMail).where(eq(accountMail.id, queued!.id)).get();
  expect(sent).toMatchObject({ status: 'sent', content: null });
});
