/**
 * The ride logbook in the browser against the real server and demo data: the operator of Tamsworth Pier
 * Leisure opens Skylark at phone size (390×844), follows the ride page's link to its logbook, shows only
 * notices and downloads them as a CSV file; the supervisor reads the whole logbook at desktop size
 * (1440×900). What the page lists is checked against the API's own answer. Screens at both sizes.
 */
import { readFileSync } from 'node:fs';

import type { LogbookPage } from '@/features/logbook/schema';
import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
let rideId = '';

beforeAll(async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const { rides } = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  rideId = rides.find((r) => r.name === 'Skylark')?.id ?? '';
  expect(rideId).not.toBe('');
  // A change of status, so the logbook holds a status entry and the notice it issued.
  const res = await fetch(`${app.baseUrl}/api/rides/${rideId}/status`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: JSON.stringify({
      status: 'restricted',
      reason: 'Gondola 3, seat latch, to be adjusted, then re-checked',
    }),
  });
  expect(res.status).toBe(200);
});

test('an operator opens their ride’s logbook on a phone, shows only notices and downloads them as CSV', async () => {
  const phone = await app.signedIn('phone', 'operator@pivotwatch.test');
  await phone.goto(`${app.baseUrl}/rides/${rideId}`);
  await phone.getByRole('link', { name: /Logbook/ }).click({ timeout: 60_000 });
  const list = phone.getByLabel('Logbook entries', { exact: true });
  await list.waitFor({ timeout: 60_000 });
  await list.getByText('Status: In service → Restricted').waitFor();
  await screenshot(phone, 'logbook-operator-phone');

  // What the page shows is the server's first page for the operator.
  const token = await apiToken(app.baseUrl, 'operator@pivotwatch.test');
  const served = await apiGet<LogbookPage>(app.baseUrl, `/api/rides/${rideId}/logbook`, token);
  expect(served.events.some((e) => ['inspection', 'decision', 'design'].includes(e.kind))).toBe(false);
  await list.getByText(served.events[0].title, { exact: true }).first().waitFor();

  await phone.getByRole('button', { name: /^Filters/ }).click();
  // The operator's chips offer only what an operator's logbook can hold.
  await phone.getByRole('checkbox', { name: 'Show: Notices' }).waitFor();
  expect(await phone.getByRole('checkbox', { name: 'Show: Inspections' }).count()).toBe(0);
  await phone.getByRole('checkbox', { name: 'Show: Notices' }).click();
  await phone.waitForURL(/kinds=notice/);
  await list.getByText(/^Ride status notice PW-\d{4}-\d{4} issued to Tamsworth Pier Leisure$/).waitFor();
  await phone.getByText(/^Notices · all dates — \d+ entr(y|ies), all pages$/).waitFor();
  expect(await list.getByText('Status: In service → Restricted').count()).toBe(0);
  await screenshot(phone, 'logbook-operator-phone-notices');

  const csvButton = phone.getByRole('button', { name: /^CSV file/ });
  await csvButton.scrollIntoViewIfNeeded();
  const box = await csvButton.boundingBox();
  expect(box && box.height).toBeGreaterThanOrEqual(44);
  const [download] = await Promise.all([phone.waitForEvent('download'), csvButton.click()]);
  expect(download.suggestedFilename()).toBe('logbook-Skylark.csv');
  const text = readFileSync((await download.path())!, 'utf8');
  // RFC 4180: records end in CRLF, the first is the header.
  const records = text.split('\r\n');
  expect(records[0]).toBe('at,site_day,kind,title,detail,who,link,documents');
  const notices = await apiGet<LogbookPage>(app.baseUrl, `/api/rides/${rideId}/logbook?kinds=notice`, token);
  expect(records.filter((r) => /^\d{4}-\d{2}-\d{2}T/.test(r))).toHaveLength(notices.total);
  expect(text).toContain(',Notice,');
});

test('a supervisor reads the whole logbook at desktop size and searches it', async () => {
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.goto(`${app.baseUrl}/rides/${rideId}/logbook`);
  const list = desk.getByLabel('Logbook entries', { exact: true });
  await list.waitFor({ timeout: 60_000 });
  await list.getByText('Status: In service → Restricted').waitFor();
  // Design data is staff's to see, with the way to the version.
  await list.getByText('Design data version 1 made').waitFor();
  await desk.getByRole('link', { name: 'Open the version' }).first().waitFor();
  await desk.getByRole('button', { name: /^Logbook PDF · A4/ }).waitFor();
  await screenshot(desk, 'logbook-supervisor-desktop');

  await desk.getByLabel('Search the logbook').fill('seat latch');
  await desk.waitForURL(/q=seat/);
  await desk.getByText(/containing “seat latch” — 2 entries, all pages$/).waitFor();
  await screenshot(desk, 'logbook-supervisor-desktop-search');
});
