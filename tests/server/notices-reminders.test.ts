/**
 * Reminders about findings coming due: one e-mail per operator company per run, each finding reminded
 * once per stage (due within 7 days, past due), delivered through real SMTP to the loopback mailbox. The
 * schedule is croner's reading of a standard five-field cron pattern (minute hour day month weekday).
 */
import { eq } from 'drizzle-orm';

import { findingReminders, noticeDeliveries } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { runReminders, startReminderJob } from '@/server/notices/reminders';

import {
  approveAndIssue,
  appUrl,
  companyOfRide,
  inspectWithFindings,
  makeNoticeServer,
  type Inspected,
  type NoticeServer,
} from './notices-fixtures';

jest.setTimeout(60_000);

const start = new Date('2026-05-04T15:00:00.000Z');
let s: NoticeServer;
let tams: Inspected;
let corvane: Inspected;
let tamsNotice: string;

beforeAll(async () => {
  s = await makeNoticeServer(start);
  tams = await inspectWithFindings(s, 'Skylark', [
    { severity: 'fix_by_date', description: 'Handrail bracket loose', dueOn: '2026-05-08' }, // in 4 days
    { severity: 'fix_by_date', description: 'Queue sign faded', dueOn: '2026-05-02' }, // 2 days past
    { severity: 'fix_by_date', description: 'Drain blocked', dueOn: '2026-05-30' }, // not yet
    { severity: 'fix_by_date', description: 'Light out', dueOn: '2026-05-05' }, // closed below
    { severity: 'fix_by_date', description: 'Seat pad split', dueOn: '2026-05-06' }, // action reported
  ]);
  tamsNotice = approveAndIssue(s, tams.inspectionId).id;
  corvane = await inspectWithFindings(s, 'Tidebreaker', [
    { severity: 'fix_by_date', description: 'Sub-arm guard dented', dueOn: '2026-05-10' },
  ]);
  approveAndIssue(s, corvane.inspectionId);
  s.db.update(findings).set({ state: 'closed' }).where(eq(findings.id, tams.findingIds[3])).run();
  s.db.update(findings).set({ state: 'action_reported' }).where(eq(findings.id, tams.findingIds[4])).run();
  // The notices themselves go out first, so the mailbox below holds only reminders.
  await s.deliver();
  s.fake.clear();
});
afterAll(() => s.close());

const reminders = () => s.db.select().from(findingReminders).all();
const reminderRows = () =>
  s.db.select().from(noticeDeliveries).where(eq(noticeDeliveries.kind, 'reminder')).all();
// Reminders go out from 07:00 on each site's clock. The demo's Tamsworth Pier keeps Europe/London time
// (BST, UTC+1, in May) and Lowfield Common America/Los_Angeles (PDT, UTC−7, in May; offsets from the IANA
// tz database), so 14:00 UTC is 15:00 and 07:00 there: both have had their reminder hour, on the same date.
const run = (at: string) => runReminders({ db: s.db, appUrl }, new Date(at));

test('a run reminds each company once about its open findings due within 7 days or past due', async () => {
  const result = run('2026-05-04T14:00:00.000Z');
  expect(result.companies).toBe(2);
  expect(new Set(result.reminded.map((r) => `${r.findingId}:${r.stage}`))).toEqual(
    new Set([
      `${tams.findingIds[0]}:due_soon`,
      `${tams.findingIds[1]}:past_due`,
      `${corvane.findingIds[0]}:due_soon`,
    ]),
  );
  expect(reminders()).toHaveLength(3);

  const rows = reminderRows();
  const tamsAddresses = companyOfRide(s.db, 'Skylark').noticeEmails;
  const corvaneAddresses = companyOfRide(s.db, 'Tidebreaker').noticeEmails;
  expect(rows.map((r) => r.recipient).sort()).toEqual([...tamsAddresses, ...corvaneAddresses].sort());

  expect(await s.deliver()).toMatchObject({ sent: rows.length, failed: 0 });
  const inbox = s.fake.list();
  expect(inbox).toHaveLength(rows.length);
  const toTams = inbox.find((m) => m.envelope.to.includes(tamsAddresses[0]));
  expect(toTams?.subject).toBe('Reminder: findings 1 past due, 1 due within 7 days · Tamsworth Pier Leisure');
  const message = await s.fake.get(toTams!.id);
  expect(message?.text).toContain('Queue sign faded');
  expect(message?.text).toContain('2 days past due');
  expect(message?.text).toContain('Handrail bracket loose');
  expect(message?.text).toContain('due in 4 days');
  expect(message?.text).toContain(`${appUrl}/notices/${tamsNotice}`);
  for (const absent of ['Drain blocked', 'Light out', 'Seat pad split', 'Sub-arm guard dented'])
    expect(message?.text).not.toContain(absent);
});

test('running again the same day, or later in the same stage, sends nothing new', async () => {
  const before = reminderRows().length;
  expect(run('2026-05-04T19:00:00.000Z')).toMatchObject({ companies: 0, reminded: [] });
  expect(run('2026-05-06T14:00:00.000Z')).toMatchObject({ companies: 0, reminded: [] });
  expect(reminderRows()).toHaveLength(before);
});

test('each finding gets each stage once: due soon, then past due', async () => {
  // 9 May: the handrail (due 8 May) is now past due; the drain (due 30 May) is still more than 7 days out.
  const result = run('2026-05-09T14:00:00.000Z');
  expect(result.reminded).toEqual(
    expect.arrayContaining([{ findingId: tams.findingIds[0], stage: 'past_due' }]),
  );
  expect(result.reminded).toHaveLength(1);
  // 23 May: the drain comes within 7 days; 11 May: the guard (due 10 May) is past due.
  expect(
    run('2026-05-23T14:00:00.000Z')
      .reminded.map((r) => r.stage)
      .sort(),
  ).toEqual(['due_soon', 'past_due']);
  expect(run('2026-06-30T14:00:00.000Z').reminded.map((r) => `${r.findingId}:${r.stage}`)).toEqual([
    `${tams.findingIds[2]}:past_due`,
  ]);
  expect(run('2026-07-30T14:00:00.000Z').reminded).toEqual([]);
  const stages = new Map<string, string[]>();
  for (const r of reminders()) stages.set(r.findingId, [...(stages.get(r.findingId) ?? []), r.stage].sort());
  expect(Object.fromEntries(stages)).toEqual({
    [tams.findingIds[0]]: ['due_soon', 'past_due'],
    [tams.findingIds[1]]: ['past_due'],
    [tams.findingIds[2]]: ['due_soon', 'past_due'],
    [corvane.findingIds[0]]: ['due_soon', 'past_due'],
  });
});

test('the job runs hourly with croner (each site from 07:00 on its clock) unless told otherwise', () => {
  const job = startReminderJob({ db: s.db, appUrl });
  const custom = startReminderJob({ db: s.db, appUrl, schedule: '30 5 * * 1-5', timezone: 'UTC' });
  try {
    const next = job.nextRun();
    expect(next?.toISOString()).toMatch(/T\d\d:00:00\.000Z$/);
    expect(next!.getTime() - Date.now()).toBeLessThanOrEqual(3_600_000);
    const weekday = custom.nextRun();
    expect(weekday?.toISOString()).toMatch(/T05:30:00\.000Z$/);
    expect([1, 2, 3, 4, 5]).toContain(weekday?.getUTCDay());
  } finally {
    job.stop();
    custom.stop();
  }
});
