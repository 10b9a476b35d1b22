/**
 * Heavy code loads with the first thing that uses it, in the real web export (issue 16, "nothing heavy
 * before it is needed"): d3 in a chunk of its own (components/chart-d3.ts) fetched when the first chart
 * draws, the design file code (features/registry/csv.ts) when a design is first exported. Neither comes
 * with an inspector's "Today", and what loads late still works: the review desk's charts are drawn and
 * the exported CSV reads back as the same design.
 */
import { readFileSync } from 'node:fs';

import type { Page } from 'playwright-core';

import type { DesignData } from '@/features/loads/design-schema';
import { parseDesignCsv } from '@/features/registry/csv';
import { DESIGN_CSV_COLUMNS } from '@/features/registry/design-file/columns';
import { apiGet, apiToken, serverAndBrowser } from '@/tests/support/browser/harness';

// Development mode seeds the demo scenario's submitted inspections, which the review page charts.
const app = serverAndBrowser({ NODE_ENV: 'development' });

/** The chunk names (file names without their content hash) the page fetches from now on. */
function recordChunks(page: Page): string[] {
  const chunks: string[] = [];
  page.on('request', (req) => {
    const name = new URL(req.url()).pathname.split('/').pop() ?? '';
    if (name.endsWith('.js')) chunks.push(name.replace(/-[0-9a-f]+\.js$/, ''));
  });
  return chunks;
}

test('an inspector’s Today fetches neither d3 nor the design file code', async () => {
  const page = await app.openPage('phone');
  const chunks = recordChunks(page);
  await page.goto(`${app.baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill('inspector@pivotwatch.test');
  await page.getByLabel('Password').fill('pivotwatch-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  // Chunks were fetched at all (the recording works), but not these two.
  expect(chunks.length).toBeGreaterThan(0);
  expect(chunks).not.toContain('chart-d3');
  expect(chunks).not.toContain('csv');
  await page.context().close();
});

test('the review desk fetches d3 with its charts, and draws them', async () => {
  const page = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  const chunks = recordChunks(page);
  await page.waitForURL('**/review');
  await page
    .getByText(/Tidebreaker/)
    .first()
    .waitFor();
  expect(chunks).not.toContain('chart-d3');
  await page
    .getByRole('link', { name: /Tidebreaker/ })
    .first()
    .click();
  await page.waitForURL(/\/review\/[^/?]+$/);
  // A trend over the ride's inspections: its line (an SVG path with a drawn shape) and its date ticks.
  const trend = page.getByRole('img', { name: /^Peak force at P1/ }).first();
  await trend.scrollIntoViewIfNeeded();
  await trend.locator('path[d^="M"]').first().waitFor({ timeout: 30000 });
  await trend
    .getByText(/^\d{1,2} [A-Z][a-z]{2}$/)
    .first()
    .waitFor();
  expect(chunks.filter((c) => c === 'chart-d3')).toHaveLength(1);
  await page.context().close();
});

test('exporting a design fetches the design file code then, and the CSV reads back as the same design', async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const { rides } = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  const skylark = rides.find((r) => r.name === 'Skylark');
  expect(skylark).toBeDefined();
  const page = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  const chunks = recordChunks(page);
  await page.goto(`${app.baseUrl}/rides/${skylark!.id}/design`);
  const button = page.getByRole('button', { name: 'Download CSV' });
  await button.waitFor();
  expect(chunks).not.toContain('csv');
  const [download] = await Promise.all([page.waitForEvent('download'), button.click()]);
  expect(chunks).toContain('csv');
  const text = readFileSync((await download.path())!, 'utf8');
  expect(text.split('\r\n')[0]).toBe(DESIGN_CSV_COLUMNS.join(','));
  const read = parseDesignCsv(text);
  expect(read.ok).toBe(true);
  // The same design as the server holds (its current version, as the page shows it).
  const current = await apiGet<{ design: { data: DesignData } }>(
    app.baseUrl,
    `/api/rides/${skylark!.id}/design`,
    token,
  );
  if (read.ok) expect(read.data).toEqual(current.design.data);
  await page.context().close();
});
