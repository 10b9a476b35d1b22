/**
 * The operator's daily job against the real server and web export: at phone size (390×844) the operator
 * of Tamsworth Pier Leisure opens the daily checks, goes offline, fills Lantern Wheel's pre-opening
 * checklist and test run, sends it (kept on the phone), comes back online and sees it sent; the
 * supervisor at desktop size (1440×900) sees the check on the ride's page, and on Skylark's page a day it
 * ran without a daily check. What the pages show is checked against the server's answer.
 */
import type { RideDailyChecks } from '@/features/daily-checks/schema';
import { addDays, dayInZone, formatDate, startOfDayInZone } from '@/lib/dates';
import { apiGet, apiToken, pushAsPhone, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
const rideIds = new Map<string, string>();
// The pier's clock (the demo site's zone), on which every daily check's day is counted.
const zone = 'Europe/London';
const today = dayInZone(new Date(), zone);

beforeAll(async () => {
  const token = await apiToken(app.baseUrl, 'operator@pivotwatch.test');
  const { rides } = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  for (const r of rides) rideIds.set(r.name, r.id);
  // Skylark's history as its phone would have left it: a check three days ago, then a day run (the day
  // before yesterday) with none — the missed day the inspection body should see.
  const skylark = rideIds.get('Skylark') ?? '';
  const checkedOn = addDays(today, -3);
  const at = new Date(startOfDayInZone(checkedOn, zone).getTime() + 8 * 3_600_000).toISOString();
  const operatorId = (await apiGet<{ user: { id: string; name: string } }>(app.baseUrl, '/api/me', token))
    .user;
  const res = await pushAsPhone(app.baseUrl, token, [
    {
      id: crypto.randomUUID(),
      rideId: skylark,
      designVersionId: null,
      templateId: null,
      templateVersion: null,
      type: 'daily_pre_opening',
      authorId: operatorId.id,
      startedAt: at,
      submittedAt: at,
      checklist: [{ itemId: 'restraints', area: 'The ride', text: 'Every restraint locks', result: 'pass' }],
      readings: [],
      photos: [],
      preview: null,
      amendsId: null,
      declaration: {
        text: 'Checked before opening.',
        declaredAt: at,
        declaredBy: operatorId.id,
        declaredByName: operatorId.name,
      },
      testRuns: [{ cycles: 2, result: 'pass' }],
    },
  ]);
  expect(((await res.json()) as { results: { status: string }[] }).results[0].status).toBe('accepted');
  for (const [day, cycles] of [
    [addDays(today, -2), 140],
    [addDays(today, -1), 0],
  ] as const) {
    const logged = await fetch(`${app.baseUrl}/api/rides/${skylark}/running-log`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
      body: JSON.stringify({ day, cycles }),
    });
    expect([200, 201]).toContain(logged.status);
  }
});

test('an operator sends a daily check made offline at phone size; the supervisor sees it and a missed day', async () => {
  const phone = await app.signedIn('phone', 'operator@pivotwatch.test');
  await phone.goto(`${app.baseUrl}/daily`);
  // The first sync brings the company's rides and their daily checklists to the phone.
  const start = phone.getByRole('button', { name: 'Start the daily check of Lantern Wheel' });
  await start.waitFor({ timeout: 60_000 });
  await phone.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 60_000 });
  await screenshot(phone, 'daily-checks-phone-rides');

  await phone.context().setOffline(true);
  await phone.getByText('This phone is offline.', { exact: false }).waitFor();
  await start.click();
  const passes = phone.getByRole('radio', { name: /^Pass: / });
  await passes.first().waitFor();
  const n = await passes.count();
  expect(n).toBeGreaterThanOrEqual(5); // the demo's wheel checklist: 3 around the ride + 4 on it
  for (let i = 0; i < n; i++) await passes.nth(i).click();
  await phone.getByRole('textbox', { name: 'm/s', exact: true }).fill('4');
  await phone.getByRole('textbox', { name: 'Empty cycles run' }).fill('2');
  await phone.getByRole('radio', { name: 'Ran as it should' }).click();
  await screenshot(phone, 'daily-checks-phone-filled');
  await phone.getByRole('button', { name: 'Send daily check' }).click();

  const row = phone.getByRole('listitem', { name: /^Lantern Wheel: / });
  await row.waitFor({ timeout: 30_000 });
  expect(await row.getAttribute('aria-label')).toBe('Lantern Wheel: Waiting to send · Passed');
  await screenshot(phone, 'daily-checks-phone-waiting');

  await phone.context().setOffline(false);
  await phone.getByRole('listitem', { name: 'Lantern Wheel: Sent · Passed' }).waitFor({ timeout: 60_000 });
  await screenshot(phone, 'daily-checks-phone-sent');

  // The server has it, as the operator's, today.
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const wheel = rideIds.get('Lantern Wheel') ?? '';
  const checks = await apiGet<RideDailyChecks>(app.baseUrl, `/api/rides/${wheel}/daily-checks`, token);
  expect(checks.todayState).toBe('done');
  expect(checks.checks[0]).toMatchObject({
    day: today,
    result: 'pass',
    testCycles: 2,
    byName: 'Priya Castellan',
  });

  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.goto(`${app.baseUrl}/rides/${wheel}`);
  const done = desk.getByText('Daily check done today');
  await done.waitFor({ timeout: 60_000 });
  await done.scrollIntoViewIfNeeded();
  await desk
    .getByText(`${formatDate(today)} · Passed · 2 test cycles · Priya Castellan`, { exact: false })
    .waitFor();
  await screenshot(desk, 'daily-checks-desk-ride');

  const skylark = rideIds.get('Skylark') ?? '';
  const missed = await apiGet<RideDailyChecks>(app.baseUrl, `/api/rides/${skylark}/daily-checks`, token);
  expect(missed.missedDays).toContain(addDays(today, -2));
  await desk.goto(`${app.baseUrl}/rides/${skylark}`);
  const missedLine = desk.getByText(
    `Ran without a daily check on ${missed.missedDays.map((d) => formatDate(d)).join(', ')}`,
  );
  await missedLine.waitFor({ timeout: 60_000 });
  await missedLine.scrollIntoViewIfNeeded();
  await screenshot(desk, 'daily-checks-desk-missed');
});
