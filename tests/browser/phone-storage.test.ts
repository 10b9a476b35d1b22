/**
 * The phone's storage in Chromium against the real server, at 390×844 and 1440×900: the inspector sends an
 * inspection with a photo; Account shows what the phone keeps; "Free space now" keeps it while its
 * decision is awaited; a supervisor approves it, the next sync brings the decision, and the same button
 * then lets it and its photo go — in the browser's own SQLite (wa-sqlite on OPFS), compaction included.
 * The 30-day wait of the pruning after each sync is tested with pinned times in tests/device/prune.test.ts.
 */
import type { Locator, Page } from 'playwright-core';

import {
  apiGet,
  apiToken,
  jpegPhoto,
  screenshot,
  serverAndBrowser,
  signIn,
  startPeriodicInspection,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();

async function sendInspectionWithPhoto(page: Page) {
  const jpeg = await jpegPhoto(app.browser, 'Sweep arm', { background: '#4d5d68', fontPx: 44 });
  await startPeriodicInspection(page, 'Little Kite');
  const na = page.getByRole('radio', { name: /^Not applicable: / });
  await na.first().waitFor();
  const n = await na.count();
  for (let i = 0; i < n; i++) await na.nth(i).click();
  await page.getByRole('radio', { name: 'Photos' }).click();
  const chooser = page.waitForEvent('filechooser');
  await page.getByRole('button', { name: 'Choose from library' }).click();
  await (await chooser).setFiles(jpeg);
  await page.getByText('PHOTO 1 ·').waitFor();
  await page.getByRole('radio', { name: 'Submit' }).click();
  await page.getByRole('checkbox', { name: /make this declaration/ }).click();
  await page.getByRole('button', { name: 'Submit inspection' }).click();
  await page.waitForURL('**/today');
  // "Everything is sent" may still be the line from before the submit: wait for the server instead, until it
  // holds the inspection and its photo (a sync runs at once and every 30 s while something waits).
  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  type Listed = { inspections: { id: string }[] };
  type Detail = { inspection: { photos: { received: boolean }[] } };
  const deadline = Date.now() + 90_000;
  for (;;) {
    const { inspections } = await apiGet<Listed>(app.baseUrl, '/api/inspections?mine=1', token);
    const detail = inspections[0]
      ? await apiGet<Detail>(app.baseUrl, `/api/inspections/${inspections[0].id}`, token)
      : null;
    if (detail?.inspection.photos[0]?.received) break;
    if (Date.now() > deadline) throw new Error('the inspection and its photo never reached the server');
    await page.waitForTimeout(500);
  }
  await page.getByText('Everything is sent').waitFor({ timeout: 60000 });
}

const storageCard = (page: Page) => page.getByLabel('Storage on this phone');

/**
 * Waits until the card's "Not yet sent" and "Sent, kept for reference" rows read these counts. By row, not by
 * text alone: "1 inspection, 1 photo" is also what "Not yet sent" reads before the sync has run.
 */
async function cardReads(card: Locator, want: { notYetSent: string; sent: string }) {
  const row = (label: string, value: string) => new RegExp(`${label}\\s+${value} · `);
  const deadline = Date.now() + 90_000;
  let text = await card.innerText();
  while (!row('Not yet sent', want.notYetSent).test(text) && Date.now() < deadline) {
    await card.page().waitForTimeout(500);
    text = await card.innerText();
  }
  expect(text).toMatch(row('Not yet sent', want.notYetSent));
  expect(text).toMatch(row('Sent, kept for reference', want.sent));
}

test('Account shows what the phone keeps; sent work stays while its decision is awaited and goes once decided', async () => {
  const page = await app.openPage('phone');
  await signIn(page, app.baseUrl, 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 60000 });
  await sendInspectionWithPhoto(page);

  await page.getByRole('link', { name: 'Account' }).click();
  await page.waitForURL('**/account');
  const card = storageCard(page);
  await card.getByText(/ free of /).waitFor({ timeout: 30000 });
  // The record goes first and its photo at the same or the next sync (every 30 s while something waits).
  await cardReads(card, { notYetSent: '0 inspections, 0 photos', sent: '1 inspection, 1 photo' });
  await screenshot(page, 'phone-account-storage');

  // Sent today, no decision yet: nothing may go.
  await card.getByRole('button', { name: 'Free space now' }).click();
  await card.getByText(/^Nothing more can go yet/).waitFor();
  await cardReads(card, { notYetSent: '0 inspections, 0 photos', sent: '1 inspection, 1 photo' });

  // A supervisor approves it; the inspector's next sync brings the decision to the phone.
  const supervisor = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const inspectorToken = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const { inspections } = await apiGet<{ inspections: { id: string }[] }>(
    app.baseUrl,
    '/api/inspections?mine=1',
    inspectorToken,
  );
  expect(inspections).toHaveLength(1);
  const approve = await fetch(`${app.baseUrl}/api/inspections/${inspections[0].id}/decision`, {
    method: 'POST',
    headers: { authorization: `Bearer ${supervisor}`, 'content-type': 'application/json' },
    body: JSON.stringify({ decision: 'approve', note: null }),
  });
  expect(approve.status).toBe(200);
  await page.getByRole('link', { name: 'Today' }).click();
  await page.getByRole('button', { name: /Sync now/ }).click();
  await page
    .getByText(/Approved/)
    .first()
    .waitFor({ timeout: 60000 });

  // Decided now: "Free space now" does not wait out the 30 days (the sync's own pruning would), so the
  // record and its photo go at once, from the browser's own SQLite, and the file is compacted.
  await page.getByRole('link', { name: 'Account' }).click();
  await page.waitForURL('**/account');
  await cardReads(card, { notYetSent: '0 inspections, 0 photos', sent: '1 inspection, 1 photo' });
  await card.getByRole('button', { name: 'Free space now' }).click();
  await card.getByText(/^Removed 1 sent inspection and 1 photo/).waitFor({ timeout: 30000 });
  expect(await card.getByText(/could not be compacted/).count()).toBe(0);
  await card
    .getByText(/^0 inspections, 0 photos · /)
    .nth(1)
    .waitFor();
  await screenshot(page, 'phone-account-storage-freed');

  // The browser was asked to keep the site's storage; whatever it answered, the card says it in words.
  const persisted = await page.evaluate(() => navigator.storage.persisted());
  await card
    .getByText(persisted ? /The browser has agreed to keep this data/ : /The browser may clear this data/)
    .waitFor();
  await page.context().close();
});

test('the storage card at desktop size', async () => {
  const page = await app.signedIn('desktop', 'inspector@pivotwatch.test');
  await page.getByRole('link', { name: 'Account' }).click();
  await page.waitForURL('**/account');
  await storageCard(page)
    .getByText(/ free of /)
    .waitFor({ timeout: 30000 });
  await screenshot(page, 'desktop-account-storage');
  await page.context().close();
});
