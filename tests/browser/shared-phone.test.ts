/**
 * One phone, two inspectors, at phone size (390×844), against the real server and the real web export,
 * in ONE browser context (the same OPFS database and local storage, as on a shared phone): Tomas records
 * offline (a submitted inspection with a photo, and one still being recorded), signs out and is warned
 * what is not yet sent; Lena signs in and sees none of it, and her phone's syncs send none of it; Lena
 * signs out (her session ends on the server at once); Tomas signs in online again, finds his draft, and his
 * inspection reaches the server once, under his name only (checked through the API as the supervisor).
 */
import type { Page } from 'playwright-core';

import {
  DEMO_PASSWORD,
  apiGet,
  apiToken,
  jpegPhoto,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();
const TOMAS = 'inspector@pivotwatch.test';
const LENA = 'inspector2@pivotwatch.test';

type Listed = { id: string; inspectorId: string };
const inspectionsSeenBy = async (email: string, query = '') =>
  (
    await apiGet<{ inspections: Listed[] }>(
      app.baseUrl,
      `/api/inspections${query}`,
      await apiToken(app.baseUrl, email),
    )
  ).inspections;
const userIdOf = async (email: string) =>
  (await apiGet<{ user: { id: string } }>(app.baseUrl, '/api/me', await apiToken(app.baseUrl, email))).user
    .id;

/** Signs in through the form on the page already open (the same phone), and waits for Today's first sync. */
async function signInHere(page: Page, email: string) {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/today', { timeout: 30_000 });
}

async function openAccount(page: Page) {
  await page.getByRole('link', { name: 'Account' }).first().click();
  await page.waitForURL('**/account');
}

test('a shared phone never mixes two inspectors’ work', async () => {
  const page = await app.signedIn('phone', TOMAS);
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30_000 });
  await page.getByLabel('Ride Little Kite').waitFor({ timeout: 30_000 });
  const photo = await jpegPhoto(app.browser, 'Hanger', {
    background: '#5d6d78',
    fontPx: 48,
    name: 'hanger.jpg',
  });

  // Tomas, with no signal: one inspection submitted (nothing applies today, one photo)… Only once the
  // service worker holds the page are all the app's screens on the phone (its precache fills on install):
  // before that, a screen not opened yet could not load offline.
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 60_000 });
  await page.context().setOffline(true);
  await startPeriodicInspection(page, 'Little Kite');
  const na = page.getByRole('radio', { name: /^Not applicable: / });
  await na.first().waitFor();
  const n = await na.count();
  for (let i = 0; i < n; i++) await na.nth(i).click();
  await page.getByRole('radio', { name: 'Photos' }).click();
  const chooser = page.waitForEvent('filechooser');
  await page.getByRole('button', { name: 'Choose from library' }).click();
  await (await chooser).setFiles(photo);
  await page.getByText('PHOTO 1 ·').waitFor();
  await page.getByRole('radio', { name: 'Submit' }).click();
  await page.getByText('Ready to submit').waitFor();
  await page.getByRole('checkbox', { name: /make this declaration/ }).click();
  await page.getByRole('button', { name: 'Submit inspection' }).click();
  await page.waitForURL('**/today');
  await page.getByText('1 inspection waiting to send').waitFor();

  // …and one still being recorded.
  await startPeriodicInspection(page, 'Little Kite');
  await page
    .getByRole('radio', { name: /^Not applicable: / })
    .first()
    .click();
  await page.getByText('Saved on this phone').waitFor();
  await page.getByRole('link', { name: 'Today' }).first().click();
  await page.waitForURL('**/today');
  await page.getByRole('button', { name: 'Resume' }).waitFor();

  // Signing out warns what is not yet on the server; offline there is no "Send now".
  await openAccount(page);
  await page.getByRole('button', { name: 'Sign out' }).click();
  const warning = page.getByTestId('sign-out-warning');
  await warning.waitFor();
  await warning.getByText('1 inspection being recorded (not yet submitted)').waitFor();
  await warning.getByText('1 submitted inspection not yet sent').waitFor();
  await warning.getByText('1 photo not yet uploaded').waitFor();
  await warning.getByText(/No connection/).waitFor();
  expect(await page.getByRole('button', { name: 'Send now' }).count()).toBe(0);
  await screenshot(page, 'phone-sign-out-warning');
  await page.getByRole('button', { name: 'Sign out and keep it for me here' }).click();
  await page.waitForURL('**/sign-in**');

  // Lena on the same phone, online: none of Tomas's work, though the rides are there for her.
  await page.context().setOffline(false);
  await signInHere(page, LENA);
  await page.getByLabel('Ride Little Kite').waitFor({ timeout: 30_000 });
  await page.getByText('Everything is sent').waitFor({ timeout: 30_000 });
  expect(await page.getByRole('button', { name: 'Resume' }).count()).toBe(0);
  expect(await page.getByText(/waiting to send/i).count()).toBe(0);
  expect(await page.getByText(/^SENT \(/).count()).toBe(0);
  await screenshot(page, 'phone-today-second-inspector');
  // Her syncs sent nothing of his: the server has no inspection at all.
  expect(await inspectionsSeenBy('supervisor@pivotwatch.test')).toEqual([]);

  // Lena signs out with nothing unsent: no warning, and her token stops working at once.
  const lenaToken = await page.evaluate(
    () => (JSON.parse(localStorage.getItem('pivotwatch.session') ?? '{}') as { token?: string }).token,
  );
  expect(lenaToken).toBeTruthy();
  await openAccount(page);
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL('**/sign-in**');
  const me = await fetch(`${app.baseUrl}/api/me`, { headers: { authorization: `Bearer ${lenaToken}` } });
  expect(me.status).toBe(401);

  // Tomas again: his draft is back, and his inspection goes out under his name.
  await signInHere(page, TOMAS);
  await page.getByRole('button', { name: 'Resume' }).waitFor({ timeout: 30_000 });
  await page.getByText('Everything is sent').waitFor({ timeout: 60_000 });
  await screenshot(page, 'phone-today-first-inspector-back');

  const tomasId = await userIdOf(TOMAS);
  let all: Listed[] = [];
  for (let i = 0; i < 50 && all.length === 0; i++) {
    all = await inspectionsSeenBy('supervisor@pivotwatch.test');
    if (all.length === 0) await new Promise((r) => setTimeout(r, 200));
  }
  expect(all).toHaveLength(1);
  expect(all[0].inspectorId).toBe(tomasId);
  expect(await inspectionsSeenBy(LENA, '?mine=1')).toEqual([]);
  type Detail = { inspectorId: string; photos: { received: boolean }[] };
  const { inspection } = await apiGet<{ inspection: Detail }>(
    app.baseUrl,
    `/api/inspections/${all[0].id}`,
    await apiToken(app.baseUrl, 'supervisor@pivotwatch.test'),
  );
  expect(inspection.inspectorId).toBe(tomasId);
  expect(inspection.photos).toHaveLength(1);
  expect(inspection.photos[0].received).toBe(true);
  await page.context().close();
});

test('the Account page: password and phone storage beside who you are, at 1440 and 390', async () => {
  const desk = await app.signedIn('desktop', 'inspector@pivotwatch.test');
  await desk.goto(`${app.baseUrl}/account`);
  await desk.getByLabel('Storage on this phone').waitFor({ timeout: 30_000 });
  await desk.getByText(/Changing it signs you out on every/).waitFor();
  await desk.getByRole('button', { name: 'Sign out' }).waitFor();
  await screenshot(desk, 'desktop-account-inspector');
  await desk.context().close();

  const phone = await app.signedIn('phone', 'supervisor@pivotwatch.test');
  await phone.goto(`${app.baseUrl}/account`);
  await phone.getByText(/Changing it signs you out on every/).waitFor({ timeout: 30_000 });
  // A desk role keeps nothing on the phone: no storage card.
  expect(await phone.getByLabel('Storage on this phone').count()).toBe(0);
  await screenshot(phone, 'phone-account-supervisor');
  await phone.context().close();
});
