/**
 * A travelling ride's set-up and the inspector's round, in the browser against the real server and demo
 * data (issue #19). The supervisor at desktop size (1440×900) plans Lantern Wheel's set-up at the shared
 * Brackley Meadow showground for its spring fair, then in the week's planner gives its set-up inspection
 * to the demo inspector and puts Tamsworth Pier first in that day's travel order. The inspector at phone
 * size (390×844) finds it first on Today, with its round day and stop, and the ride planned for the same
 * day at Lowfield Common after it. What the planner saved is read back from the server's own week.
 */
import type { Page } from 'playwright-core';

import type { RoundWeek, Schedule, Setup } from '@/features/registry/schema';
import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();

async function rideId(token: string, name: string) {
  const { rides } = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  const id = rides.find((r) => r.name === name)?.id;
  if (!id) throw new Error(`no demo ride ${name}`);
  return id;
}

async function choose(page: Page, field: RegExp, option: RegExp | string) {
  await page.getByRole('combobox', { name: field }).click();
  await page.getByRole('option', { name: option }).click();
}

test('the supervisor plans a set-up and the round; the inspector’s Today follows it', async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const wheel = await rideId(token, 'Lantern Wheel');
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');

  // The set-up, on the ride's page.
  await desk.goto(`${app.baseUrl}/rides/${wheel}`);
  const card = desk.getByLabel('Set-ups', { exact: true });
  await card.getByRole('button', { name: 'Plan a set-up' }).click();
  await choose(desk, /^Site/, 'Brackley Meadow showground');
  await choose(desk, /^Event/, /^Brackley Meadow spring fair/);
  await card.getByLabel('Pitch or place on the site').fill('Row C, pitch 2');
  await screenshot(desk, 'rounds-setup-form-desktop');
  await card.getByRole('button', { name: 'Plan set-up' }).click();
  await card.getByText('Brackley Meadow showground · Brackley Meadow spring fair').waitFor();
  await card.getByText('Planned', { exact: true }).waitFor();
  const { setups } = await apiGet<{ setups: Setup[] }>(app.baseUrl, `/api/rides/${wheel}/setups`, token);
  expect(setups).toHaveLength(1);
  const day = setups[0].fromDate;
  expect(setups[0]).toMatchObject({ eventName: 'Brackley Meadow spring fair', pitch: 'Row C, pitch 2' });
  await screenshot(desk, 'rounds-setup-planned-desktop');

  // Whirligig Chairs (at Lowfield Common, already the demo inspector's) goes on the same day of the round.
  const whirligig = await rideId(token, 'Whirligig Chairs');
  // Its due day is on Lowfield's clock (Los Angeles), so it may fall in another week: found by its schedule.
  const { schedules } = await apiGet<{ schedules: Schedule[] }>(
    app.baseUrl,
    `/api/schedules?rideId=${whirligig}&inspectionType=setup_after_assembly`,
    token,
  );
  const chairs = schedules[0];
  expect(chairs?.assignedTo?.name).toBe('Tomas Reyne');
  const planned = await fetch(`${app.baseUrl}/api/rounds/items/${chairs?.id}`, {
    method: 'PUT',
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: JSON.stringify({ day, assignedTo: chairs?.assignedTo?.id }),
  });
  expect(planned.status).toBe(204);

  // The planner: assign the set-up inspection, then visit Tamsworth Pier first that day.
  await desk.goto(`${app.baseUrl}/register/rounds?week=${day}`);
  const what = /^Inspector for Lantern Wheel, set-up after assembly/;
  await desk.getByRole('combobox', { name: what }).waitFor({ timeout: 30_000 });
  await choose(desk, what, 'Tomas Reyne');
  await desk.getByRole('combobox', { name: /^Inspector for Lantern Wheel.*Tomas Reyne$/ }).waitFor();
  const earlier = desk.getByRole('button', { name: /^Visit Tamsworth Pier earlier on / });
  await earlier.waitFor();
  await earlier.click();
  await desk
    .getByRole('button', { name: /^Visit Tamsworth Pier earlier on / })
    .and(desk.locator('[aria-disabled="true"]'))
    .waitFor();
  await desk.getByRole('combobox', { name: what }).scrollIntoViewIfNeeded();
  await screenshot(desk, 'rounds-planner-desktop');
  const after = await apiGet<RoundWeek>(app.baseUrl, `/api/rounds?week=${day}`, token);
  const theDay = after.days.find((d) => d.day === day);
  expect(theDay?.sites.map((s) => s.siteName).slice(0, 2)).toEqual([
    'Tamsworth Pier',
    'Lowfield Common fairground',
  ]);
  const wheelItem = theDay?.sites[0].items.find((i) => i.rideName === 'Lantern Wheel');
  expect(wheelItem).toMatchObject({ planned: true, assignedTo: { name: 'Tomas Reyne' } });

  // The planner at phone size still works: one column, the same controls.
  const deskPhone = await app.signedIn('phone', 'supervisor@pivotwatch.test');
  await deskPhone.goto(`${app.baseUrl}/register/rounds?week=${day}`);
  await deskPhone.getByRole('combobox', { name: what }).waitFor({ timeout: 30_000 });
  await screenshot(deskPhone, 'rounds-planner-phone');

  // The inspector's Today, at phone size: the round's first stop first.
  const phone = await app.signedIn('phone', 'inspector@pivotwatch.test');
  const first = phone.getByLabel(/^Ride /).first();
  await phone.getByLabel('Ride Lantern Wheel').waitFor({ timeout: 60_000 });
  await expect(first.getAttribute('aria-label')).resolves.toBe('Ride Lantern Wheel');
  await expect(
    phone
      .getByLabel(/^Ride /)
      .nth(1)
      .getAttribute('aria-label'),
  ).resolves.toBe('Ride Whirligig Chairs');
  await phone
    .getByLabel('Ride Lantern Wheel')
    .getByText(/^Round: .* · stop 1$/)
    .waitFor();
  await phone
    .getByLabel('Ride Whirligig Chairs')
    .getByText(/^Round: .* · stop 2$/)
    .waitFor();
  await screenshot(phone, 'rounds-today-phone');
});
