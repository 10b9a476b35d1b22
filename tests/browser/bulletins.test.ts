/**
 * A maker's bulletin through the real app and server, each role at its own size: the supervisor (desktop)
 * adds one for the model of the demo's Skylark (Orrin Ride Works PX-15) with the maker's PDF (a real PDF
 * written by pdfkit, whose files begin with the ISO 32000 header "%PDF-"); the inspector (phone) finds it
 * in Skylark's checklist after a sync and passes it; the ride then shows it done, to the supervisor and to
 * the ride's operator (phone), who can open the PDF. The PDF is served back byte for byte (SHA-256 by
 * Node's crypto).
 */
import { createHash } from 'node:crypto';

import {
  apiGet,
  apiToken,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
} from '@/tests/support/browser/harness';
import { pdfBytes } from '@/tests/support/pdf-files';

const app = serverAndBrowser();
const REF = 'ORW-SB-26-12';
const ACTION = 'Check each lap-bar latch pawl against wear gauge G-4';

test('supervisor adds a bulletin with its PDF; the inspector passes it in the checklist; the ride shows it done', async () => {
  const pdf = await pdfBytes(`Orrin Ride Works safety bulletin ${REF}: lap-bar latch pawls.`);
  const hash = createHash('sha256').update(pdf).digest('hex');

  // ——— the supervisor adds it at the desk ———
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.goto(`${app.baseUrl}/register/bulletins`);
  await desk.getByRole('button', { name: 'New bulletin' }).click();
  await desk.waitForURL('**/register/bulletins/new');
  await desk.getByLabel('Maker', { exact: true }).fill('Orrin Ride Works');
  await desk.getByLabel('Models', { exact: true }).fill('PX-15');
  await desk.getByLabel('Maker’s reference').fill(REF);
  await desk.getByLabel('Issued on').fill('2026-04-20');
  await desk.getByLabel('Title', { exact: true }).fill('Lap-bar latch pawls');
  await desk.getByRole('radio', { name: 'Ride must not run until done' }).click();
  await desk.getByLabel('Required action').fill(ACTION);
  await desk.getByRole('radio', { name: 'Before the ride next runs' }).click();
  const chooser = desk.waitForEvent('filechooser');
  await desk.getByRole('button', { name: 'Choose PDF' }).click();
  await (await chooser).setFiles({ name: 'orw-sb-26-12.pdf', mimeType: 'application/pdf', buffer: pdf });
  await desk.getByText(/orw-sb-26-12\.pdf .* sent when you save/).waitFor();
  await screenshot(desk, 'bulletin-new-desktop');
  await desk.getByRole('button', { name: 'Add bulletin' }).click();
  await desk.getByRole('heading', { name: `Bulletin ${REF}` }).waitFor({ timeout: 30000 });
  const rides = desk.getByLabel('Rides', { exact: true });
  await rides.getByText('Skylark', { exact: false }).waitFor();
  await rides.getByText('Overdue').waitFor();
  await screenshot(desk, 'bulletin-detail-desktop');

  // The register lists it with the demo's bulletins, found by a word of its action.
  await desk.goto(`${app.baseUrl}/register/bulletins?q=pawl`);
  await desk.getByRole('table', { name: 'Bulletins' }).getByText(REF).waitFor({ timeout: 30000 });
  await desk.getByText('0 of 1 ride done').waitFor();
  await screenshot(desk, 'bulletin-list-desktop');

  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const res = await fetch(`${app.baseUrl}/api/documents/${hash}`, {
    headers: { Authorization: `Bearer ${token}` },
  });
  expect(res.status).toBe(200);
  expect(
    createHash('sha256')
      .update(Buffer.from(await res.arrayBuffer()))
      .digest('hex'),
  ).toBe(hash);

  // ——— the inspector passes it on the phone ———
  const phone = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await phone.waitForURL('**/today');
  await phone.getByText('Everything is sent').waitFor({ timeout: 60000 });
  await startPeriodicInspection(phone, 'Skylark');
  const item = `Bulletin ${REF}: ${ACTION}`;
  const pass = phone.getByRole('radio', { name: `Pass: ${item}` });
  await pass.waitFor({ timeout: 30000 });
  // Everything else not applicable today (the demo's own bulletin for this model stays open).
  const na = phone.getByRole('radio', { name: /^Not applicable: / });
  const n = await na.count();
  for (let i = 0; i < n; i++) {
    const name = (await na.nth(i).getAttribute('aria-label')) ?? '';
    if (!name.endsWith(item)) await na.nth(i).click();
  }
  await pass.click();
  expect(await pass.getAttribute('aria-checked')).toBe('true');
  await phone.getByText('MAKER BULLETINS').scrollIntoViewIfNeeded();
  await screenshot(phone, 'bulletin-checklist-phone');
  await phone.getByRole('radio', { name: 'Submit' }).click();
  await phone.getByText('Ready to submit').waitFor();
  await phone.getByRole('checkbox', { name: /make this declaration/ }).click();
  await phone.getByRole('button', { name: 'Submit inspection' }).click();
  await phone.waitForURL('**/today');
  await phone.getByRole('button', { name: /Sync now/ }).click();
  await phone.getByText('Everything is sent').waitFor({ timeout: 60000 });

  // ——— the ride shows it done ———
  const { rides: all } = await apiGet<{ rides: { id: string; name: string }[] }>(
    app.baseUrl,
    '/api/rides',
    token,
  );
  const skylark = all.find((r) => r.name === 'Skylark');
  expect(skylark).toBeDefined();
  await desk.goto(`${app.baseUrl}/rides/${skylark?.id}`);
  const row = desk.getByTestId(`ride-bulletin-${REF}`);
  await row.waitFor({ timeout: 30000 });
  await row.getByText('Done', { exact: true }).waitFor();
  await row.getByText(/by Tomas Reyne at an inspection/).waitFor();
  await row.scrollIntoViewIfNeeded();
  await screenshot(desk, 'bulletin-ride-done-desktop');

  // The ride's operator sees the same on their phone, with the maker's PDF.
  const owner = await app.signedIn('phone', 'operator@pivotwatch.test');
  await owner.waitForURL((url) => !url.pathname.includes('sign-in'));
  await owner.goto(`${app.baseUrl}/rides/${skylark?.id}`);
  const theirs = owner.getByTestId(`ride-bulletin-${REF}`);
  await theirs.waitFor({ timeout: 30000 });
  await theirs.getByText('Done', { exact: true }).waitFor();
  await theirs.getByRole('button', { name: `Bulletin ${REF} (PDF)` }).waitFor();
  await theirs.scrollIntoViewIfNeeded();
  await screenshot(owner, 'bulletin-ride-operator-phone');
}, 240_000);
