/**
 * SIGKILL during an e-mail send: notices wait to go out, the real server process starts sending them and
 * is killed part way (ideally after the mail server took a message and before its row said so, the hard
 * case server/mail/deliver.ts describes), then started again on the same DATA_DIR. Every delivery must
 * reach the local mailbox exactly once (one message per idempotency key and recipient, the Message-ID the
 * row recorded), with no e-mail lost to the interrupted attempt.
 */
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';

import { databaseFileName } from '@/server/db';
import { sqliteOf } from '@/server/sqlite-client';

import { spawnServer, type ServerProcess } from './crash-helpers';
import { appUrl, approveAndIssue, inspectWithFindings, makeNoticeServer } from './notices-fixtures';

jest.setTimeout(180_000);

let dataDir: string;
let server: ServerProcess | null = null;
afterAll(async () => {
  await server?.kill();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

type Row = { key: string; recipient: string; status: string; messageId: string | null };
type MailboxIndex = {
  messages: { idempotencyKey: string | null; messageId: string | null; envelope: { to: string[] } }[];
};

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function deliveries(file: string): Row[] {
  const db = new Database(file, { readonly: true });
  try {
    return db
      .prepare(
        'SELECT idempotency_key AS key, recipient, status, message_id AS messageId FROM notice_deliveries ORDER BY id',
      )
      .all() as Row[];
  } finally {
    db.close();
  }
}

function mailbox(dir: string): MailboxIndex['messages'] {
  try {
    return (JSON.parse(fs.readFileSync(path.join(dir, 'index.json'), 'utf8')) as MailboxIndex).messages;
  } catch {
    return []; // not written yet, or being replaced this instant
  }
}

test('a SIGKILL in the middle of sending notices: after restart every e-mail is delivered exactly once', async () => {
  const s = await makeNoticeServer(new Date());
  dataDir = s.config.dataDir;
  for (const ride of ['Twin Comet', 'Skylark', 'Lantern Wheel']) {
    const inspected = await inspectWithFindings(s, ride, [
      { severity: 'fix_by_date', description: 'Gondola latch stiff', dueOn: '2027-01-29' },
    ]);
    approveAndIssue(s, inspected.inspectionId);
  }
  // Hand DATA_DIR over to the real server: nothing of this process keeps it open.
  s.mailer.close();
  await s.fake.close();
  sqliteOf(s.db).close();
  const dbFile = path.join(dataDir, databaseFileName);
  const mailDir = path.join(dataDir, 'mailbox');
  const queued = deliveries(dbFile);
  expect(queued.length).toBeGreaterThanOrEqual(3);
  expect(queued.every((r) => r.status === 'pending')).toBe(true);

  server = await spawnServer(dataDir, { APP_URL: appUrl });
  // Kill as soon as a message is in the mailbox that its row does not yet call sent, or failing that, while
  // a later row is being sent after an earlier one went out.
  let atKill: Row[] = [];
  for (let i = 0; i < 12_000; i++) {
    const rows = deliveries(dbFile);
    const sent = rows.filter((r) => r.status === 'sent').length;
    const sending = rows.some((r) => r.status === 'sending');
    if (mailbox(mailDir).length > sent || (sent > 0 && sending)) {
      await server.kill();
      atKill = rows;
      break;
    }
    await sleep(5);
  }
  server = null;
  expect(atKill.length).toBe(queued.length);
  expect(atKill.filter((r) => r.status === 'sent').length).toBeLessThan(queued.length);

  // The hard case for certain, whether or not the kill landed in it: a message the mailbox took whose row
  // still says `sending` (as if the process died between the SMTP reply and marking the row).
  const taken = new Set(mailbox(mailDir).map((m) => m.idempotencyKey));
  const inHardCase = atKill.some((r) => r.status === 'sending' && taken.has(r.key));
  if (!inHardCase) {
    const writable = new Database(dbFile);
    const row = deliveries(dbFile).find((r) => r.status === 'sent');
    if (!row) throw new Error('nothing was sent before the kill');
    writable
      .prepare(
        "UPDATE notice_deliveries SET status = 'sending', message_id = NULL, sent_at = NULL WHERE idempotency_key = ?",
      )
      .run(row.key);
    writable.close();
  }

  server = await spawnServer(dataDir, { APP_URL: appUrl });
  let rows = deliveries(dbFile);
  for (let i = 0; i < 600 && !rows.every((r) => r.status === 'sent'); i++) {
    await sleep(100);
    rows = deliveries(dbFile);
  }
  server.child.kill('SIGTERM');
  await server.ended;
  server = null;

  expect(rows.map((r) => r.status)).toEqual(queued.map(() => 'sent'));
  const messages = mailbox(mailDir);
  const received = messages.flatMap((m) =>
    m.envelope.to.map((to) => `${m.idempotencyKey}|${to.toLowerCase()}`),
  );
  // Exactly once: as many messages as deliveries, one per key and recipient, each the one its row names.
  expect(received).toHaveLength(queued.length);
  expect(new Set(received)).toEqual(new Set(queued.map((r) => `${r.key}|${r.recipient.toLowerCase()}`)));
  const byKey = new Map(messages.map((m) => [m.idempotencyKey, m.messageId]));
  for (const r of rows) expect(byKey.get(r.key)).toBe(r.messageId);
});
