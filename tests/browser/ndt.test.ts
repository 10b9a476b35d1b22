/**
 * NDT in the browser against the real server and demo data: an inspector at phone size opens a demo
 * ride's NDT page, adds a magnetic-particle test with its report PDF (a real PDF written by pdfkit, whose
 * files begin with the ISO 32000 header "%PDF-") and sees it first in the pivot's records; the report is
 * then served back byte for byte (SHA-256 by Node's crypto). The supervisor sees the same page at desktop
 * size. Screens at both sizes.
 */
import { createHash } from 'node:crypto';

import PDFDocument from 'pdfkit';

import type { RideNdt } from '@/features/pivot-life/ndt-schema';
import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
let rideId = '';
let pivotName = '';

function pdfBytes(text: string): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4' });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.text(text);
    doc.end();
  });
}

beforeAll(async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const { rides } = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  for (const ride of rides) {
    const ndt = await apiGet<RideNdt>(app.baseUrl, `/api/rides/${ride.id}/ndt`, token);
    const pivot = ndt.pivots.find((p) => p.plans.some((plan) => plan.method === 'MT'));
    if (pivot) {
      rideId = ride.id;
      pivotName = pivot.name;
      break;
    }
  }
  expect(rideId).not.toBe('');
});

test('an inspector adds an MT record with its report PDF at phone size; the supervisor reads it at desktop size', async () => {
  const pdf = await pdfBytes('Magnetic particle test of the hub welds: no indications.');
  const hash = createHash('sha256').update(pdf).digest('hex');

  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL((url) => !url.pathname.includes('sign-in'));
  await page.goto(`${app.baseUrl}/rides/${rideId}/ndt`);
  const form = page.getByLabel('Add NDT record', { exact: true });
  // The inspector's phone opens its on-device database on first load; on a loaded 2-core runner that and
  // the ride's NDT page can take longer than the default wait.
  await form.waitFor({ timeout: 60_000 });
  await screenshot(page, 'ndt-phone-before');

  await form.getByRole('radio', { name: pivotName, exact: true }).click();
  await form.getByLabel('Tested on').fill('2026-01-20');
  await form.getByRole('radio', { name: 'MT · planned' }).click();
  await form.getByLabel('Technician').fill('Ines Harrowgate');
  await form.getByRole('radio', { name: 'Level 3' }).click();
  await form.getByRole('radio', { name: 'No indications' }).click();
  const chooser = page.waitForEvent('filechooser');
  await form.getByRole('button', { name: 'Choose PDF' }).click();
  await (await chooser).setFiles({ name: 'mt-hub-welds.pdf', mimeType: 'application/pdf', buffer: pdf });
  await form.getByText('mt-hub-welds.pdf', { exact: false }).waitFor();
  await screenshot(page, 'ndt-phone-form');
  await form.getByRole('button', { name: 'Add NDT record' }).click();
  await form.getByText(/Recorded MT on 20 Jan 2026 with its report/).waitFor();
  await screenshot(page, 'ndt-phone-added');

  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const ndt = await apiGet<RideNdt>(app.baseUrl, `/api/rides/${rideId}/ndt`, token);
  const pivot = ndt.pivots.find((p) => p.name === pivotName);
  const added = pivot?.records.find((r) => r.reportSha256 === hash);
  expect(added).toMatchObject({
    method: 'MT',
    testedOn: '2026-01-20',
    level: 3,
    technician: 'Ines Harrowgate',
  });
  const res = await fetch(`${app.baseUrl}/api/ndt-reports/${hash}`, {
    headers: { Authorization: `Bearer ${token}` },
  });
  expect(res.status).toBe(200);
  expect(
    createHash('sha256')
      .update(Buffer.from(await res.arrayBuffer()))
      .digest('hex'),
  ).toBe(hash);

  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.goto(`${app.baseUrl}/rides/${rideId}/ndt`);
  await desk.getByLabel(`NDT at ${pivotName}`).getByRole('button', { name: 'Report PDF' }).first().waitFor();
  await screenshot(desk, 'ndt-desktop');
}, 120_000);
