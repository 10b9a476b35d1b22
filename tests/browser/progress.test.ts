/**
 * The sync panel's progress bars during a real sync, at 390×844: three inspections, four photos of
 * 250 kB, the real server and the real web export. The requests are held back a little in the browser
 * (playwright's `page.route`, so each push and each photo takes long enough to be seen) but go through
 * to the server unchanged. Checked as assistive technology reads the bars (WAI-ARIA 1.2 `progressbar`:
 * aria-valuenow within aria-valuemin..aria-valuemax, a name, aria-valuetext in words): the send step's
 * bar counts inspections of those waiting; the photos' bar is determinate (bytes of the whole) and
 * rises; the run ends with every record and photo on the server (read back through the API) and no bar.
 *
 * The inspections go into the outbox through the app's own submit on the diagnostics handle
 * (features/device-db/diagnostics.web.ts), as in network-state.test.ts. Rides and people are the
 * invented demo data.
 */
import { join } from 'node:path';

import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import type { Page } from 'playwright-core';

import * as schema from '@/db/server/schema';
import type { InspectionRecord } from '@/features/records/schema';

import { demoRide, imageBytes, makeRecord, photoRefFor } from '@/tests/server/sync-fixtures';
import { apiToken, screenshot, serverAndBrowser, signIn } from '@/tests/support/browser/harness';

type Diagnostics = {
  saveDraft(input: { id: string; rideId: string; data: unknown }): Promise<void>;
  submitDraft(record: unknown): Promise<unknown>;
  putPhotoBlob(input: { base64: string; mime: 'image/jpeg' }): Promise<{ sha256: string }>;
};
type WithDiagnostics = { pivotwatchDevice?: Diagnostics };

const app = serverAndBrowser();
const PHOTO_BYTES = 250_000;

/** Three inspections of Twin Comet; the first carries two photos, the others one each. */
function recordsToSend(): { records: InspectionRecord[]; photos: Uint8Array[] } {
  const sqlite = new Database(join(app.dataDir, 'pivotwatch.db'), { readonly: true });
  try {
    const ride = demoRide(drizzle(sqlite, { schema }), 'Twin Comet');
    const photos = [1, 2, 3, 4].map((seed) => imageBytes(seed, 'jpeg', PHOTO_BYTES));
    const refs = photos.map((p) => photoRefFor(p));
    const records = [refs.slice(0, 2), refs.slice(2, 3), refs.slice(3, 4)].map((own) => ({
      ...makeRecord(ride),
      photos: own,
    }));
    return { records, photos };
  } finally {
    sqlite.close();
  }
}

type BarState = { now: number | null; max: number | null; text: string | null };
const readBar = (page: Page, name: string): Promise<BarState | null> =>
  page.evaluate((label) => {
    const el = document.querySelector(`[role="progressbar"][aria-label="${label}"]`);
    if (!el) return null;
    const num = (a: string) => (el.hasAttribute(a) ? Number(el.getAttribute(a)) : null);
    return { now: num('aria-valuenow'), max: num('aria-valuemax'), text: el.getAttribute('aria-valuetext') };
  }, name);

/** Polls a bar until `ok` holds for it, collecting every state seen. */
async function waitForBar(page: Page, name: string, ok: (b: BarState) => boolean, seen: BarState[]) {
  for (let i = 0; i < 300; i++) {
    const b = await readBar(page, name);
    if (b) seen.push(b);
    if (b && ok(b)) return b;
    await page.waitForTimeout(50);
  }
  throw new Error(
    `the bar "${name}" never showed the state asked for; seen: ${JSON.stringify(seen.slice(-5))}`,
  );
}

test('phone: a sync of three inspections and four photos shows determinate bars that rise to the end', async () => {
  const page = await app.openPage('phone');
  await page.context().addInitScript(() => window.localStorage.setItem('pivotwatch:diagnostics', '1'));
  await signIn(page, app.baseUrl, 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await page.waitForFunction(() => (window as WithDiagnostics).pivotwatchDevice !== undefined, null, {
    timeout: 30000,
  });

  const { records, photos } = recordsToSend();
  await page.evaluate(
    async ({ recs, images }) => {
      const device = (window as WithDiagnostics).pivotwatchDevice!;
      for (const base64 of images) await device.putPhotoBlob({ base64, mime: 'image/jpeg' });
      for (const rec of recs) {
        await device.saveDraft({ id: rec.id, rideId: rec.rideId, data: { step: 'done' } });
        await device.submitDraft(rec);
      }
    },
    { recs: records, images: photos.map((p) => Buffer.from(p).toString('base64')) },
  );

  // Each push and photo held back 1.2 s in the browser, then sent on unchanged.
  const hold = () => new Promise((resolve) => setTimeout(resolve, 1200));
  await page.route('**/api/sync/push', async (route) => {
    await hold();
    await route.continue();
  });
  await page.route('**/api/photos/*', async (route) => {
    if (route.request().method() === 'PUT') await hold();
    await route.continue();
  });

  await page.getByRole('button', { name: 'Sync now' }).click();

  const sending: BarState[] = [];
  const send = await waitForBar(page, 'Sending inspections', (b) => b.max === 3, sending);
  expect(send).toMatchObject({ now: 0, max: 3, text: '0 of 3 inspections' });
  await screenshot(page, 'progress-phone-sending');

  // Photos: bytes of the whole (4 × 250 kB = 1.00 MB, SI prefixes as lib/bytes.ts), somewhere in between.
  const uploading: BarState[] = [];
  const mid = await waitForBar(
    page,
    'Uploading photos',
    (b) => b.now !== null && b.max !== null && b.now > 0 && b.now < b.max,
    uploading,
  );
  expect(mid.max).toBe(4 * PHOTO_BYTES);
  // Bytes sent count before the server confirms the photo (XHR upload progress), so "0 of 4 photos · 250 kB".
  expect(mid.text).toMatch(/^[0-3] of 4 photos · .* of 1\.00 MB$/);
  await screenshot(page, 'progress-phone-photos');
  await waitForBar(page, 'Uploading photos', (b) => b.now === 3 * PHOTO_BYTES, uploading).catch(() => null);
  for (let i = 1; i < uploading.length; i++)
    expect(uploading[i].now ?? 0).toBeGreaterThanOrEqual(uploading[i - 1].now ?? 0);

  // The end: every record and photo on the server, and the panel says so with no bar left.
  // (The headline's counts were read before the test's submits, so the bars' going is what marks the end.)
  await page.locator('[role="progressbar"]').first().waitFor({ state: 'detached', timeout: 60000 });
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  for (const rec of records) {
    const res = await fetch(`${app.baseUrl}/api/inspections/${rec.id}`, {
      headers: { Authorization: `Bearer ${token}` },
    });
    expect(res.status).toBe(200);
  }
  for (const p of records.flatMap((r) => r.photos)) {
    const res = await fetch(`${app.baseUrl}/api/photos/${p.sha256}`, {
      headers: { Authorization: `Bearer ${token}` },
    });
    expect(res.status).toBe(200);
    expect((await res.arrayBuffer()).byteLength).toBe(PHOTO_BYTES);
  }
  await screenshot(page, 'progress-phone-done');
  await page.context().close();
});
