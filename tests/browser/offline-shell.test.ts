/**
 * The offline app shell and the device database, in the real web export served by the real server and
 * driven through Debian's chromium at phone size:
 *  - after one online visit, the app loads with the network off (and with the server gone), and a draft
 *    kept in the device database (expo-sqlite on OPFS) survives offline reloads;
 *  - a second tab cannot hold the database and says so plainly;
 *  - a new version waits until the inspector chooses to update.
 * The draft is reached through the diagnostics handle the app puts on `window` when
 * localStorage['pivotwatch:diagnostics'] is '1' (features/device-db/diagnostics.web.ts).
 */
import { randomUUID } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

import type { Page } from 'playwright-core';

import { ROOT, screenshot, serverAndBrowser, signIn } from '@/tests/support/browser/harness';

type Diagnostics = {
  saveDraft(input: { id: string; rideId: string; data: unknown }): Promise<void>;
  loadDraft(id: string): Promise<{ id: string; rideId: string; data: unknown } | null>;
  listDrafts(): Promise<{ id: string }[]>;
};
type WithDiagnostics = { pivotwatchDevice?: Diagnostics };

const HOME = /^Good (morning|afternoon|evening), Tomas$/;
const LOCKED = 'Pivotwatch is open in another tab. Close it, then reload this one.';

const app = serverAndBrowser();

async function signedInInspector(): Promise<Page> {
  const page = await app.openPage('phone');
  await page.context().addInitScript(() => window.localStorage.setItem('pivotwatch:diagnostics', '1'));
  await signIn(page, app.baseUrl, 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByRole('heading', { name: HOME }).first().waitFor();
  return page;
}

/** The service worker controls the page: the shell is precached (clientsClaim runs after install). */
async function waitForWorker(page: Page) {
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 60000 });
}

async function waitForDeviceDb(page: Page) {
  await page.waitForFunction(() => (window as WithDiagnostics).pivotwatchDevice !== undefined, null, {
    timeout: 30000,
  });
}

/** The ride cards' texts on Today, in order (each card is labelled "Ride <name>"). */
const rideCards = () =>
  Array.from(document.querySelectorAll('[aria-label^="Ride "]')).map((card) => card.textContent ?? '');

/**
 * Run in the page before its scripts: keeps the ride cards' texts from the first moment any is drawn.
 * A string, so nothing the test's compiler adds to functions is needed in the page.
 */
const RECORD_FIRST_CARDS = `
  new MutationObserver((_, observer) => {
    const cards = [...document.querySelectorAll('[aria-label^="Ride "]')];
    if (cards.length === 0 || !/Start inspection/.test(cards[0].textContent || '')) return;
    window.firstCards = cards.map((card) => card.textContent || '');
    observer.disconnect();
  }).observe(document, { subtree: true, childList: true, characterData: true });
`;

const loadDraft = (page: Page, id: string) =>
  page.evaluate((draftId) => (window as WithDiagnostics).pivotwatchDevice!.loadDraft(draftId), id);

test('the app loads offline after one online visit and keeps a draft across offline reloads', async () => {
  const page = await signedInInspector();
  await waitForWorker(page);
  await waitForDeviceDb(page);
  // The first sync has downloaded the inspector's rides into the device database.
  await page
    .getByText(/Tamsworth Pier/)
    .first()
    .waitFor({ timeout: 30000 });

  const id = randomUUID();
  const data = { note: 'Left pivot pin: light scoring', readings: [{ kind: 'period', valueSI: 6.04 }] };
  await page.evaluate((input) => (window as WithDiagnostics).pivotwatchDevice!.saveDraft(input), {
    id,
    rideId: 'ride-offline-check',
    data,
  });

  await page.context().setOffline(true);
  // What the ride cards say the moment Today first shows them: on a reload that is the glimpse kept from
  // the last visit (features/session/glimpse.ts), drawn while the device database still opens.
  await page.addInitScript(RECORD_FIRST_CARDS);
  await page.reload();
  await page.getByRole('heading', { name: HOME }).first().waitFor();
  await waitForDeviceDb(page);
  expect(await loadDraft(page, id)).toMatchObject({ id, rideId: 'ride-offline-check', data });
  // The rides came from the device database, not the network.
  await page
    .getByText(/Tamsworth Pier/)
    .first()
    .waitFor();
  // Once the database has answered, the cards say what they said from the glimpse.
  await page.waitForTimeout(500);
  const first = await page.evaluate(() => (window as { firstCards?: string[] }).firstCards);
  expect(first?.length).toBeGreaterThan(0);
  expect(await page.evaluate(rideCards)).toEqual(first);
  await screenshot(page, 'phone-offline-today');

  // Changed offline, reloaded offline: the change is there.
  const changed = { ...data, note: 'Left pivot pin: scoring, photographed' };
  await page.evaluate((input) => (window as WithDiagnostics).pivotwatchDevice!.saveDraft(input), {
    id,
    rideId: 'ride-offline-check',
    data: changed,
  });
  await page.reload();
  await waitForDeviceDb(page);
  expect((await loadDraft(page, id))?.data).toEqual(changed);

  // Not just "offline" in the browser: with the server gone altogether, the shell still starts.
  await app.stop();
  await page.context().setOffline(false);
  await page.reload();
  await page.getByRole('heading', { name: HOME }).first().waitFor();
  await waitForDeviceDb(page);
  expect((await loadDraft(page, id))?.data).toEqual(changed);
  await page.context().close();
  // Later tests need a server again.
  await app.restart();
});

test('a second tab is told plainly that the app is open in another one', async () => {
  const first = await signedInInspector();
  await waitForDeviceDb(first);
  const second = await first.context().newPage();
  await second.goto(`${app.baseUrl}/today`);
  await second.getByText(LOCKED).waitFor({ timeout: 30000 });
  await screenshot(second, 'phone-second-tab');
  // The first tab is unaffected.
  expect(
    Array.isArray(await first.evaluate(() => (window as WithDiagnostics).pivotwatchDevice!.listDrafts())),
  ).toBe(true);

  // Once the first tab is closed, a reload of the second one gets the database.
  await first.close();
  for (let i = 0; i < 10; i++) {
    await second.reload();
    // Today may show from the glimpse before the database answers: opened means the database did.
    const opened = await second
      .waitForFunction(() => (window as WithDiagnostics).pivotwatchDevice !== undefined, null, {
        timeout: 5000,
      })
      .then(() => true)
      .catch(() => false);
    if (opened) break;
  }
  await second.getByRole('heading', { name: HOME }).first().waitFor();
  await waitForDeviceDb(second);
  await second.context().close();
});

test('a new version installs in the background and waits for "Update now"', async () => {
  const page = await signedInInspector();
  await waitForWorker(page);
  const swPath = join(ROOT, 'dist', 'sw.js');
  const original = readFileSync(swPath, 'utf8');
  try {
    // A new build: any byte of sw.js changed is a new version to the browser.
    writeFileSync(swPath, `${original}\n// next build ${Date.now()}\n`);
    await page.evaluate(async () => {
      const reg = await navigator.serviceWorker.getRegistration();
      await reg?.update();
    });
    const prompt = page.getByText('A new version of Pivotwatch is ready. Your drafts are saved.');
    await prompt.waitFor({ timeout: 30000 });
    // It waits: the page is still controlled by the old worker until the inspector chooses.
    expect(
      await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.waiting != null),
    ).toBe(true);
    await screenshot(page, 'phone-update-ready');
    await Promise.all([page.waitForEvent('load'), page.getByRole('button', { name: 'Update now' }).click()]);
    await page.getByRole('heading', { name: HOME }).first().waitFor();
    expect(
      await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.waiting ?? null),
    ).toBe(null);
    expect(await prompt.count()).toBe(0);
  } finally {
    writeFileSync(swPath, original);
  }
  await page.context().close();
});
