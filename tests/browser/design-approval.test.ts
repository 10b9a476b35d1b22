/**
 * A design revision that loosens a limit, walked in the browser against the real server and demo data:
 * the supervisor imports a file that raises Skylark's main-pivot clearance limit, sees the field-by-field
 * comparison with the loosened limit marked and can only propose it; the version in force stays in force;
 * the admin (a second person) sees the pending revision with the same comparison and approves it with a
 * reason; the audit log then reads the change in words. Screens at phone and desktop size.
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
  data: { pivots: { joint: number; name: string; maxClearanceM: number }[]; source: { revision: string } };
};

const app = serverAndBrowser();
let skylark: string;
let supervisorToken: string;

beforeAll(async () => {
  supervisorToken = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const list = await apiGet<{ rides: { id: string; name: string }[] }>(
    app.baseUrl,
    '/api/rides',
    supervisorToken,
  );
  skylark = list.rides.find((r) => r.name === 'Skylark')?.id ?? '';
});

const inForce = async () =>
  (await apiGet<{ design: Design }>(app.baseUrl, `/api/rides/${skylark}/design`, supervisorToken)).design;

/** The in-force design as a JSON file with the main pivot's clearance limit raised from 0.6 mm to 0.9 mm. */
async function loosenedFile(): Promise<Buffer> {
  const { data } = await inForce();
  const next = {
    ...data,
    source: { ...data.source, revision: 'E' },
    pivots: data.pivots.map((p) => (p.joint === 0 ? { ...p, maxClearanceM: 0.0009 } : p)),
  };
  return Buffer.from(JSON.stringify(next, null, 2));
}

async function chooseFile(page: Page, buffer: Buffer) {
  const chooser = page.waitForEvent('filechooser');
  await page.getByRole('button', { name: 'Choose a CSV or JSON file' }).click();
  await (await chooser).setFiles({ name: 'skylark-rev-e.json', mimeType: 'application/json', buffer });
}

const LOOSENED = 'Max clearance at Main pivot shaft: 0.6 mm → 0.9 mm (loosened)';

test.each<[SizeName]>([['phone'], ['desktop']])(
  'the import shows the comparison and the loosened limit (%s)',
  async (size) => {
    const page = await app.signedIn(size, 'supervisor@pivotwatch.test');
    await page.waitForURL('**/review');
    await page.goto(`${app.baseUrl}/rides/${skylark}/import`);
    await page.getByRole('heading', { name: 'Import design data' }).waitFor();
    await chooseFile(page, await loosenedFile());

    const row = page.getByLabel(LOOSENED);
    await row.waitFor();
    expect(await row.innerText()).toMatch(/LOOSENED/);
    await page.getByText('2 changes: 1 limit loosened.').waitFor();
    await page.getByText(/A limit is looser than in version 1/).waitFor();
    const propose = page.getByRole('button', { name: 'Propose version 2 for approval' });
    await propose.waitFor();
    await page.getByRole('heading', { name: 'Compare with version 1 in force' }).scrollIntoViewIfNeeded();
    await screenshot(page, `${size}-design-import-comparison`);

    if (size === 'desktop') {
      await page.getByLabel('Why this version').fill('Maker’s revision E: wider bushing tolerance');
      await propose.click();
      await page.waitForURL(`**/rides/${skylark}/design`);
      await page.getByText('Version 2 waits for a second person').waitFor();
      await page.getByText(/You proposed this version/).waitFor();
      // The proposer is offered no approval; the version in force is unchanged.
      expect(await page.getByRole('button', { name: 'Approve version 2' }).count()).toBe(0);
      const current = await inForce();
      expect(current.version).toBe(1);
      expect(current.data.pivots[0].maxClearanceM).toBe(0.0006);
    }
    await page.context().close();
  },
);

test.each<[SizeName]>([['phone'], ['desktop']])(
  'a second person sees the pending revision with its comparison (%s)',
  async (size) => {
    const page = await app.signedIn(size, 'admin@pivotwatch.test');
    await page.waitForURL((url) => !url.pathname.includes('sign-in'));
    await page.goto(`${app.baseUrl}/rides/${skylark}/design`);
    await page.getByText('Version 2 waits for a second person').waitFor();
    await page.getByLabel(LOOSENED).waitFor();
    await page.getByText('Version 2 waits for a second person').scrollIntoViewIfNeeded();
    await screenshot(page, `${size}-design-approval-pending`);
    await page.getByRole('button', { name: 'Approve version 2' }).scrollIntoViewIfNeeded();
    await screenshot(page, `${size}-design-approval-decide`);

    if (size === 'desktop') {
      // No reason, no decision.
      await page.getByRole('button', { name: 'Approve version 2' }).click();
      await page.getByText('Say why it may be approved').waitFor();
      expect((await inForce()).version).toBe(1);

      await page.getByLabel('Your reason').fill('Checked against the maker’s letter of revision E');
      await page.getByRole('button', { name: 'Approve version 2' }).click();
      await page.getByText('Version 2 waits for a second person').waitFor({ state: 'detached' });
      const now = await inForce();
      expect(now.version).toBe(2);
      expect(now.data.pivots[0].maxClearanceM).toBe(0.0009);

      await page.goto(`${app.baseUrl}/register/audit?entity=design`);
      await page
        .getByText(/design data version 2 approved, now in force/)
        .first()
        .click();
      // The entry reads the change in words and units, not stored keys.
      await page.getByLabel(LOOSENED).first().waitFor();
      expect(await page.getByText('data.pivots').count()).toBe(0);
      await screenshot(page, 'desktop-design-approval-audit');
    }
    await page.context().close();
  },
);
