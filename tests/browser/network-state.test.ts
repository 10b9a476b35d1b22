/**
 * Real network state in the browser, against the real server and the real web export: the browser
 * context goes offline and back (playwright's `setOffline`, which sets `navigator.onLine` and fires the
 * window's offline/online events as a lost signal would) and, without a reload, the connection banner and
 * the sync panel follow; an inspection submitted with no signal waits and is sent by itself when the
 * connection returns (no tap on "Sync now"), once. At 390×844 and 1440×900.
 *
 * The inspection goes into the phone's outbox through the app's own submit (`saveDraft`, then
 * `submitDraft`, on the diagnostics handle of features/device-db/diagnostics.web.ts) with the record the
 * server's sync tests push (tests/server/sync-fixtures.ts), so this test does not depend on the recording
 * screen's layout. Ride and people are the invented demo data.
 */
import { join } from 'node:path';

import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import type { Page } from 'playwright-core';

import * as schema from '@/db/server/schema';
import type { InspectionRecord } from '@/features/records/schema';

import { demoRide, makeRecord } from '@/tests/server/sync-fixtures';
import {
  type SizeName,
  apiToken,
  screenshot,
  serverAndBrowser,
  signIn,
} from '@/tests/support/browser/harness';

type Diagnostics = {
  saveDraft(input: { id: string; rideId: string; data: unknown }): Promise<void>;
  submitDraft(record: unknown): Promise<unknown>;
};
type WithDiagnostics = { pivotwatchDevice?: Diagnostics };

const BANNER = 'No connection — working from what is saved on this device.';
const app = serverAndBrowser();

/**
 * Chromium's offline emulation fires the window's events, but a document loaded while it is on still
 * reads `navigator.onLine === true` (checked on this machine: false after `setOffline(true)`, true after a
 * reload), where a browser with no network reads false. So a page reloaded "offline" would believe it is
 * online. This makes every document read what the emulation says: offline from its start when the test
 * marked the reload so, then following the window's online/offline events (registered before the app's).
 */
function onLineFollowsEmulation() {
  let online = sessionStorage.getItem('test:starts-offline') !== '1';
  window.addEventListener('online', () => (online = true), { capture: true });
  window.addEventListener('offline', () => (online = false), { capture: true });
  Object.defineProperty(Navigator.prototype, 'onLine', { configurable: true, get: () => online });
}

async function inspectorOnToday(size: SizeName): Promise<Page> {
  const page = await app.openPage(size);
  await page.context().addInitScript(() => window.localStorage.setItem('pivotwatch:diagnostics', '1'));
  await page.context().addInitScript(onLineFollowsEmulation);
  await signIn(page, app.baseUrl, 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  // The first sync has run, and the service worker holds the app (so it reloads offline).
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 60000 });
  await page.waitForFunction(() => (window as WithDiagnostics).pivotwatchDevice !== undefined, null, {
    timeout: 30000,
  });
  return page;
}

/** A record of Twin Comet as the server's sync tests push it, read from the running server's database. */
function recordToSend(): InspectionRecord {
  const sqlite = new Database(join(app.dataDir, 'pivotwatch.db'), { readonly: true });
  try {
    return makeRecord(demoRide(drizzle(sqlite, { schema }), 'Twin Comet'));
  } finally {
    sqlite.close();
  }
}

async function idsOnServer(): Promise<string[]> {
  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const res = await fetch(`${app.baseUrl}/api/inspections?mine=1`, {
    headers: { Authorization: `Bearer ${token}` },
  });
  return ((await res.json()) as { inspections: { id: string }[] }).inspections.map((i) => i.id);
}

test.each<[SizeName]>([['phone'], ['desktop']])(
  '%s: offline and back without a reload; what was submitted offline is sent by itself on reconnect',
  async (size) => {
    const page = await inspectorOnToday(size);
    const banner = page.getByText(BANNER);
    const offlineLine = page.getByText(/^This phone is offline\./);
    const syncNow = page.getByRole('button', { name: /Sync now/ });
    expect(await banner.count()).toBe(0);
    expect(await offlineLine.count()).toBe(0);

    // The signal goes: the banner and the panel say so at once, and Sync now waits for the connection.
    await page.context().setOffline(true);
    await banner.waitFor();
    await page
      .getByText(
        'This phone is offline. Nothing is waiting; what you record is kept here until the connection returns.',
      )
      .waitFor();
    expect(await syncNow.isDisabled()).toBe(true);
    await screenshot(page, `network-${size}-offline`);

    // An inspection submitted with no signal, then the app opened again offline.
    const record = recordToSend();
    await page.evaluate(async (rec) => {
      const device = (window as WithDiagnostics).pivotwatchDevice!;
      await device.saveDraft({ id: rec.id, rideId: rec.rideId, data: { step: 'done' } });
      await device.submitDraft(rec);
    }, record);
    await page.evaluate(() => sessionStorage.setItem('test:starts-offline', '1'));
    await page.reload();
    await page.getByText('1 inspection waiting to send').waitFor({ timeout: 30000 });
    await page
      .getByText(
        'This phone is offline. 1 inspection waits here and will be sent when the connection returns.',
      )
      .waitFor();
    await banner.waitFor();
    expect(await idsOnServer()).not.toContain(record.id);
    await screenshot(page, `network-${size}-offline-waiting`);

    // The signal returns: nobody taps anything. (A document Chromium loaded under its offline emulation
    // believed itself online all along, so it hears no "online" event when the emulation ends; a browser
    // whose network comes back fires it, and so does the test, only when none came.)
    await page.context().setOffline(false);
    await page.evaluate(() => {
      if (!navigator.onLine) window.dispatchEvent(new Event('online'));
    });
    await page
      .getByText('Everything is sent')
      .waitFor({ timeout: 60000 })
      .catch(async (err) => {
        await screenshot(page, `debug-network-${size}-reconnect`);
        throw err;
      });
    await banner.waitFor({ state: 'detached' });
    expect(await offlineLine.count()).toBe(0);
    expect(await syncNow.isDisabled()).toBe(false);
    expect((await idsOnServer()).filter((id) => id === record.id)).toHaveLength(1);
    await screenshot(page, `network-${size}-back-online`);
    await page.context().close();
  },
);
