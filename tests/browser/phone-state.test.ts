/**
 * What the inspector's phone says about itself, in Chromium at 390×844 against the real server: the
 * "No connection" banner comes and goes with the network (no reload), an inspection submitted offline is
 * listed under "Waiting to send" and never under "Sent" until the server has it, and the photos waiting
 * are counted per photo attached — here the same picture attached twice, which the phone stores once.
 */
import type { Page } from 'playwright-core';

import {
  apiGet,
  apiToken,
  jpegPhoto,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();

const banner = (page: Page) => page.getByText(/^No connection — working/);

test('the banner follows the network; a waiting inspection is not listed as sent; photos count as attached', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await page.getByLabel('Ride Little Kite').waitFor({ timeout: 30000 });
  expect(await banner(page).count()).toBe(0);
  const jpeg = await jpegPhoto(app.browser, 'Hanger', {
    background: '#5d6d78',
    fontPx: 48,
    name: 'hanger.jpg',
  });

  // The network goes: the banner comes, though the session was loaded online (before: it did not).
  await page.context().setOffline(true);
  await banner(page).waitFor({ timeout: 5000 });
  await screenshot(page, 'phone-today-offline-banner');

  await startPeriodicInspection(page, 'Little Kite');

  // Nothing on the checklist applies today (so this test depends on no checklist rule), and one picture
  // is attached twice from the library.
  const na = page.getByRole('radio', { name: /^Not applicable: / });
  await na.first().waitFor();
  const n = await na.count();
  for (let i = 0; i < n; i++) await na.nth(i).click();
  await page.getByRole('radio', { name: 'Photos' }).click();
  for (let i = 1; i <= 2; i++) {
    const chooser = page.waitForEvent('filechooser');
    await page.getByRole('button', { name: 'Choose from library' }).click();
    await (await chooser).setFiles(jpeg);
    await page.getByText(`PHOTO ${i} ·`).waitFor();
  }
  await page.getByText(`${n}/${n} answered · 0 failed · 0 readings · 2 photos`).waitFor();

  await page.getByRole('radio', { name: 'Submit' }).click();
  await page.getByText('Ready to submit').waitFor();
  await page.getByRole('checkbox', { name: /make this declaration/ }).click();
  await page.getByRole('button', { name: 'Submit inspection' }).click();
  await page.waitForURL('**/today');

  // On the phone still: waiting, with both attached photos counted, and no "Sent" list holding it.
  await page.getByText('1 inspection waiting to send').waitFor();
  await page.getByText(/^2 photos waiting/).waitFor();
  await page.getByText('WAITING TO SEND (1)').waitFor();
  expect(await page.getByText(/^SENT \(/).count()).toBe(0);
  await screenshot(page, 'phone-today-waiting-to-send');

  // The network is back: the banner goes at once, with no reload and before any sync.
  await page.context().setOffline(false);
  await banner(page).waitFor({ state: 'detached', timeout: 5000 });

  await page.getByRole('button', { name: /Sync now/ }).click();
  await page.getByText('Everything is sent').waitFor({ timeout: 60000 });
  await page.getByText('SENT (1)').waitFor({ timeout: 10000 });
  expect(await page.getByText(/^WAITING TO SEND/).count()).toBe(0);
  await page.getByText(/^0 photos waiting/).waitFor();
  await screenshot(page, 'phone-today-sent');

  // The server has one inspection with both photo attachments, their (shared) bytes received.
  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const { inspections } = await apiGet<{ inspections: { id: string }[] }>(
    app.baseUrl,
    '/api/inspections?mine=1',
    token,
  );
  expect(inspections).toHaveLength(1);
  type Detail = { photos: { sha256: string; received: boolean }[] };
  const { inspection } = await apiGet<{ inspection: Detail }>(
    app.baseUrl,
    `/api/inspections/${inspections[0].id}`,
    token,
  );
  expect(inspection.photos).toHaveLength(2);
  expect(inspection.photos[0].sha256).toBe(inspection.photos[1].sha256);
  expect(inspection.photos.every((p) => p.received)).toBe(true);
  await page.context().close();
});
