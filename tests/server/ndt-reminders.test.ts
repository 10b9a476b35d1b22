/**
 * NDT in the 07:00 reminders: a planned test coming due within 30 days or past its due date is listed in
 * the operator company's reminder e-mail once per stage and due date. Due dates are worked by hand
 * (Gregorian calendar, checked with Python's datetime.date); the 30-day window is our own rule.
 */
import { and, eq } from 'drizzle-orm';

import { ndtReminders } from '@/db/server/ndt';
import { noticeDeliveries } from '@/db/server/notices';
import { companies, designVersions, users } from '@/db/server/schema';
import { runReminders } from '@/server/notices/reminders';

import type { TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { rodDesign } from '@/tests/support/rod-design';

const appUrl = 'https://pivotwatch.example';
let server: TestServer;
let api: Clients;
let rideId = '';
let companyName = '';

const run = (at: string) => runReminders({ db: server.db, appUrl }, new Date(at));
const reminderMails = () =>
  server.db.select().from(noticeDeliveries).where(eq(noticeDeliveries.kind, 'reminder')).all();

beforeAll(async () => {
  server = await makePinnedServer(new Date('2026-06-01T09:00:00Z'));
  api = await demoClients(server.app);
  const operator = server.db
    .select({ companyId: users.companyId })
    .from(users)
    .where(eq(users.email, 'operator@pivotwatch.test'))
    .get();
  const company = server.db
    .select({ name: companies.name })
    .from(companies)
    .where(eq(companies.id, operator?.companyId ?? ''))
    .get();
  companyName = company?.name ?? '';
  const ride = await api.admin.post('/api/rides', {
    operatorCompanyId: operator?.companyId,
    name: 'Reminder Test Swing',
    rideClass: 'other',
  });
  rideId = ride.body.ride.id;
  const data = rodDesign(1306, 6, 'NDT reminder rod');
  data.pivots[0].ndt = [
    { method: 'MT', intervalDays: 365 },
    { method: 'UT', intervalDays: 730 },
  ];
  await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'NDT plans', data }).expect(201);
  server.db
    .update(designVersions)
    .set({ createdAt: '2025-01-01T08:00:00.000Z' })
    .where(and(eq(designVersions.rideId, rideId), eq(designVersions.version, 1)))
    .run();
  // MT last tested 2025-06-20: due 2025-06-20 + 365 d = 2026-06-20, 19 days after 1 June (due soon).
  // UT last tested 2024-05-10: due 2024-05-10 + 730 d = 2026-05-10 (2024-05-10 is after 29 February 2024,
  // and 2025 is a common year), 22 days before 1 June (overdue).
  const base = { joint: 0, technician: 'Ines Harrowgate', level: 2, result: 'no_indications' };
  await api.inspector
    .post(`/api/rides/${rideId}/ndt-records`, { ...base, method: 'MT', testedOn: '2025-06-20' })
    .expect(201);
  await api.inspector
    .post(`/api/rides/${rideId}/ndt-records`, { ...base, method: 'UT', testedOn: '2024-05-10' })
    .expect(201);
}, 60_000);
afterAll(() => server.close());

test('one e-mail per address lists the NDT due soon and overdue, with the link to the ride’s NDT page', () => {
  const result = run('2026-06-01T07:00:00.000Z');
  expect(result.ndt).toEqual([
    { rideId, joint: 0, method: 'MT', dueOn: '2026-06-20', stage: 'due_soon' },
    { rideId, joint: 0, method: 'UT', dueOn: '2026-05-10', stage: 'past_due' },
  ]);
  const mails = reminderMails();
  expect(mails.length).toBeGreaterThan(0);
  const content = mails[0].content!;
  expect(content.subject).toBe(`Reminder: NDT 1 overdue, 1 due within 30 days · ${companyName}`);
  expect(content.text).toContain('NDT overdue:');
  expect(content.text).toContain(
    'Reminder Test Swing, Main pivot: Ultrasonic testing (UT) every 730 days\n  Due 10 May 2026 (22 days overdue), last tested 10 May 2024',
  );
  expect(content.text).toContain('Due 20 Jun 2026 (due in 19 days)');
  expect(content.text).toContain(`${appUrl}/rides/${rideId}/ndt`);
  expect(content.html).toContain('<h3>NDT overdue</h3>');
  expect(server.db.select().from(ndtReminders).all()).toHaveLength(2);
});

test('each stage once per due date: nothing again the same day; the due-soon test sends its overdue stage', () => {
  const before = reminderMails().length;
  expect(run('2026-06-02T07:00:00.000Z')).toMatchObject({ companies: 0, ndt: [] });
  expect(reminderMails()).toHaveLength(before);
  // 21 June: MT (due 20 June) is now overdue; UT was already reminded as overdue.
  expect(run('2026-06-21T07:00:00.000Z').ndt).toEqual([
    { rideId, joint: 0, method: 'MT', dueOn: '2026-06-20', stage: 'past_due' },
  ]);
});

test('a new test gives a new due date, which starts afresh', async () => {
  await api.inspector
    .post(`/api/rides/${rideId}/ndt-records`, {
      joint: 0,
      technician: 'Caius Mellenby',
      level: 3,
      result: 'no_indications',
      method: 'UT',
      testedOn: '2024-05-20',
    })
    .expect(201);
  // 2024-05-20 + 730 d = 2026-05-20: another due date, still past on 22 June.
  expect(run('2026-06-22T07:00:00.000Z').ndt).toEqual([
    { rideId, joint: 0, method: 'UT', dueOn: '2026-05-20', stage: 'past_due' },
  ]);
});
