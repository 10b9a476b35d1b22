/**
 * The desk's controls in chromium against the real server and web export: a supervisor on the review
 * queue chooses a "From" date in the browser's own date input and a site by typing into the select and
 * pressing Enter (the keyboard of the WAI-ARIA APG combobox pattern), both reaching the URL; then opens
 * a photo full size, whose backdrop is opaque, and closes it with Escape. Screenshots at 1440×900.
 */
import type { Page } from 'playwright-core';

import { screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

// Development mode seeds the demo scenario's submitted inspections (the photo is on one of them).
const app = serverAndBrowser({ NODE_ENV: 'development' });

async function openFilters(page: Page) {
  await page.getByLabel('Search the queue').waitFor({ timeout: 30_000 });
  const from = page.getByLabel('From', { exact: true });
  if (!(await from.isVisible())) await page.getByRole('button', { name: /^Filters/ }).click();
  await from.waitFor();
  return from;
}

test('a date from the date input and a site by type-ahead reach the queue; the photo viewer is opaque', async () => {
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');

  // The real <input type="date">: what it holds is the HTML "valid date string" YYYY-MM-DD.
  const from = await openFilters(desk);
  expect(await from.getAttribute('type')).toBe('date');
  await from.fill('2026-05-01');
  await desk.waitForURL(/from=2026-05-01/);
  expect(await from.inputValue()).toBe('2026-05-01');

  // The site select: focus, type part of the name, Enter chooses the first match.
  const site = desk.getByRole('combobox', { name: 'Site: All sites' });
  await site.focus();
  await desk.keyboard.type('Tamsworth');
  await desk
    .getByRole('option', { name: /^Tamsworth Pier/ })
    .first()
    .waitFor();
  await screenshot(desk, 'desk-controls-select-desktop');
  await desk.keyboard.press('Enter');
  await desk.waitForURL(/siteId=/);
  await desk.getByRole('combobox', { name: 'Site: Tamsworth Pier' }).waitFor();
  // Enter handed focus back to the field, so the keyboard user carries on from there.
  expect(await desk.evaluate(() => document.activeElement?.getAttribute('role'))).toBe('combobox');
  await screenshot(desk, 'desk-controls-filters-desktop');

  // A photo at full size: nothing of the page shows through, and Escape closes it.
  await desk.goto(`${app.baseUrl}/review?urgency=over`);
  await desk
    .getByRole('link', { name: /Tidebreaker/ })
    .first()
    .click();
  await desk
    .getByRole('button', { name: /^Open photo/ })
    .first()
    .click();
  const dialog = desk.getByRole('dialog', { name: 'Photo, full size' });
  await dialog.waitFor();
  const alpha = await dialog.evaluate((el) => {
    const rgba = getComputedStyle(el).backgroundColor.match(/[\d.]+/g) ?? [];
    return rgba.length === 4 ? Number(rgba[3]) : 1;
  });
  expect(alpha).toBe(1);
  await screenshot(desk, 'desk-controls-photo-desktop');
  // The web Modal listens for Escape once its fade-in has ended; it then names its own layer a dialog too.
  await desk.getByRole('dialog').filter({ has: dialog }).waitFor();
  await desk.keyboard.press('Escape');
  await dialog.waitFor({ state: 'detached' });
});
