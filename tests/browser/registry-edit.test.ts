/**
 * The register's edits in the browser against the real server and demo data, as an admin at 1440×900:
 * the design-data field editor changes Twin Comet's gondola mass (a new version in force: a mass is no
 * limit) and then raises its main axle's force limit (a loosened limit: a new version pending a second
 * person's approval, the version in force unchanged), each difference listed against the version in force
 * before saving; and a site made for the test is deleted through the two-step confirmation (Cancel first,
 * Escape closes it), returning to the list with a notice, the audit log holding the removal. The phone
 * size (390×844) is looked at for the editor and the confirmation. Names are invented demo data.
 */
import type { Page } from 'playwright-core';

import {
  type SizeName,
  apiGet,
  apiToken,
  screenshot,
  serverAndBrowser,
} from '@/tests/support/browser/harness';

type Design = {
  version: number;
  approvalState?: string;
  data: { parts: { name: string; massKg: number }[]; pivots: { name: string; maxForceN?: number }[] };
};

const app = serverAndBrowser();
let admin: string;
let twinComet: string;

beforeAll(async () => {
  admin = await apiToken(app.baseUrl, 'admin@pivotwatch.test');
  const list = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', admin);
  twinComet = list.rides.find((r) => r.name === 'Twin Comet')?.id ?? '';
});

const inForce = async () =>
  (await apiGet<{ design: Design }>(app.baseUrl, `/api/rides/${twinComet}/design`, admin)).design;
const pending = async () =>
  (await apiGet<{ pending: Design | null }>(app.baseUrl, `/api/rides/${twinComet}/design/pending`, admin))
    .pending;

const MASS = 'Gondola A · plate on body 0: Mass (kg)';
const FORCE = 'Pivot 0 · Main axle: Max force (N)';

async function openEditor(page: Page) {
  await page.goto(`${app.baseUrl}/rides/${twinComet}/edit-design`);
  await page.getByRole('heading', { name: 'Edit design data' }).waitFor();
  await page.getByLabel(MASS).waitFor();
}

test('admin: one field edited, then a limit raised: a version in force, then one pending approval', async () => {
  const page = await app.signedIn('desktop', 'admin@pivotwatch.test');
  const start = await inForce();
  await openEditor(page);

  // A value the import would refuse: the problem under the field, no save offered.
  await page.getByLabel(MASS).fill('2750,5');
  await page.getByText('"2750,5" uses a decimal comma: write 2750.5').waitFor();
  expect(await page.getByRole('button', { name: /Save as version/ }).isDisabled()).toBe(true);

  await page.getByLabel(MASS).fill('2750');
  await page.getByText('Changed: was 2600').waitFor();
  // The comparison the import shows (features/registry/design-diff.ts): a mass is no limit.
  await page.getByText('1 change, no limit changed.').waitFor();
  await page
    .getByLabel(/^Mass at Gondola A \(Arm with gondolas\): .+ → .+$/)
    .first()
    .waitFor();
  await screenshot(page, 'desktop-design-edit-mass');
  await page.getByLabel('Why this version').fill('Gondola A weighed after its refit');
  await page.getByRole('button', { name: `Save as version ${start.version + 1}` }).click();
  await page.waitForURL(`**/rides/${twinComet}/design`);
  const afterMass = await inForce();
  expect(afterMass.version).toBe(start.version + 1);
  expect(afterMass.data.parts.find((p) => p.name === 'Gondola A')?.massKg).toBe(2750);

  // A raised maximum loosens a limit: proposed, not in force.
  await openEditor(page);
  await page.getByLabel(FORCE).fill('240000');
  await page.getByText(/A limit is looser than in version/).waitFor();
  const propose = page.getByRole('button', { name: `Propose version ${afterMass.version + 1} for approval` });
  await propose.scrollIntoViewIfNeeded();
  await screenshot(page, 'desktop-design-edit-limit');
  await page.getByLabel('Why this version').fill('Maker’s letter: axle rated 240 kN');
  await propose.click();
  await page.waitForURL(`**/rides/${twinComet}/design`);
  await page.getByText(`Version ${afterMass.version + 1} waits for a second person`).waitFor();
  await page
    .getByLabel(/^Max force at Main axle: .+ → .+ \(loosened\)$/)
    .first()
    .waitFor();
  await screenshot(page, 'desktop-design-edit-pending');
  expect((await inForce()).version).toBe(afterMass.version);
  const waiting = await pending();
  expect(waiting?.approvalState).toBe('pending');
  expect(waiting?.data.pivots[0].maxForceN).toBe(240_000);
  await page.context().close();
});

test('admin: a site made for the test is deleted after a confirmation, and the list says so', async () => {
  const corvane = (
    await apiGet<{ sites: { operatorCompanyId: string }[] }>(app.baseUrl, '/api/sites?q=Lowfield', admin)
  ).sites[0].operatorCompanyId;
  const res = await fetch(`${app.baseUrl}/api/sites`, {
    method: 'POST',
    headers: { authorization: `Bearer ${admin}`, 'content-type': 'application/json' },
    body: JSON.stringify({ name: 'Brackley Meadow', kind: 'fairground', operatorCompanyId: corvane }),
  });
  expect(res.status).toBe(201);
  const site = ((await res.json()) as { site: { id: string } }).site;

  const page = await app.signedIn('desktop', 'admin@pivotwatch.test');
  await page.goto(`${app.baseUrl}/register/sites/${site.id}`);
  await page.getByRole('button', { name: 'Delete site…' }).click();
  const dialog = page.getByRole('alertdialog', { name: 'Delete Brackley Meadow?' });
  await dialog.waitFor();
  // Cancel has the keyboard first; Escape closes the question without sending anything.
  expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Cancel');
  await page.keyboard.press('Escape');
  await dialog.waitFor({ state: 'detached' });

  await page.getByRole('button', { name: 'Delete site…' }).click();
  await dialog.waitFor();
  await screenshot(page, 'desktop-site-delete-confirm');
  await page.getByRole('button', { name: 'Delete Brackley Meadow' }).click();
  await page.waitForURL('**/register/sites');
  await page.getByText('Brackley Meadow was deleted. The audit log keeps a record of it.').waitFor();
  await screenshot(page, 'desktop-site-delete-notice');
  const gone = await fetch(`${app.baseUrl}/api/sites/${site.id}`, {
    headers: { authorization: `Bearer ${admin}` },
  });
  expect(gone.status).toBe(404);
  const audit = await apiGet<{ entries: { entity: string; action: string; summary: string }[] }>(
    app.baseUrl,
    '/api/audit?entity=site',
    admin,
  );
  expect(
    audit.entries.some((e) => e.action === 'delete' && e.summary === 'Site Brackley Meadow removed'),
  ).toBe(true);
  await page.context().close();
});

test.each<[SizeName]>([['phone']])('the editor and the confirmation at %s size', async (size) => {
  const page = await app.signedIn(size, 'admin@pivotwatch.test');
  await openEditor(page);
  await page.getByLabel(MASS).fill('2800');
  await page.getByText('Changed: was 2750').waitFor();
  await page.getByLabel(MASS).scrollIntoViewIfNeeded();
  await screenshot(page, `${size}-design-edit`);
  const { sites } = await apiGet<{ sites: { id: string; name: string }[] }>(
    app.baseUrl,
    '/api/sites?q=Tamsworth',
    admin,
  );
  await page.goto(`${app.baseUrl}/register/sites/${sites[0].id}`);
  await page.getByRole('button', { name: 'Delete site…' }).click();
  await page.getByRole('button', { name: 'Cancel' }).scrollIntoViewIfNeeded();
  await screenshot(page, `${size}-site-delete-confirm`);
  await page.getByRole('button', { name: `Delete ${sites[0].name}` }).click();
  // A site with rides is refused with the server's reason; the page stays.
  await page.getByText(/was not deleted\. .* still has \d+ ride\(s\)/).waitFor();
  await page.getByText(/was not deleted/).scrollIntoViewIfNeeded();
  await screenshot(page, `${size}-site-delete-refused`);
  await page.context().close();
});
