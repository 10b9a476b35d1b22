/**
 * Parts and design documents in the browser against the real server and demo data. The operator, at
 * phone size (390×844), opens Skylark's page, follows "Parts and documents", records a hanger pin fitted
 * with its certificate of conformity as a PDF and sees it first in the list. A supervisor at 1440×900
 * attaches a maker's manual to Skylark's design data in force, and an inspector at phone size opens it
 * from the design page. PDFs are real ones written by pdfkit (whose files begin with the ISO 32000
 * header "%PDF-"); what the server keeps and what the browser downloads are checked against the SHA-256
 * of the bytes sent (Node's crypto). Screens at both sizes.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';

import type { RideParts } from '@/features/parts/schema';
import type { VersionDocuments } from '@/features/registry/schema';
import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';
import { pdfBytes } from '@/tests/support/pdf-files';

const app = serverAndBrowser();
let rideId = '';
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

beforeAll(async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const { rides } = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  rideId = rides.find((r) => r.name === 'Skylark')?.id ?? '';
  expect(rideId).not.toBe('');
});

test('the operator records a part with its PDF certificate at phone size and sees it listed', async () => {
  const pdf = await pdfBytes('Certificate of conformity: gondola hanger pin HP-60-2302, batch 4412-A.');
  const hash = sha256(pdf);

  const page = await app.signedIn('phone', 'operator@pivotwatch.test');
  await page.waitForURL((url) => !url.pathname.includes('sign-in'));
  await page.goto(`${app.baseUrl}/rides/${rideId}`);
  const link = page.getByRole('link', { name: /Parts and documents/ });
  await link.waitFor({ timeout: 60_000 });
  await link.click();
  await page.waitForURL(`**/rides/${rideId}/parts`);
  await page.getByRole('button', { name: 'Record a part fitted' }).click();
  const form = page.getByLabel('Record a part fitted', { exact: true });
  await form.waitFor();
  await form.getByLabel('Component').fill('Gondola hanger pin');
  await form.getByRole('radio', { name: 'Elsewhere on the ride' }).click();
  await form.getByLabel('Serial number').fill('HP-60-2302');
  await form.getByLabel('Maker').fill('Kestrel Pinworks Ltd');
  await form.getByLabel('Date fitted').fill('2026-01-20');
  await form.getByLabel('Fitted by').fill('Dale Merriweather, Tamsworth Pier Leisure');
  await form.getByLabel('Serial of the part taken out (optional)').fill('HP-60-1870');
  const chooser = page.waitForEvent('filechooser');
  await form.getByRole('button', { name: 'Add PDF' }).click();
  await (await chooser).setFiles({ name: 'coc-hp-60-2302.pdf', mimeType: 'application/pdf', buffer: pdf });
  await form.getByText('coc-hp-60-2302.pdf ·', { exact: false }).waitFor();
  await screenshot(page, 'parts-phone-form');
  await form.getByRole('button', { name: 'Record part' }).click();
  await form
    .getByText(/Recorded Gondola hanger pin, serial HP-60-2302, fitted 20 Jan 2026 with 1 PDF/)
    .waitFor();

  const list = page.getByLabel('Part replacements, newest first');
  const row = list.getByTestId(/^part-replacement-/).filter({ hasText: 'HP-60-2302' });
  await row.waitFor();
  await row.scrollIntoViewIfNeeded();
  await screenshot(page, 'parts-phone-listed');

  // What the server keeps, and the operator reads the certificate back byte for byte.
  const token = await apiToken(app.baseUrl, 'operator@pivotwatch.test');
  const parts = await apiGet<RideParts>(app.baseUrl, `/api/rides/${rideId}/parts`, token);
  expect(parts.replacements.find((r) => r.serialNumber === 'HP-60-2302')).toMatchObject({
    component: 'Gondola hanger pin',
    joint: null,
    fittedOn: '2026-01-20',
    replacedSerial: 'HP-60-1870',
    createdByName: 'Priya Castellan',
    documents: [{ sha256: hash, title: 'Certificate of conformity' }],
  });
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    row.getByRole('button', { name: 'Certificate of conformity (PDF)' }).click(),
  ]);
  expect(sha256(readFileSync((await download.path())!))).toBe(hash);
  await page.context().close();
}, 180_000);

test('a supervisor attaches a maker’s manual at 1440×900; an inspector opens it at phone size', async () => {
  const pdf = await pdfBytes('Skylark PX-15 lubrication and pin inspection supplement, issue 2.');
  const hash = sha256(pdf);

  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.goto(`${app.baseUrl}/rides/${rideId}/design`);
  const card = desk.getByLabel(/^Documents of version \d+$/);
  await card.waitFor({ timeout: 60_000 });
  const chooser = desk.waitForEvent('filechooser');
  await card.getByRole('button', { name: 'Choose PDF' }).click();
  await (
    await chooser
  ).setFiles({ name: 'skylark-supplement.pdf', mimeType: 'application/pdf', buffer: pdf });
  await card.getByTestId('design-document-picked').waitFor();
  await card.getByRole('radio', { name: 'Maker’s manual' }).click();
  await card.getByLabel('Title').fill('Lubrication and pin inspection supplement');
  await card.getByLabel('Revision or issue (optional)').fill('Issue 2');
  await card.getByRole('button', { name: 'Attach document' }).click();
  await card.getByText(/Attached “Lubrication and pin inspection supplement” to version \d+/).waitFor();
  await card.scrollIntoViewIfNeeded();
  await screenshot(desk, 'design-documents-desktop');
  // The parts page at desktop size: the list beside the form, the ride's documents under the list.
  await desk.goto(`${app.baseUrl}/rides/${rideId}/parts`);
  const docs = desk.getByLabel('Ride documents');
  await docs.getByText('Lubrication and pin inspection supplement').waitFor({ timeout: 60_000 });
  await screenshot(desk, 'parts-desktop');
  await desk.context().close();

  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const inForce = await apiGet<VersionDocuments>(app.baseUrl, `/api/rides/${rideId}/documents`, token);
  expect(inForce.documents.find((d) => d.sha256 === hash)).toMatchObject({
    kind: 'makers_manual',
    revision: 'Issue 2',
    attachedByName: 'Mira Delacourt',
  });

  const phone = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await phone.waitForURL((url) => !url.pathname.includes('sign-in'));
  await phone.goto(`${app.baseUrl}/rides/${rideId}/design`);
  const open = phone.getByRole('button', { name: 'Open Lubrication and pin inspection supplement' });
  await open.waitFor({ timeout: 60_000 });
  await open.scrollIntoViewIfNeeded();
  await screenshot(phone, 'design-documents-phone');
  // Inspectors read but do not attach or remove.
  expect(await phone.getByRole('button', { name: 'Attach document' }).count()).toBe(0);
  const [download] = await Promise.all([phone.waitForEvent('download'), open.click()]);
  expect(sha256(readFileSync((await download.path())!))).toBe(hash);
  await phone.context().close();
}, 180_000);
