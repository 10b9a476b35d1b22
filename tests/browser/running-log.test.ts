/**
 * The running log feeds the pivots' life, in the browser against the real server and demo data: the
 * operator of Tamsworth Pier Leisure opens Twin Comet at phone size (390×844), follows the ride page's link
 * to the running log and logs a day's ride cycles; the supervisor then opens the ride at desktop size
 * (1440×900) and sees each pivot's life used, its projected limit date and the log behind it. The life the
 * page shows is the server's (`GET /api/rides/:id/life`), read back here. Screens at both sizes.
 */
import { rideCyclesOfDay } from '@/features/pivot-life/life-math';
import type { RunningLogResponse } from '@/features/pivot-life/running-log-schema';
import type { RideLife } from '@/features/pivot-life/schema';
import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
let rideId = '';

beforeAll(async () => {
  const token = await apiToken(app.baseUrl, 'operator@pivotwatch.test');
  const { rides } = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  rideId = rides.find((r) => r.name === 'Twin Comet')?.id ?? '';
  expect(rideId).not.toBe('');
});

test('an operator logs a day at phone size; the supervisor sees the life it feeds at desktop size', async () => {
  const phone = await app.signedIn('phone', 'operator@pivotwatch.test');
  await phone.goto(`${app.baseUrl}/rides/${rideId}`);
  await phone
    .getByLabel('Pivot life', { exact: true })
    .getByText(/Running log: /)
    .waitFor({ timeout: 60_000 });
  await screenshot(phone, 'running-log-operator-ride-phone');
  await phone.getByRole('link', { name: /Running log/ }).click();

  const form = phone.getByLabel('Log a day', { exact: true });
  await form.waitFor();
  // The demo ride has a log already: what the day said before is replaced, the rest stays.
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const logUrl = `/api/rides/${rideId}/running-log`;
  const day = await form.getByRole('textbox', { name: 'Day', exact: true }).inputValue();
  const before = await apiGet<RideLife>(app.baseUrl, `/api/rides/${rideId}/life`, token);
  const old = (await apiGet<RunningLogResponse>(app.baseUrl, logUrl, token)).entries.find(
    (e) => e.day === day,
  );
  const oldCycles = old ? (rideCyclesOfDay(old, before.basis.rideCycleS) ?? 0) : 0;
  await form.getByLabel('Ride cycles run').fill('240');
  await form.getByLabel('Note (optional)').fill('Bank holiday, full programme');
  await screenshot(phone, 'running-log-phone-form');
  // The save button sits under the thumb and is a full touch target.
  const save = form.getByRole('button', { name: 'Save day' });
  const box = await save.boundingBox();
  expect(box && box.height).toBeGreaterThanOrEqual(44);
  await save.click();
  await form.getByText(/Saved .*: 240 cycles\./).waitFor();
  const log = phone.getByLabel('The log', { exact: true });
  await log.getByText('Bank holiday, full programme · Priya Castellan').waitFor();
  await screenshot(phone, 'running-log-phone-saved');

  const life = await apiGet<RideLife>(app.baseUrl, `/api/rides/${rideId}/life`, token);
  expect(life.log.entries).toBe(before.log.entries + (old ? 0 : 1));
  expect(life.log.cyclesLogged).toBeCloseTo(before.log.cyclesLogged - oldCycles + 240, 6);
  const details = life.pivots.flatMap((p) => p.details);
  expect(details.length).toBeGreaterThan(0);
  // Miner's sum is linear: damage = ride cycles logged × damage per ride cycle (EN 1993-1-9).
  for (const d of details) expect(d.damage).toBeCloseTo(life.log.cyclesLogged * d.damagePerRideCycle, 12);

  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.goto(`${app.baseUrl}/rides/${rideId}`);
  const card = desk.getByLabel('Pivot life', { exact: true });
  await card.getByText(new RegExp(`Running log: ${life.log.entries} days`)).waitFor();
  for (const d of details) await card.getByLabel(`Fatigue detail ${d.name}`).first().waitFor();
  await card.getByText(/ASTM E1049-85/).waitFor();
  await card.getByText(/SAFETY CAUTION/).waitFor();
  await card.scrollIntoViewIfNeeded();
  await screenshot(desk, 'running-log-supervisor-ride-desktop');

  const deskPhone = await app.signedIn('phone', 'supervisor@pivotwatch.test');
  await deskPhone.goto(`${app.baseUrl}/rides/${rideId}`);
  await deskPhone
    .getByLabel('Pivot life', { exact: true })
    .getByText(/Running log: /)
    .waitFor();
  await deskPhone.getByLabel('Pivot life', { exact: true }).scrollIntoViewIfNeeded();
  await screenshot(deskPhone, 'running-log-supervisor-ride-phone');

  const logDesk = await app.signedIn('desktop', 'operator@pivotwatch.test');
  await logDesk.goto(`${app.baseUrl}/rides/${rideId}/log`);
  await logDesk
    .getByLabel('The log', { exact: true })
    .getByText(/240 cycles/)
    .waitFor();
  await screenshot(logDesk, 'running-log-desktop');
});

test('a notice carries the ride’s life as issued, read by the operator at both sizes', async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  // A change of status issues a notice; its frozen document carries the life.
  const res = await fetch(`${app.baseUrl}/api/rides/${rideId}/status`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: JSON.stringify({
      status: 'restricted',
      reason: 'Hub weld toe to be checked by MT before full programme',
    }),
  });
  expect(res.status).toBe(200);
  const { notice } = (await res.json()) as { notice: { id: string } };
  for (const size of ['phone', 'desktop'] as const) {
    const page = await app.signedIn(size, 'operator@pivotwatch.test');
    await page.goto(`${app.baseUrl}/notices/${notice.id}`);
    // On a phone the document's results and life are folded below what the notice asks: open them.
    if (size === 'phone') {
      await page
        .getByRole('button')
        .filter({ hasText: /Show the full results/ })
        .click({ timeout: 60_000 });
    }
    const life = page.getByText(/^PIVOT LIFE AS OF /);
    await life.waitFor({ timeout: 60_000 });
    await life.scrollIntoViewIfNeeded();
    await screenshot(page, `pivot-life-notice-${size}`);
  }
});
