/**
 * On a phone (390×844), the operator of Corvane Travelling Shows opens a notice with a finding and the
 * inspection's results (the demo's over-limit Tidebreaker inspection, approved by the supervisor through
 * the API), reads what it asks and acknowledges it without scrolling past the results, which stay folded.
 * On the way, the browser tab's title (document.title) is checked on the routes passed through: the
 * title pattern is issue 17's own example ("Tidebreaker — Review · Pivotwatch"); WCAG 2.2 SC 2.4.2
 * "Page Titled" asks for a title that describes the page (from memory).
 */
import {
  DEMO_PASSWORD,
  apiGet,
  apiToken,
  screenshot,
  serverAndBrowser,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser({ NODE_ENV: 'development' });

/** The supervisor adds a finding to Tidebreaker's submitted inspection and approves it: one notice. */
async function issueTidebreakerNotice(): Promise<{ noticeId: string; inspectionId: string }> {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const headers = { authorization: `Bearer ${token}`, 'content-type': 'application/json' };
  const { inspections } = await apiGet<{
    inspections: { id: string; rideName: string; reviewState: string }[];
  }>(app.baseUrl, '/api/inspections?pageSize=100', token);
  const inspection = inspections.find((i) => i.rideName === 'Tidebreaker' && i.reviewState === 'submitted');
  expect(inspection).toBeDefined();
  const finding = await fetch(`${app.baseUrl}/api/inspections/${inspection!.id}/findings`, {
    method: 'POST',
    headers,
    body: JSON.stringify({
      severity: 'fix_before_operation',
      description: 'Main arm runs at 6.7 rpm against a design 6.0 rpm.',
      requiredAction: 'Reset the drive controller to the design programme.',
      dueOn: '2027-01-10',
    }),
  });
  expect(finding.status).toBe(201);
  const decision = await fetch(`${app.baseUrl}/api/inspections/${inspection!.id}/decision`, {
    method: 'POST',
    headers,
    body: JSON.stringify({
      decision: 'approve',
      note: null,
      rideStatus: { status: 'out_of_service', reason: 'Drive runs over its design speed.' },
    }),
  });
  expect(decision.status).toBe(200);
  const { notice } = (await decision.json()) as { notice: { id: string } | null };
  expect(notice).not.toBeNull();
  return { noticeId: notice!.id, inspectionId: inspection!.id };
}

const titleIs = async (page: import('playwright-core').Page, title: string) =>
  page.waitForFunction((t) => document.title === t, title, { timeout: 15_000 });

test('an operator on a phone acknowledges a notice above its folded results; every page names the tab', async () => {
  const { noticeId, inspectionId } = await issueTidebreakerNotice();

  // The supervisor's review page names the ride first (the issue's example).
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await titleIs(desk, 'Review · Pivotwatch');
  await desk.goto(`${app.baseUrl}/review/${inspectionId}`);
  await titleIs(desk, 'Tidebreaker — Review · Pivotwatch');

  const phone = await app.openPage('phone');
  await phone.goto(`${app.baseUrl}/sign-in`);
  await titleIs(phone, 'Sign in · Pivotwatch');
  await phone.getByLabel('E-mail').fill('operator2@pivotwatch.test');
  await phone.getByLabel('Password').fill(DEMO_PASSWORD);
  await phone.getByRole('button', { name: 'Sign in' }).click();
  await phone.waitForURL('**/my-rides');
  await titleIs(phone, 'My rides · Pivotwatch');
  await phone.goto(`${app.baseUrl}/notices`);
  await titleIs(phone, 'Notices · Pivotwatch');

  await phone.goto(`${app.baseUrl}/notices/${noticeId}`);
  const acknowledge = phone.getByRole('button', { name: 'Acknowledge receipt' });
  await acknowledge.waitFor();
  await titleIs(
    phone,
    `${await phone.getByRole('heading', { level: 1, name: /^PW-\d{4}-\d{4}$/ }).innerText()} — Notice · Pivotwatch`,
  );

  // What it asks comes first; Acknowledge is above the folded results, whose rows are not drawn at all.
  const summary = phone.getByLabel('What this notice asks');
  await summary.getByText('Reset the drive controller to the design programme.').waitFor();
  const fold = phone.getByRole('button').filter({ hasText: /Show the full results \(\d+ values?/ });
  const ackBox = (await acknowledge.boundingBox())!;
  const foldBox = (await fold.boundingBox())!;
  expect(ackBox.y).toBeLessThan(foldBox.y);
  // Within the second screen of a 844 px phone (before: about eight screens of results down).
  expect(ackBox.y + ackBox.height).toBeLessThan(2 * 844);
  expect(await phone.getByRole('table', { name: 'Results against design limits' }).count()).toBe(0);
  await screenshot(phone, 'notice-phone-summary');

  await acknowledge.click();
  await phone
    .getByText(/Acknowledged by Owen Falgrave/)
    .first()
    .waitFor();
  // Nothing was unfolded on the way: the results are still behind their disclosure.
  expect(await fold.getAttribute('aria-expanded')).toBe('false');
  expect(await phone.evaluate(() => window.scrollY + document.scrollingElement!.scrollTop)).toBeLessThan(
    2 * 844,
  );

  // The results are there for whoever asks.
  await fold.click();
  await phone.getByText('RESULTS AGAINST DESIGN LIMITS').waitFor();

  // A page that does not exist says so in its tab.
  await phone.goto(`${app.baseUrl}/no/such/page`);
  await titleIs(phone, 'Page not found · Pivotwatch');
});
