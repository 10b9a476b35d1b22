/**
 * The inspector's whole day with no signal, at phone size (390×844), against the real server and the
 * real web export: sign in online and download the round, go offline, reload, record a complete
 * inspection with two photos, reload offline and find it intact, go online, sync, and check through the
 * API that exactly one inspection with both photos and a server-side analysis exists.
 */
import type { Page } from 'playwright-core';

import {
  addReading,
  apiToken,
  jpegPhoto,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
  swingAmplitude,
  swingPeriod,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();
/** The "camera" photos: chromium renders each one's words. */
const look = { background: '#6b7b86', fontPx: 48 };

async function takePhotoFor(page: Page, itemText: string, file: string) {
  const chooser = page.waitForEvent('filechooser');
  await page.getByRole('button', { name: `Photo for ${itemText}` }).click();
  await (await chooser).setFiles(file);
  await page
    .getByText(/Add another photo \(1\)/)
    .first()
    .waitFor();
}

test('an inspection recorded offline arrives once, with its photos and a server analysis', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  // The first sync downloads rides, design data, templates and assignments.
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await page.getByLabel('Ride Little Kite').waitFor({ timeout: 30000 });
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 60000 });

  await page.context().setOffline(true);
  await page.reload();
  await page.getByLabel('Ride Little Kite').waitFor({ timeout: 30000 });

  // Start on Little Kite (a one-body pendulum swing), choosing the type.
  await startPeriodicInspection(page, 'Little Kite');
  const inspectionUrl = page.url();

  // Checklist: everything passes; measured values where the template asks; photos on two of the
  // photo-required items, the third not applicable today.
  const photoButtons = page.getByRole('button', { name: /^Photo for / });
  await photoButtons.first().waitFor();
  const photoItems = (await photoButtons.allTextContents()).length;
  expect(photoItems).toBeGreaterThanOrEqual(3);
  const labels = await photoButtons.evaluateAll((els) => els.map((e) => e.getAttribute('aria-label') ?? ''));
  const passes = page.getByRole('radio', { name: /^Pass: / });
  const n = await passes.count();
  for (let i = 0; i < n; i++) await passes.nth(i).click();
  const naItem = labels[2].replace('Photo for ', '');
  await page.getByRole('radio', { name: `Pass: ${naItem}` }).click(); // un-pass
  await page.getByRole('radio', { name: `Not applicable: ${naItem}` }).click();
  const values = page.locator('input[aria-label]:not([aria-label="Note"]):not([aria-label="What is wrong"])');
  const v = await values.count();
  for (let i = 0; i < v; i++) await values.nth(i).fill('1.5');
  // A typed value over its checklist limit stays passed only with the inspector's reason.
  const reasons = page.getByRole('textbox', { name: 'Reason for passing a value over its limit' });
  const r = await reasons.count();
  for (let i = 0; i < r; i++) await reasons.nth(i).fill('Test value for the offline round');
  // Pin and clearance values are also their pivot's readings: say how each was measured.
  for (const method of ['Micrometer', 'Dial indicator']) {
    const chips = page.getByRole('radio', { name: method, exact: true });
    const c = await chips.count();
    for (let i = 0; i < c; i++) await chips.nth(i).click();
  }
  const none = page.getByRole('radio', { name: 'None from the register' });
  for (let guard = 0; guard < 10 && (await none.count()) > 0; guard++) await none.first().click();
  const progress =
    (await page
      .getByText(/ readings · /)
      .first()
      .textContent()) ?? '';
  const fromChecklist = Number(/(\d+) readings/.exec(progress)?.[1] ?? 'NaN');
  expect(fromChecklist).toBeGreaterThanOrEqual(1);
  await takePhotoFor(
    page,
    labels[0].replace('Photo for ', ''),
    await jpegPhoto(app.browser, 'Main pivot, left lug', look),
  );
  await takePhotoFor(
    page,
    labels[1].replace('Photo for ', ''),
    await jpegPhoto(app.browser, 'Bushing, witness marks', look),
  );

  // A measured swing: amplitude and period for the pivot.
  await page.getByRole('radio', { name: 'Readings' }).click();
  // Nothing is chosen for the inspector: the method, then the instrument from the register.
  await addReading(page, swingAmplitude('70'));
  await addReading(page, swingPeriod('6.4'));
  await page.getByText(`${fromChecklist + 2} readings · 2 photos`).waitFor();

  // Reload with no network: the draft is all there.
  await page.getByText('Saved on this phone').waitFor();
  await page.reload();
  await page
    .getByText(`${n}/${n} answered · 0 failed · ${fromChecklist + 2} readings · 2 photos`)
    .waitFor({ timeout: 30000 });
  expect(page.url()).toBe(inspectionUrl);

  await page.getByRole('radio', { name: 'Loads' }).click();
  await page.getByText(/instants over/).waitFor();
  await screenshot(page, 'phone-inspection-loads-offline');

  await page.getByRole('radio', { name: 'Submit' }).click();
  await page.getByText('Ready to submit').waitFor();
  await page.getByRole('checkbox', { name: /make this declaration/ }).click();
  await page.getByRole('button', { name: 'Submit inspection' }).click();
  await page.waitForURL('**/today').catch(async (err) => {
    await screenshot(page, 'debug-submit');
    throw err;
  });
  await page.getByText('1 inspection waiting to send').waitFor();
  await screenshot(page, 'phone-today-waiting-offline');

  // Back online: the background sync sends it (or the inspector asks).
  await page.context().setOffline(false);
  await page.getByRole('button', { name: /Sync now/ }).click();
  await page
    .getByText('Everything is sent')
    .waitFor({ timeout: 60000 })
    .catch(async (err) => {
      // A refused record shows its reasons on Today.
      await page.screenshot({ path: 'artifacts/screenshots/debug-sync.png', fullPage: true });
      throw err;
    });
  await screenshot(page, 'phone-today-synced');

  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const list = (await (
    await fetch(`${app.baseUrl}/api/inspections?mine=1`, { headers: { Authorization: `Bearer ${token}` } })
  ).json()) as { inspections: { id: string }[] };
  expect(list.inspections).toHaveLength(1);
  const id = list.inspections[0].id;
  // The server analyses right after receipt; give it a moment.
  type Detail = { rideId: string; photos: { sha256: string; received: boolean }[]; analysis: unknown };
  let detail = null as Detail | null;
  for (let i = 0; i < 50; i++) {
    const res = await fetch(`${app.baseUrl}/api/inspections/${id}`, {
      headers: { Authorization: `Bearer ${token}` },
    });
    detail = ((await res.json()) as { inspection: Detail }).inspection;
    if (detail?.analysis && detail.photos.every((p) => p.received)) break;
    await new Promise((r) => setTimeout(r, 200));
  }
  expect(detail?.analysis).toBeTruthy();
  expect(detail?.photos).toHaveLength(2);
  for (const p of detail!.photos) {
    const res = await fetch(`${app.baseUrl}/api/photos/${p.sha256}`, {
      headers: { Authorization: `Bearer ${token}` },
    });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('image/jpeg');
  }

  // Signed on this browser as it entered the outbox (offline: the key was made then), the key registered
  // at the sync: the phone's one key is listed for the inspector, and the ride's record chain, checked by a
  // supervisor, is intact and names the inspector as the signer of this inspection's entry.
  const keys = (await (
    await fetch(`${app.baseUrl}/api/devices/keys`, { headers: { Authorization: `Bearer ${token}` } })
  ).json()) as { keyId: string; label: string | null; revokedAt: string | null }[];
  expect(keys).toHaveLength(1);
  expect(keys[0]).toMatchObject({ revokedAt: null, label: expect.stringMatching(/Chromium/) });
  const rideId = detail!.rideId;
  const supervisor = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const chain = (await (
    await fetch(`${app.baseUrl}/api/rides/${rideId}/chain/verify`, {
      headers: { Authorization: `Bearer ${supervisor}` },
    })
  ).json()) as { intact: boolean; signers: { keyId: string; personName: string; records: number }[] };
  expect(chain.intact).toBe(true);
  expect(chain.signers).toContainEqual(expect.objectContaining({ keyId: keys[0].keyId, records: 1 }));
  await page.context().close();
});
