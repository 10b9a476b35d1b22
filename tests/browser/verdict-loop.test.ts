/**
 * The whole verdict loop under the ride status rules (features/review/status-rules.ts), against the real
 * server and web export: an over-limit pin reading on the inspector's phone → submit and sync → the
 * supervisor records a finding and stops the ride in the decision (one notice, listing its reason) → the
 * operator acknowledges and reports corrective action → the inspector verifies and closes the finding
 * (note and evidence) → the follow-up inspection appears on the inspector's Today, is done and approved →
 * the ride is back in service, with exactly one notice per decision.
 *
 * Little Kite's main pivot pin: 90 mm nominal, 89.3 mm minimum (the demo design data, invented). A pin
 * worn under its minimum diameter is a stop in common practice (the maker's wear limit; from memory).
 */
import type { Page } from 'playwright-core';

import {
  DEMO_PASSWORD,
  apiGet,
  apiToken,
  screenshot,
  serverAndBrowser,
} from '@/tests/support/browser/harness';

jest.setTimeout(300_000);

const app = serverAndBrowser();

const RIDE = 'Little Kite';

async function api<T>(path: string, email: string): Promise<T> {
  return apiGet<T>(app.baseUrl, path, await apiToken(app.baseUrl, email));
}

type NoticeList = {
  notices: { id: string; reference: string; kind: string; inspectionId: string | null }[];
  total: number;
};
type NoticeDoc = {
  notice: {
    document: {
      operatingStatus: { status: string; reason: string | null };
      reinspection: { required: boolean; reason: string | null };
      results: { label: string; status: string }[];
      findings: { number: number; description: string }[];
    };
  };
};

async function syncPhone(page: Page) {
  await page.goto(`${app.baseUrl}/today`);
  await page.getByRole('button', { name: /Sync now/ }).click();
  await page.getByText('Everything is sent').waitFor({ timeout: 60000 });
}

/**
 * Records an inspection of the ride on the phone: every checklist item not applicable today, one pin
 * diameter reading typed with its method and instrument, the declaration, submit, sync.
 */
async function recordPinInspection(page: Page, type: 'Periodic' | 'Follow-up', pinMm: string) {
  await page.goto(`${app.baseUrl}/today`);
  const card = page.getByLabel(`Ride ${RIDE}`);
  await card.waitFor({ timeout: 30000 });
  const other = card.getByRole('button', { name: 'Another type of inspection…' });
  if (await other.count()) await other.click();
  else await card.getByRole('button', { name: 'Start inspection' }).click();
  await card.getByRole('radio', { name: type, exact: true }).click();
  await page.waitForURL('**/inspect/**');

  const na = page.getByRole('radio', { name: /^Not applicable: / });
  await na.first().waitFor();
  const n = await na.count();
  for (let i = 0; i < n; i++) await na.nth(i).click();

  await page.getByRole('radio', { name: 'Readings' }).click();
  await page.getByRole('textbox', { name: 'Pin diameter' }).first().fill(pinMm);
  await page.getByRole('radio', { name: 'Micrometer' }).first().click();
  await page
    .getByRole('radio', { name: /^Outside micrometer/ })
    .first()
    .click();
  await page
    .getByRole('button', { name: /^Add pin diameter/ })
    .first()
    .click();
  await page
    .getByText(/1 reading/)
    .first()
    .waitFor();

  await page.getByRole('radio', { name: 'Submit' }).click();
  await page.getByText('Ready to submit').waitFor();
  await page.getByRole('checkbox', { name: /make this declaration/ }).click();
  await page.getByRole('button', { name: 'Submit inspection' }).click();
  await page.waitForURL('**/today');
  await page.getByRole('button', { name: /Sync now/ }).click();
  await page.getByText('Everything is sent').waitFor({ timeout: 60000 });
}

/** The newest inspection of the ride the inspector sent, once the server has analysed it. */
async function newestInspection(type: string) {
  type Item = { id: string; rideName?: string; type: string; submittedAt: string };
  for (let i = 0; i < 100; i++) {
    const list = await api<{ inspections: Item[] }>('/api/inspections?mine=1', 'inspector@pivotwatch.test');
    const found = list.inspections
      .filter((x) => x.type === type)
      .sort((a, b) => b.submittedAt.localeCompare(a.submittedAt))[0];
    if (found) {
      const detail = await api<{ inspection: { analysis: { envelope: { status: string }[] } | null } }>(
        `/api/inspections/${found.id}`,
        'supervisor@pivotwatch.test',
      );
      if (detail.inspection.analysis) return { id: found.id, envelope: detail.inspection.analysis.envelope };
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`no analysed ${type} inspection`);
}

test('over-limit pin → stop in the decision → corrective action → verified → follow-up → back in service', async () => {
  const rides = await api<{ rides: { id: string; name: string; status: string; operatorName: string }[] }>(
    `/api/rides?q=${encodeURIComponent(RIDE)}`,
    'supervisor@pivotwatch.test',
  );
  const ride = rides.rides.find((r) => r.name === RIDE)!;
  expect(ride.status).toBe('in_service');
  const operatorEmail =
    ride.operatorName === 'Tamsworth Pier Leisure' ? 'operator@pivotwatch.test' : 'operator2@pivotwatch.test';
  const noticesOfRide = () =>
    api<NoticeList>(`/api/notices?rideId=${ride.id}&pageSize=100`, 'supervisor@pivotwatch.test');
  const noticesBefore = (await noticesOfRide()).total;

  // ——— the inspector's phone: a pin worn under its minimum ———
  const phone = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await phone.waitForURL('**/today');
  await phone.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await recordPinInspection(phone, 'Periodic', '89.05');
  const first = await newestInspection('periodic');
  // 89.05 mm against a 89.3 mm minimum: over its limit in the server's own analysis.
  expect(first.envelope.some((e) => e.status === 'over')).toBe(true);

  // ——— the supervisor: a finding, and the stop as part of the approval ———
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.goto(`${app.baseUrl}/review/${first.id}`);
  await desk.getByRole('button', { name: 'Add finding' }).click();
  const form = desk.getByLabel('New finding');
  await form.getByRole('radio', { name: 'Stop now' }).click();
  await form.getByLabel('What was found').fill('Main pivot pin worn to 89.05 mm, under its 89.3 mm minimum.');
  await form
    .getByLabel('Required action')
    .fill('Replace the main pivot pin and bushings; measure the new pin.');
  await form.getByRole('button', { name: 'Add finding' }).click();
  await form.waitFor({ state: 'detached' });
  await desk.getByText('Saving…').waitFor({ state: 'detached' });
  // Approving while the ride runs is refused on the page: the finding and the value are listed.
  await desk.getByRole('button', { name: 'Approve inspection' }).click();
  const warning = desk.getByRole('alert').filter({ hasText: 'Stop the ride with this approval' });
  await warning.waitFor();
  await warning.getByText(/over its limit/).waitFor();
  await screenshot(desk, 'verdict-approve-warning-desktop');
  await warning.getByRole('button', { name: 'Set out of service with this decision' }).click();
  await desk.getByLabel('Reason for the status').fill('Main pivot pin under its minimum diameter.');
  await desk.getByRole('button', { name: 'Approve inspection' }).click();
  await desk
    .getByText(/Approved by Mira Delacourt/)
    .first()
    .waitFor({ timeout: 15000 });
  // The desk shows the ride stopped, with the reason, as soon as the decision is back.
  await desk.getByText('Main pivot pin under its minimum diameter.').first().waitFor({ timeout: 15000 });
  await desk
    .getByText('Returns to service when its follow-up inspection is approved', { exact: false })
    .waitFor();
  await screenshot(desk, 'verdict-approved-stopped-desktop');

  // One decision, one notice: the stop, its reason, the finding and the value behind it.
  const afterStop = await noticesOfRide();
  expect(afterStop.total).toBe(noticesBefore + 1);
  const stopNotice = afterStop.notices[0];
  expect(stopNotice.inspectionId).toBe(first.id);
  const stopDoc = (await api<NoticeDoc>(`/api/notices/${stopNotice.id}`, operatorEmail)).notice.document;
  expect(stopDoc.operatingStatus.status).toBe('out_of_service');
  expect(stopDoc.operatingStatus.reason).toMatch(/^Main pivot pin under its minimum diameter\. — Because of/);
  expect(stopDoc.operatingStatus.reason).toMatch(/finding \d+ \(Stop now\)/);
  expect(stopDoc.operatingStatus.reason).toMatch(/over limit/);
  expect(stopDoc.results.some((r) => r.status === 'over')).toBe(true);
  expect(stopDoc.reinspection.required).toBe(true);
  expect(stopDoc.findings).toHaveLength(1);
  const findingNumber = stopDoc.findings[0].number;

  // ——— the operator: acknowledges once, reports the corrective action ———
  const ops = await app.openPage('phone');
  // As from the e-mailed link: the notice asks for sign-in, then opens.
  await ops.goto(`${app.baseUrl}/notices/${stopNotice.id}`);
  await ops.waitForURL(/\/sign-in/);
  await ops.getByLabel('E-mail').fill(operatorEmail);
  await ops.getByLabel('Password').fill(DEMO_PASSWORD);
  await ops.getByRole('button', { name: 'Sign in' }).click();
  await ops.waitForURL(`**/notices/${stopNotice.id}`);
  await ops.getByRole('button', { name: 'Acknowledge receipt' }).click();
  await ops
    .getByText(/Acknowledged by/)
    .first()
    .waitFor();
  await ops.getByRole('button', { name: `Report corrective action on finding ${findingNumber}` }).click();
  await ops.getByLabel('What was done').fill('New main pivot pin fitted (maker’s part), bushings replaced.');
  await ops.getByRole('button', { name: 'Send corrective action' }).click();
  await ops.getByLabel('State: Action reported').first().waitFor({ timeout: 15000 });
  await screenshot(ops, 'verdict-operator-action-phone');

  // ——— the inspector verifies: the note is required; the operator's report is the evidence ———
  await phone.goto(`${app.baseUrl}/notices/${stopNotice.id}`);
  await phone.getByRole('button', { name: `Verify and close finding ${findingNumber}` }).click();
  await phone.getByRole('button', { name: 'Close finding', exact: true }).click();
  await phone.getByText('Say what you checked and found').waitFor();
  await phone.getByLabel('Verification note').fill('New pin seen fitted; measured 89.98 mm.');
  await phone.getByRole('button', { name: 'Close finding', exact: true }).click();
  await phone.getByText('RIDE STATUS NOW').waitFor({ timeout: 15000 });
  await screenshot(phone, 'verdict-verified-phone');
  // Closing does not put the ride back in service, and issues no notice.
  expect((await noticesOfRide()).total).toBe(noticesBefore + 1);
  const stopped = await api<{ ride: { status: string } }>(
    `/api/rides/${ride.id}`,
    'supervisor@pivotwatch.test',
  );
  expect(stopped.ride.status).toBe('out_of_service');

  // ——— the follow-up on the inspector's Today, done and approved ———
  await syncPhone(phone);
  await phone
    .getByLabel(`Ride ${RIDE}`)
    .getByText(/Assigned: Follow-up/)
    .waitFor({ timeout: 30000 });
  await screenshot(phone, 'verdict-follow-up-today-phone');
  await recordPinInspection(phone, 'Follow-up', '89.98');
  const followUp = await newestInspection('follow_up');
  expect(followUp.envelope.every((e) => e.status !== 'over')).toBe(true);

  await desk.goto(`${app.baseUrl}/review/${followUp.id}`);
  await desk.getByRole('button', { name: 'Approve inspection' }).click();
  await desk
    .getByText(/Approved by Mira Delacourt/)
    .first()
    .waitFor({ timeout: 15000 });
  await screenshot(desk, 'verdict-follow-up-approved-desktop');

  const back = await api<{ ride: { status: string } }>(`/api/rides/${ride.id}`, 'supervisor@pivotwatch.test');
  expect(back.ride.status).toBe('in_service');
  // Two decisions, two notices: the stop, and the return to service with the follow-up.
  const finalNotices = await noticesOfRide();
  expect(finalNotices.total).toBe(noticesBefore + 2);
  const returnDoc = (await api<NoticeDoc>(`/api/notices/${finalNotices.notices[0].id}`, operatorEmail)).notice
    .document;
  expect(returnDoc.operatingStatus.status).toBe('in_service');
  expect(returnDoc.reinspection.required).toBe(false);
  // The follow-up has left the inspector's Today.
  const mine = await api<{ assignments: { rideId: string; inspectionType: string }[] }>(
    '/api/assignments/mine',
    'inspector@pivotwatch.test',
  );
  expect(mine.assignments.some((a) => a.rideId === ride.id && a.inspectionType === 'follow_up')).toBe(false);
});
