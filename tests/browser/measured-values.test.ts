/**
 * Numbers that tell the truth, in the real app: the inspector's phone (390×844) echoes a typed value as
 * typed ("0.40 mm"), and the supervisor's desk (1440×900) shows a pin typed 0.05 mm above its minimum
 * with the inspector's digits against the limit, never rounded onto or across it. The record is pushed
 * through the sync API as the phone would send it; ride and values are the invented demo scenario's.
 */
import { randomUUID } from 'node:crypto';

import { analyseInspection, previewOf } from '@/features/records/analysis';
import type { InspectionRecord, Reading } from '@/features/records/schema';
import type { DesignData } from '@/features/loads/design-schema';

import {
  apiGet,
  apiToken,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
  pushAsPhone,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser({ NODE_ENV: 'development' });

test('the phone echoes a typed clearance as typed', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await startPeriodicInspection(page, 'Little Kite');
  await page.getByRole('radio', { name: 'Readings' }).click();
  await page.getByRole('textbox', { name: 'Bushing clearance (diametral)' }).first().fill('0,40');
  await page.getByRole('radio', { name: 'Gauge (feeler, caliper, angle)' }).first().click();
  await page.getByRole('radio', { name: 'None from the register' }).first().click();
  await page
    .getByRole('button', { name: /^Add bushing clearance/ })
    .first()
    .click();
  const recorded = page.getByText('0.40 mm', { exact: true }).first();
  await recorded.waitFor();
  await recorded.scrollIntoViewIfNeeded();
  await screenshot(page, 'measured-phone-entry');
  expect(await page.getByText('0.4000 mm').count()).toBe(0);
  await page.context().close();
});

test('the desk shows a pin typed just above its minimum with the inspector’s digits', async () => {
  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const pulled = await apiGet<{
    rides: { id: string; name: string }[];
    designs: { id: string; rideId: string; version: number; data: DesignData }[];
  }>(app.baseUrl, '/api/sync/pull', token);
  const ride = pulled.rides.find((r) => r.name === 'Little Kite');
  if (!ride) throw new Error('Little Kite is not in the demo');
  const design = pulled.designs.filter((d) => d.rideId === ride.id).sort((a, b) => b.version - a.version)[0];
  const pivot = design.data.pivots.find((p) => p.minimumDiameterM !== undefined);
  if (!pivot?.minimumDiameterM) throw new Error('No pivot with a minimum pin diameter');
  // Typed 0.05 mm above the minimum, at the micrometer's 0.01 mm: four figures would round it away.
  const minMm = pivot.minimumDiameterM * 1000;
  const entered = (minMm + 0.05).toFixed(2);
  const reading: Reading = {
    id: randomUUID(),
    kind: 'pin_diameter',
    joint: pivot.joint,
    label: `${pivot.name}: pin diameter`,
    valueSI: Number(entered) / 1000,
    unit: 'mm',
    entered,
    method: 'micrometer',
    instrument: null,
    spreadSI: null,
    takenAt: '2026-12-03T07:00:00.000Z',
  };
  const now = new Date().toISOString();
  const record: InspectionRecord = {
    id: randomUUID(),
    rideId: ride.id,
    designVersionId: design.id,
    templateId: null,
    templateVersion: null,
    type: 'periodic',
    startedAt: now,
    submittedAt: now,
    checklist: [],
    readings: [reading],
    photos: [],
    notes: '',
    preview: previewOf(analyseInspection(design.data, [reading])),
    amendsId: null,
    declaration: {
      text: 'I carried out this inspection and recorded only what I saw and measured.',
      declaredAt: now,
      declaredBy: 'demo-inspector',
      declaredByName: 'Demo Inspector',
    },
  };
  const res = await pushAsPhone(app.baseUrl, token, [record]);
  const pushed = (await res.json()) as { results: { status: string; issues?: unknown }[] };
  expect(pushed.results[0]).toMatchObject({ status: 'accepted' });

  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.goto(`${app.baseUrl}/review/${record.id}`);
  const row = desk.getByText(`${entered} mm`).first();
  await row.waitFor({ timeout: 30000 });
  await desk
    .getByText('Design envelope')
    .first()
    .scrollIntoViewIfNeeded()
    .catch(() => undefined);
  await row.scrollIntoViewIfNeeded();
  await screenshot(desk, 'measured-review-near-limit-desktop');
  // The four-figure rounding that hid the margin is nowhere on the page.
  const rounded = (Math.round((minMm + 0.05) * 10) / 10).toFixed(1);
  if (rounded !== entered) expect(await desk.getByText(`${rounded} mm`, { exact: true }).count()).toBe(0);
  await desk.context().close();
});
