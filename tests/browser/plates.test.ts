/**
 * Plates end to end, against the real server and web export, at phone size (390×844) unless named:
 * - Chromium's fake camera (`--use-fake-device-for-media-stream --use-file-for-fake-video-capture`) plays
 *   a Y4M video of a pivot's plate, drawn from the `qrcode` package's module matrix (tests/support/
 *   qr-picture.ts); the app reads it with jsQR. Signed in as the inspector, with the service worker
 *   holding the page and the network off, Scan on Today lands on that pivot's readings in a new
 *   inspection of the assigned type; scanning again continues the same inspection.
 * - A code of another server, and something that is no plate, get a plain message (typed in).
 * - The scan screen's code is fetched only when Scan opens, not with Today.
 * - An admin downloads the sheet of plates from the ride's page: a PDF.
 * Screenshots of the scan screen and the plates card at 390×844 and 1440×900 go to artifacts/screenshots.
 */
import { readFileSync, writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { type Browser, chromium } from 'playwright-core';

import { plateUrl } from '@/features/rides/plate-url';
import { launchOptions } from '@/scripts/browser';
import {
  apiGet,
  apiToken,
  screenshot,
  serverAndBrowser,
  signIn,
  sizes,
} from '@/tests/support/browser/harness';
import { qrPicture, toY4m } from '@/tests/support/qr-picture';

jest.setTimeout(240_000);

type Scanned = { rideId: string; rideName: string; pivotWords: string; typeLabel: string; url: string };
let scanned: Scanned;
let videoFile = '';

/** An assigned ride of the demo inspector with two pivots or more; its second pivot's plate, on video. */
async function plateVideo(baseUrl: string): Promise<string[]> {
  const token = await apiToken(baseUrl, 'inspector@pivotwatch.test');
  const { assignments } = await apiGet<{
    assignments: { rideId: string; rideName: string; inspectionType: string }[];
  }>(baseUrl, '/api/assignments/mine', token);
  for (const a of assignments) {
    const { design } = await apiGet<{
      design: { data: { bodies: { name: string }[]; pivots: { joint: number; name: string }[] } } | null;
    }>(baseUrl, `/api/rides/${encodeURIComponent(a.rideId)}`, token);
    const data = design?.data;
    if (!data || data.bodies.length < 2) continue;
    const name = data.pivots.find((p) => p.joint === 1)?.name ?? data.bodies[1].name;
    const labels: Record<string, string> = {
      daily_pre_opening: 'Daily pre-opening',
      periodic: 'Periodic',
      annual: 'Annual thorough',
      setup_after_assembly: 'Set-up after assembly',
      follow_up: 'Follow-up',
      after_repair: 'After repair',
    };
    scanned = {
      rideId: a.rideId,
      rideName: a.rideName,
      pivotWords: `Pivot 2 · ${name}`,
      typeLabel: labels[a.inspectionType],
      url: plateUrl(baseUrl, { rideId: a.rideId, joint: 1 }),
    };
    videoFile = join(mkdtempSync(join(tmpdir(), 'pivotwatch-plate-')), 'plate.y4m');
    writeFileSync(videoFile, toY4m(qrPicture(scanned.url, { scale: 8, width: 640, height: 480 })));
    return [
      '--use-fake-ui-for-media-stream',
      '--use-fake-device-for-media-stream',
      `--use-file-for-fake-video-capture=${videoFile}`,
    ];
  }
  throw new Error('The demo inspector has no assigned ride with two pivots');
}

const app = serverAndBrowser({}, { browserArgs: plateVideo });

test('the video the fake camera plays holds the plate: its first frame decodes to the address (jsQR)', async () => {
  // Independent of the app: the file is read back as the camera would deliver it (Y plane only).
  const { default: jsQR } = await import('jsqr');
  expect(app.browser.isConnected()).toBe(true);
  const bytes = readFileSync(videoFile);
  const header = bytes.subarray(0, bytes.indexOf(0x0a)).toString('latin1');
  expect(header).toBe('YUV4MPEG2 W640 H480 F10:1 Ip A1:1 C420jpeg');
  const start = bytes.indexOf('FRAME\n', 0, 'latin1') + 'FRAME\n'.length;
  const rgba = new Uint8ClampedArray(640 * 480 * 4);
  for (let i = 0; i < 640 * 480; i++)
    rgba.set([bytes[start + i], bytes[start + i], bytes[start + i], 255], i * 4);
  expect(jsQR(rgba, 640, 480)?.data).toBe(scanned.url);
});

test('offline, Scan on Today reads the plate and lands on that pivot’s readings; again, it continues', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  const scripts: string[] = [];
  page.on('request', (req) => {
    if (req.resourceType() === 'script') scripts.push(new URL(req.url()).pathname.split('/').pop() ?? '');
  });
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await page.getByLabel(`Ride ${scanned.rideName}`).waitFor({ timeout: 30000 });
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 60000 });
  // Today came without the scanner's chunk.
  expect(scripts.filter((s) => s.startsWith('scan-'))).toEqual([]);

  await page.context().setOffline(true);
  const scan = page.getByRole('button', { name: /^Scan a plate/ });
  const box = await scan.boundingBox();
  expect(box!.height).toBeGreaterThanOrEqual(44);
  await scan.click();

  await page.waitForURL(/\/inspect\/[^/?]+\?step=readings&pivot=2$/, { timeout: 30000 });
  const firstUrl = page.url();
  await page.getByText(scanned.pivotWords, { exact: true }).waitFor();
  await page.getByText('Opened from its plate').waitFor();
  // A new inspection of the type assigned, of that ride.
  await page
    .getByText(new RegExp(`^${scanned.typeLabel} · started`))
    .first()
    .waitFor();
  await page.getByRole('radio', { name: /Readings/, checked: true }).waitFor();
  // The pivot's card has the focus, so the keyboard and screen readers start there.
  await page.waitForFunction(
    (words) => (document.activeElement?.getAttribute('aria-label') ?? '').startsWith(words),
    scanned.pivotWords,
  );
  // ...and is brought into view (scrolled to the middle of the page).
  await page.waitForFunction(() => {
    const r = document.activeElement?.getBoundingClientRect();
    return !!r && r.top >= 0 && r.top < window.innerHeight / 2;
  });
  await screenshot(page, 'plates-scanned-pivot-phone');

  // Back to Today, scan again: the inspection in progress continues, at the same pivot.
  await page.goBack();
  await page.waitForURL('**/today');
  await page.getByRole('button', { name: /^Scan a plate/ }).click();
  await page.waitForURL(/\/inspect\/[^/?]+\?step=readings&pivot=2$/, { timeout: 30000 });
  expect(page.url()).toBe(firstUrl);
  await page.context().close();
});

test('a code of another server, or no plate at all, gets a plain message (typed in, offline)', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 60000 });
  await page.context().setOffline(true);
  // The camera would read the plate at once: come to the screen with the camera refused instead.
  await page.addInitScript(() => {
    navigator.mediaDevices.getUserMedia = () =>
      Promise.reject(new DOMException('Permission denied', 'NotAllowedError'));
  });
  await page.reload();
  await page.getByRole('button', { name: /^Scan a plate/ }).click();
  await page.getByText(/Pivotwatch may not use the camera/).waitFor({ timeout: 30000 });
  const field = page.getByLabel('Plate address');
  await field.fill(`https://other.example.org/plate/${scanned.rideId}/2`);
  await page.getByRole('button', { name: 'Open plate' }).click();
  await page.getByText(/belongs to another Pivotwatch server/).waitFor();
  await field.fill('WIFI:S:fairground;T:WPA;P:secret;;');
  await page.getByRole('button', { name: 'Open plate' }).click();
  await page.getByText(/This code is not a Pivotwatch plate/).waitFor();
  await field.fill(plateUrl(app.baseUrl, { rideId: 'no-such-ride', joint: 0 }));
  await page.getByRole('button', { name: 'Open plate' }).click();
  await page.getByText(/This ride is not on your phone/).waitFor();
  expect(new URL(page.url()).pathname).toBe('/scan');
  await screenshot(page, 'plates-scan-refused-phone');
  await page.context().close();
});

/** A browser whose fake camera shows Chromium's own moving test picture (no plate in it). */
async function plainCameraBrowser(): Promise<Browser> {
  return chromium.launch(
    launchOptions(['--use-fake-ui-for-media-stream', '--use-fake-device-for-media-stream']),
  );
}

test('screenshots: the scan screen with the camera at 390×844 and 1440×900', async () => {
  const browser = await plainCameraBrowser();
  try {
    for (const size of ['phone', 'desktop'] as const) {
      const context = await browser.newContext({ viewport: sizes[size], deviceScaleFactor: 1 });
      const page = await context.newPage();
      await signIn(page, app.baseUrl, 'inspector@pivotwatch.test');
      await page.waitForURL('**/today');
      await page.getByLabel(`Ride ${scanned.rideName}`).waitFor({ timeout: 30000 });
      await screenshot(page, `plates-today-${size}`);
      await page.getByRole('button', { name: /^Scan a plate/ }).click();
      await page.waitForURL('**/scan');
      // The stream is playing in the view.
      await page.waitForFunction(() => {
        const v = document.querySelector('video');
        return !!v && v.readyState >= 2 && v.videoWidth > 0;
      });
      await screenshot(page, `plates-scan-${size}`);
      // Leaving the screen stops the camera.
      await page.getByRole('link', { name: /Today/ }).first().click();
      await page.waitForURL('**/today');
      await page.waitForFunction(() => !document.querySelector('video'));
      await context.close();
    }
  } finally {
    await browser.close();
  }
});

test('the admin downloads the sheet of plates from the ride’s page (screenshots at both sizes)', async () => {
  for (const size of ['phone', 'desktop'] as const) {
    const page = await app.signedIn(size, 'admin@pivotwatch.test');
    await page.goto(`${app.baseUrl}/rides/${encodeURIComponent(scanned.rideId)}`);
    const card = page.getByLabel('QR plates');
    await card.waitFor({ timeout: 30000 });
    await card.scrollIntoViewIfNeeded();
    await screenshot(page, `plates-sheet-button-${size}`);
    if (size === 'desktop') {
      const [download] = await Promise.all([
        page.waitForEvent('download'),
        page.getByRole('button', { name: /^Plates · A4/ }).click(),
      ]);
      expect(download.suggestedFilename()).toMatch(/^plates-.+-A4\.pdf$/);
      const bytes = readFileSync((await download.path())!);
      expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    }
    await page.context().close();
  }
});
