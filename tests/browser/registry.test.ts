/**
 * The ride register in the browser, against the real server and demo data (server/seed/demo.ts):
 * a supervisor on a desktop sorts and filters the rides, opens one, sees its chain drawn with peak loads
 * and sets its status; an inspector on a phone reads without edit controls; an operator cannot open
 * another company's ride; a bad design file is refused with its row-and-column report and nothing saved.
 */
import type { Page } from 'playwright-core';

import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
let rideIds: Record<string, string>;

beforeAll(async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const list = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  rideIds = Object.fromEntries(list.rides.map((r) => [r.name, r.id]));
});

/** Waits until `read()` gives `expected` (the list refetches after each URL change), else fails with the last. */
async function eventually<T>(read: () => Promise<T>, expected: T, timeoutMs = 10000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let last: T = await read();
  while (JSON.stringify(last) !== JSON.stringify(expected) && Date.now() < deadline) {
    await new Promise((r) => setTimeout(r, 150));
    last = await read();
  }
  expect(last).toEqual(expected);
}

/** The ride names in the desktop table, top to bottom (each row is a link named "<ride>, <status>"). */
async function tableRideNames(page: Page): Promise<string[]> {
  const table = page.getByRole('table', { name: 'Rides' });
  const labels = await table
    .getByRole('link')
    .evaluateAll((els) => els.map((e) => e.getAttribute('aria-label') ?? ''));
  return labels.map((l) => l.split(',')[0]);
}

test('supervisor (desktop) sorts and filters the rides, opens one, sees the chain and its peak loads, sets its status', async () => {
  const page = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await page.waitForURL('**/review');
  await page.getByRole('link', { name: 'Rides' }).first().click();
  await page.waitForURL('**/rides');
  await page.getByRole('table', { name: 'Rides' }).waitFor();
  expect(await tableRideNames(page)).toHaveLength(6);

  // Sorting is done by the server and kept in the URL: A–Z, then Z–A.
  await page.getByRole('button', { name: /^Sort by Ride/ }).click();
  await page.waitForURL(/sort=name/);
  await eventually(
    () => tableRideNames(page),
    ['Lantern Wheel', 'Little Kite', 'Skylark', 'Tidebreaker', 'Twin Comet', 'Whirligig Chairs'],
  );
  await page.getByRole('button', { name: /^Sort by Ride, now ascending/ }).click();
  await page.waitForURL(/sort=-name/);
  await eventually(async () => (await tableRideNames(page))[0], 'Whirligig Chairs');

  // Filters: restricted rides only, then pendulum swings only.
  await page.getByRole('checkbox', { name: 'Status: Restricted' }).click();
  await page.waitForURL(/status=restricted/);
  await eventually(() => tableRideNames(page), ['Tidebreaker']);
  await page.getByRole('checkbox', { name: 'Status: Restricted' }).click();
  await page.getByRole('checkbox', { name: 'Ride class: Pendulum swing' }).click();
  await page.waitForURL(/rideClass=pendulum_swing/);
  await eventually(() => tableRideNames(page), ['Skylark', 'Little Kite']);
  await page.getByLabel('Search rides').fill('sky');
  await page.waitForURL(/q=sky/);
  await eventually(() => tableRideNames(page), ['Skylark']);
  await screenshot(page, 'desktop-registry-rides-filtered');

  // Row → ride page: identity, status, the chain drawn to scale with each pivot's peak force.
  await page.getByRole('link', { name: 'Skylark, In service' }).click();
  await page.waitForURL(`**/rides/${rideIds.Skylark}`);
  await page.getByRole('heading', { name: 'Skylark' }).waitFor();
  const drawing = page.getByRole('img', { name: /Body chain drawn to scale/ });
  await drawing.waitFor();
  expect(await drawing.getAttribute('aria-label')).toMatch(
    /P1 Main pivot shaft, peak force [\d.]+ kN, Within/,
  );
  const peaks = page.getByRole('table', { name: 'Peak pivot loads at the design motion' });
  await peaks.getByText('P1 · Main pivot shaft').waitFor();
  await peaks.getByText('P2 · Gondola slewing bearing spindle').waitFor();
  await page.getByText('SAFETY CAUTION').first().waitFor();
  await page
    .getByText('Orrin Ride Works PX-15 design report DR-PX15-004, revision C', { exact: true })
    .waitFor();
  await screenshot(page, 'desktop-registry-ride-detail');

  // Status with a reason: refused without one, then saved and shown.
  await page.getByRole('button', { name: 'Change status' }).click();
  await page.waitForURL('**/status');
  await page.getByRole('radio', { name: 'Restricted' }).click();
  await page.getByRole('button', { name: 'Save status' }).click();
  await page.getByText('Say why the ride is restricted or out of service').waitFor();
  await page.getByLabel('Reason').fill('Gondola bearing noise reported; daily programme only until checked.');
  await screenshot(page, 'desktop-registry-status-form');
  await page.getByRole('button', { name: 'Save status' }).click();
  await page.waitForURL(`**/rides/${rideIds.Skylark}`);
  await page.getByLabel('Ride status').getByText('Restricted').waitFor();
  await page.getByText('Gondola bearing noise reported; daily programme only until checked.').waitFor();
  await screenshot(page, 'desktop-registry-ride-restricted');

  // The list shows the new status too (its cache was invalidated by the change).
  await page.getByRole('link', { name: 'Back to Rides' }).click();
  await page.getByRole('link', { name: 'Skylark, Restricted' }).waitFor();
  await page.context().close();
});

test('inspector (phone) reads rides without any edit controls', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByRole('link', { name: 'Rides' }).click();
  await page.waitForURL('**/rides');
  await page.getByRole('link', { name: 'Ride Twin Comet' }).waitFor();
  expect(await page.getByRole('button', { name: 'New ride' }).count()).toBe(0);
  await screenshot(page, 'phone-registry-rides');

  await page.getByRole('button', { name: 'Filters' }).click();
  await page.getByRole('checkbox', { name: 'Ride class: Wheel' }).click();
  await page.waitForURL(/rideClass=wheel/);
  await page.getByRole('link', { name: 'Ride Lantern Wheel' }).waitFor();
  await eventually(() => page.getByRole('link', { name: /^Ride / }).count(), 1);

  await page.getByRole('link', { name: 'Ride Lantern Wheel' }).click();
  await page.waitForURL(`**/rides/${rideIds['Lantern Wheel']}`);
  await page.getByRole('heading', { name: 'Lantern Wheel' }).waitFor();
  await page.getByRole('img', { name: /Body chain drawn to scale/ }).waitFor();
  for (const name of ['Change status', 'Edit ride', 'Import design data'])
    expect(await page.getByRole('button', { name }).count()).toBe(0);
  expect(await page.getByRole('link', { name: 'Import or export' }).count()).toBe(0);
  await screenshot(page, 'phone-registry-ride-detail');

  // The edit pages themselves say they are for other roles.
  await page.goto(`${app.baseUrl}/rides/${rideIds['Lantern Wheel']}/status`);
  await page.getByText('Not part of your role').waitFor();
  await page.context().close();
});

test('operator sees an own ride with its status but no design data, and cannot open another company’s ride', async () => {
  const page = await app.signedIn('phone', 'operator@pivotwatch.test');
  await page.waitForURL('**/my-rides');
  await page.goto(`${app.baseUrl}/rides/${rideIds['Twin Comet']}`);
  await page.getByRole('heading', { name: 'Twin Comet' }).waitFor();
  await page.getByLabel('Ride status').getByText('In service').waitFor();
  expect(await page.getByRole('img', { name: /Body chain/ }).count()).toBe(0);
  expect(await page.getByText(/Design data v/).count()).toBe(0);

  // Tidebreaker belongs to Corvane Travelling Shows: the server answers 404, shown as not found.
  await page.goto(`${app.baseUrl}/rides/${rideIds.Tidebreaker}`);
  await page.getByRole('heading', { name: 'Ride not found' }).waitFor();
  expect(await page.getByText('Tidebreaker').count()).toBe(0);
  await screenshot(page, 'phone-registry-operator-not-found');
  await page.context().close();
});

/** Rows 4 and 5 are wrong: a part of mass 0 and a pin diameter that is not a number. */
const BAD_CSV = [
  'record,body,joint,name,kind,mass_kg,x_m,y_m,to_x_m,to_y_m,document,revision,shear,bearing_length_m,nominal_diameter_m,minimum_diameter_m,max_clearance_m,rpm',
  'source,,,,,,,,,,Test doc,A,,,,,,',
  'body,0,,Arm,,,,,,,,,,,,,,',
  'part,0,,Arm tube,rod,0,0,0,0,-6,,,,,,,,',
  'pivot,,0,Main pin,,,,,,,,,double,0.2,abc,0.09,0.0005,',
  'motion,,0,,constant,,,,,,,,,,,,,6',
].join('\n');

test('a bad CSV is refused with its row-and-column report and nothing is saved', async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const id = rideIds['Little Kite'];
  const before = await apiGet<{ versions: unknown[] }>(
    app.baseUrl,
    `/api/rides/${id}/design/versions`,
    token,
  );

  const page = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await page.waitForURL('**/review');
  await page.goto(`${app.baseUrl}/rides/${id}/import`);
  await page.getByRole('heading', { name: 'Import design data' }).waitFor();
  const chooser = page.waitForEvent('filechooser');
  await page.getByRole('button', { name: 'Choose a CSV or JSON file' }).click();
  await (
    await chooser
  ).setFiles({ name: 'little-kite-bad.csv', mimeType: 'text/csv', buffer: Buffer.from(BAD_CSV) });

  const report = page.getByRole('table', { name: 'File problems by row and column' });
  await report.waitFor();
  await page.getByText('The file has 2 problems; nothing was saved.').waitFor();
  const rows = await report.getByRole('row').allInnerTexts();
  expect(rows.slice(1).map((r) => r.replace(/\s+/g, ' ').trim())).toEqual([
    '4 mass_kg Mass must be greater than 0',
    '5 nominal_diameter_m "abc" is not a number (SI units, point as the decimal mark)',
  ]);
  expect(await page.getByRole('button', { name: 'Import as version 2' }).isDisabled()).toBe(true);
  await screenshot(page, 'desktop-registry-import-refused');

  const after = await apiGet<{ versions: unknown[] }>(app.baseUrl, `/api/rides/${id}/design/versions`, token);
  expect(after.versions).toHaveLength(before.versions.length);
  await page.context().close();
});
