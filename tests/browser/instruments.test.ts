/**
 * The record says only what happened, in the real web export against the real server: an administrator
 * keeps the instrument register and the declaration text (1440×900); the inspector's phone (390×844)
 * gets both by sync, offers no method or instrument until one is picked, refuses the past-due feeler
 * gauge of the demo register and flags the dial indicator due within the fortnight, and submits only
 * with the declaration ticked; the server's copy of the record keeps both.
 */
import { randomUUID } from 'node:crypto';

import type { InspectionRecord, Reading } from '@/features/records/schema';
import type { Instrument } from '@/features/instruments/schema';

import {
  apiGet,
  apiToken,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
  pushAsPhone,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();

const declaration = 'I inspected this ride in person; this record holds only what I found and measured.';

test('the administrator keeps the register and sets the declaration text', async () => {
  const page = await app.signedIn('desktop', 'admin@pivotwatch.test');
  await page.waitForURL((url) => url.pathname !== '/sign-in');
  await page.goto(`${app.baseUrl}/register/instruments`);
  await page.getByText('HR-FG-0107').waitFor({ timeout: 30000 });
  // Calibration status in words beside its shape: past due and due soon.
  await page.getByText(/Calibration past due since \d{1,2} [A-Z][a-z]{2} \d{4}/).waitFor();
  await page.getByText(/Calibration due in 6 days/).waitFor();

  await page.getByRole('button', { name: 'Change the text' }).click();
  await page.getByRole('textbox', { name: 'Declaration text' }).fill(declaration);
  await page.getByRole('button', { name: 'Save declaration' }).click();
  await page.getByText(/^Set by .* on /).waitFor();

  await page.getByRole('button', { name: 'New instrument' }).click();
  await page.getByRole('button', { name: 'Add instrument' }).click();
  // The server's 400 names each missing field; nothing is added.
  await page.getByText('Choose the kind of instrument').waitFor();
  await page.getByRole('textbox', { name: 'Name', exact: true }).fill('Outside micrometer 50–75 mm');
  await page.getByRole('textbox', { name: 'Serial' }).fill('HR-MIC-0655');
  await page.getByRole('radio', { name: 'Micrometer' }).click();
  await page.getByRole('checkbox', { name: 'Pin diameter' }).click();
  await page.getByLabel('Calibrated on', { exact: true }).fill('2026-11-02');
  await page.getByLabel('Next calibration due', { exact: true }).fill('2027-11-02');
  await page.getByRole('button', { name: 'Add instrument' }).click();
  await page.getByText('HR-MIC-0655').waitFor();
  await screenshot(page, 'instruments-register-desktop');
  await page.setViewportSize({ width: 390, height: 844 });
  // The narrow layout replaces the table with cards; scroll once the new element has settled.
  for (let attempt = 0; ; attempt++) {
    try {
      await page.getByText('HR-FG-0107').scrollIntoViewIfNeeded({ timeout: 5_000 });
      break;
    } catch (err) {
      if (attempt >= 4) throw err;
    }
  }
  await screenshot(page, 'instruments-register-phone');
  await page.context().close();
});

test('the phone asks how each reading was measured and for the declaration at submit', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await startPeriodicInspection(page, 'Little Kite');

  await page.getByRole('radio', { name: 'Readings' }).click();
  await page.getByRole('textbox', { name: 'Bushing clearance (diametral)' }).first().fill('0.21');
  const add = page.getByRole('button', { name: /^Add bushing clearance/ }).first();
  await add.click();
  await page.getByText('Choose how it was measured').waitFor();

  await page.getByRole('radio', { name: 'Gauge (feeler, caliper, angle)' }).first().click();
  const pastDue = page.getByRole('radio', { name: /serial HR-FG-0107\. Calibration past due/ });
  await pastDue.waitFor();
  expect(await pastDue.getAttribute('aria-disabled')).toBe('true');
  await pastDue.click({ force: true });
  expect(await pastDue.getAttribute('aria-checked')).toBe('false');
  await pastDue.scrollIntoViewIfNeeded();
  await screenshot(page, 'instruments-phone-reading-picker');

  await page.getByRole('radio', { name: 'Dial indicator' }).first().click();
  await page.getByRole('radio', { name: /serial HR-DIA-0219\. Calibration due in 6 days/ }).click();
  await add.click();
  await page
    .getByText(/Dial indicator · Dial indicator 0\.01 mm, spare \(HR-DIA-0219\)/)
    .first()
    .waitFor();

  await page.getByRole('radio', { name: 'Submit' }).click();
  await page.getByText(declaration).waitFor();
  const submit = page.getByRole('button', { name: 'Submit inspection' });
  expect(await submit.isDisabled()).toBe(true);
  await page.getByText(declaration).scrollIntoViewIfNeeded();
  await screenshot(page, 'instruments-phone-submit-declaration');
  // The checklist still needs answers, so this inspection is not sent here: the full loop is in
  // field-offline.test.ts. The declaration box itself is the inspector's own tick.
  await page.getByRole('checkbox', { name: /make this declaration/ }).click();
  expect(
    await page.getByRole('checkbox', { name: /make this declaration/ }).getAttribute('aria-checked'),
  ).toBe('true');
  await page.context().close();

  // The register the phone used is the server's.
  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const pulled = await apiGet<{ declaration: { text: string } }>(app.baseUrl, '/api/sync/pull', token);
  expect(pulled.declaration.text).toBe(declaration);
});

test('the review desk shows the declaration and the instrument each reading was taken with', async () => {
  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const pulled = await apiGet<{ rides: { id: string; name: string }[]; instruments: Instrument[] }>(
    app.baseUrl,
    '/api/sync/pull',
    token,
  );
  const ride = pulled.rides.find((r) => r.name === 'Little Kite');
  const micrometer = pulled.instruments.find((i) => i.serial === 'HR-MIC-0412');
  if (!ride || !micrometer) throw new Error('demo ride or instrument missing');
  const now = new Date().toISOString();
  const reading: Reading = {
    id: randomUUID(),
    kind: 'pin_diameter',
    joint: 0,
    label: 'Main pivot: pin diameter',
    valueSI: 0.11991,
    unit: 'mm',
    method: 'micrometer',
    instrument: {
      id: micrometer.id,
      name: micrometer.name,
      serial: micrometer.serial,
      calibrationDueOn: micrometer.calibrationDueOn,
    },
    spreadSI: null,
    takenAt: now,
  };
  const record: InspectionRecord = {
    id: randomUUID(),
    rideId: ride.id,
    designVersionId: null,
    templateId: null,
    templateVersion: null,
    type: 'periodic',
    startedAt: now,
    submittedAt: now,
    checklist: [],
    readings: [reading],
    photos: [],
    preview: null,
    amendsId: null,
    declaration: {
      text: declaration,
      declaredAt: now,
      declaredBy: 'inspector',
      declaredByName: 'Demo Inspector',
    },
  };
  const res = await pushAsPhone(app.baseUrl, token, [record]);
  expect(((await res.json()) as { results: { status: string }[] }).results[0].status).toBe('accepted');

  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.goto(`${app.baseUrl}/review/${record.id}`);
  await desk.getByText(`“${declaration}”`).waitFor({ timeout: 30000 });
  await desk.getByText(/^Made by Demo Inspector on /).waitFor();
  const used = desk.getByText('Micrometer · Outside micrometer 100–125 mm (HR-MIC-0412)').first();
  await used.waitFor();
  await used.scrollIntoViewIfNeeded();
  await screenshot(desk, 'instruments-review-desk');
  await desk.context().close();
});
