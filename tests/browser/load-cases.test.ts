/**
 * The load check's basis in the real app: on the phone, a swing reading on the demo pendulum (Skylark,
 * whose invented design data marks its swing free and gives service and emergency stops) is analysed as
 * a free swing, its computed period set against the measured one, and the stops shown as load cases; on
 * the review desk, a seeded Skylark inspection says how its load check was made and which case governs.
 */

import {
  addReading,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
  swingAmplitude,
  swingPeriod,
} from '@/tests/support/browser/harness';

// Development mode seeds the demo's submitted inspections for the desk.
const app = serverAndBrowser({ NODE_ENV: 'development' });

test('phone: a free swing with its period compared and the stops as load cases', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 60000 });
  await startPeriodicInspection(page, 'Skylark');

  await page.getByRole('radio', { name: 'Readings' }).click();
  await addReading(page, swingAmplitude('108'));
  // 11.5 s measured; the free swing from 108° takes about 10.3 s.
  await addReading(page, swingPeriod('11.5'));
  // A value far from the design asks for confirmation first.
  const confirm = page.getByRole('button', { name: /^Keep / });
  if (await confirm.count()) await confirm.first().click();

  await page.getByRole('radio', { name: 'Loads' }).click();
  await page.getByText(/instants over/).waitFor({ timeout: 30000 });
  await page.getByText('P1 · Main arm: free swing, from the readings').waitFor();
  await page.getByText('Main arm: differs by more than 5 %').waitFor();
  await page
    .getByText(/Emergency stop/)
    .first()
    .waitFor();
  await page.getByText('P1 · Main arm: free swing, from the readings').scrollIntoViewIfNeeded();
  await screenshot(page, 'phone-inspection-free-swing');
});

test('desk: a seeded Skylark inspection says how its load check was made', async () => {
  for (const size of ['desktop', 'phone'] as const) {
    const desk = await app.signedIn(size, 'supervisor@pivotwatch.test');
    await desk.waitForURL('**/review');
    await desk.goto(`${app.baseUrl}/review?q=Skylark`);
    await desk
      .getByRole('link', { name: /Skylark/ })
      .first()
      .click();
    await desk.waitForURL(/\/review\/[^/?]+$/);
    const basis = desk.getByLabel('How the load check was made');
    await basis.waitFor({ timeout: 30000 });
    await desk
      .getByText(/free swing, from the readings/)
      .first()
      .waitFor();
    await desk
      .getByText(/^Governing case: /)
      .first()
      .waitFor();
    await basis.scrollIntoViewIfNeeded();
    await screenshot(desk, `review-load-check-basis-${size}`);
    await desk.context().close();
  }
});
