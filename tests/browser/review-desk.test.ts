/**
 * The review desk as its users meet it, against the real server and web export with the demo scenario's
 * inspections: a supervisor at a desk (1440×900) goes from the queue to the over-limit inspection, reads
 * its load chart and a photo at full size, records a finding, takes the ride out of service and approves;
 * at phone size (390×844) a supervisor returns another inspection with a comment; the inspector's phone
 * shows both decisions after a sync.
 */
import type { Page } from 'playwright-core';

import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

// Development mode seeds the demo scenario's submitted inspections (tests otherwise start without them).
const app = serverAndBrowser({ NODE_ENV: 'development' });

async function api<T>(path: string, email: string): Promise<T> {
  return apiGet<T>(app.baseUrl, path, await apiToken(app.baseUrl, email));
}

async function syncPhone(page: Page) {
  await page.getByRole('button', { name: 'Sync now' }).click();
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
}

test('queue → flagged inspection → finding, ride out of service, approval; return at phone size; the inspector sees both', async () => {
  // The inspector's phone has synced once before the supervisor decides anything.
  const phone = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await phone.waitForURL('**/today');
  await phone.getByText('Everything is sent').waitFor({ timeout: 30000 });

  // ——— desk: the queue, most urgent first ———
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.getByRole('button', { name: /^1 Over limit/ }).click();
  await desk.waitForURL(/urgency=over/);
  await screenshot(desk, 'review-queue-desktop');
  await desk
    .getByRole('link', { name: /Tidebreaker/ })
    .first()
    .click();
  await desk.waitForURL(/\/review\/[^/?]+$/);
  const inspectionId = new URL(desk.url()).pathname.split('/').pop() as string;

  // Its loads: the sub-arm pivot's force over the cycle, drawn against its limit.
  await desk.getByText('Force on P2 · Sub-arm pivot').waitFor({ timeout: 30000 });
  await desk
    .getByText(/^Limit 102(\.0)? kN$/)
    .first()
    .waitFor();

  // Its photo, full size, loaded with the supervisor's credentials.
  await desk
    .getByRole('button', { name: /^Open photo/ })
    .first()
    .click();
  const dialog = desk.getByRole('dialog', { name: 'Photo, full size' });
  await dialog.waitFor();
  await desk.waitForFunction(() =>
    Array.from(document.querySelectorAll('[role="dialog"] img')).some(
      (i) => (i as HTMLImageElement).naturalWidth > 0,
    ),
  );
  await screenshot(desk, 'review-photo-desktop');
  await dialog.getByRole('button', { name: 'Close' }).click();
  await dialog.waitFor({ state: 'detached' });

  // A finding: stop now, with the rule, the action, a date and the photo it refers to.
  await desk.getByRole('button', { name: 'Add finding' }).click();
  const form = desk.getByLabel('New finding');
  await form.getByRole('radio', { name: 'Stop now' }).click();
  await form.getByLabel('What was found').fill('Sub-arm pivot force over its design limit at 6.7 rpm.');
  await form.getByLabel("Rule or maker's instruction breached").fill('Design data v1, pivot P2 force limit');
  await form.getByLabel('Required action').fill('Reset the drive to the design programme and re-inspect.');
  await form.getByLabel('Due date').fill('2027-01-15');
  await form.getByRole('checkbox').first().click();
  await form.getByRole('button', { name: 'Add finding' }).click();
  await form.waitFor({ state: 'detached' });
  await desk
    .getByRole('listitem', { name: 'Finding' })
    .getByText('Sub-arm pivot force over its design limit at 6.7 rpm.')
    .waitFor();
  await desk.getByText('Saving…').waitFor({ state: 'detached' });

  // The ride out of service with the approval (one decision, one notice), with the reason the operator
  // will read.
  await desk.getByRole('radio', { name: 'Set out of service', exact: true }).click();
  await desk
    .getByLabel('Reason for the status')
    .fill('Sub-arm pivot force over its limit; stopped until the drive is reset.');
  await desk.getByRole('button', { name: 'Approve inspection' }).click();
  await desk
    .getByText(/Approved by Mira Delacourt/)
    .first()
    .waitFor({ timeout: 15000 });
  await screenshot(desk, 'review-approved-desktop');

  const detail = await api<{
    inspection: {
      reviewState: string;
      findings: { severity: string; photoShas: string[] }[];
      rideId: string;
    };
  }>(`/api/inspections/${inspectionId}`, 'supervisor@pivotwatch.test');
  expect(detail.inspection.reviewState).toBe('approved');
  expect(detail.inspection.findings).toHaveLength(1);
  expect(detail.inspection.findings[0].severity).toBe('stop_now');
  expect(detail.inspection.findings[0].photoShas).toHaveLength(1);
  const ride = await api<{ ride: { status: string } }>(
    `/api/rides/${detail.inspection.rideId}`,
    'supervisor@pivotwatch.test',
  );
  expect(ride.ride.status).toBe('out_of_service');
  // Every decision is in the trail: who, what.
  const trail = await api<{ entries: { summary: string; userName: string | null }[] }>(
    `/api/inspections/${inspectionId}/trail`,
    'supervisor@pivotwatch.test',
  );
  const summaries = trail.entries.map((e) => e.summary).join('\n');
  expect(summaries).toMatch(/inspection approved/);
  expect(summaries).toMatch(/finding \d+ added/);
  expect(summaries).toMatch(/status restricted → out_of_service/);
  expect(trail.entries.every((e) => e.userName === 'Mira Delacourt')).toBe(true);

  // ——— phone-size supervisor: return the inspection awaiting sign-off ———
  const small = await app.signedIn('phone', 'supervisor@pivotwatch.test');
  await small.waitForURL('**/review');
  await small.getByRole('button', { name: /^1 Awaiting sign-off/ }).click();
  await small
    .getByRole('link', { name: /Lantern Wheel/ })
    .first()
    .click();
  await small.waitForURL(/\/review\/[^/?]+$/);
  await small.getByRole('button', { name: 'Return to inspector' }).waitFor({ timeout: 30000 });
  await small.getByLabel('Comment').fill('Photograph the hub bolts before resubmitting.');
  await small.getByRole('button', { name: 'Return to inspector' }).click();
  await small
    .getByText(/Returned to the inspector by Mira Delacourt/)
    .first()
    .waitFor({ timeout: 15000 });
  await screenshot(small, 'review-returned-phone');

  // ——— the inspector's phone after a sync ———
  await syncPhone(phone);
  await phone.getByText('Returned to you (1)').waitFor({ timeout: 15000 });
  await phone.getByText('Photograph the hub bolts before resubmitting.').waitFor();
  await phone
    .getByRole('button', { name: /^Show 1 finding$/ })
    .first()
    .click();
  await phone.getByText('Sub-arm pivot force over its design limit at 6.7 rpm.').waitFor();
  await screenshot(phone, 'review-decisions-inspector-phone');
});
