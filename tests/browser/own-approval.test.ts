/**
 * A supervisor who recorded an inspection themselves opens it on the review desk: Approve is not offered,
 * the desk says why and that returning it is still possible (the inspection body's default, server-side in
 * server/review/self-approval.ts). Desktop (1440×900) and phone (390×844). An administrator then allows it
 * from the review desk, and the supervisor is offered Approve. Names are the invented demo's.
 */
import type { DesignData } from '@/features/loads/design-schema';
import { apiGet, apiToken, pushAsPhone, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';
import { makeRecord } from '@/tests/server/sync-fixtures';

const app = serverAndBrowser();

test('the desk explains why a supervisor cannot approve their own inspection, at desk and phone size', async () => {
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const { rides } = await apiGet<{ rides: { id: string; name: string }[] }>(app.baseUrl, '/api/rides', token);
  const skylark = rides.find((r) => r.name === 'Skylark');
  if (!skylark) throw new Error('no demo ride Skylark');
  const { design } = await apiGet<{ design: { id: string; data: DesignData } }>(
    app.baseUrl,
    `/api/rides/${skylark.id}/design`,
    token,
  );
  // Recorded and sent by the supervisor's own phone.
  const record = makeRecord({ id: skylark.id, designVersionId: design.id, design: design.data });
  const pushed = await pushAsPhone(app.baseUrl, token, [record]);
  expect(((await pushed.json()) as { results: { status: string }[] }).results[0].status).toBe('accepted');

  for (const size of ['desktop', 'phone'] as const) {
    const page = await app.signedIn(size, 'supervisor@pivotwatch.test');
    await page.goto(`${app.baseUrl}/review/${record.id}`);
    const why = page.getByTestId('approval-refusal');
    await why.waitFor({ timeout: 30_000 });
    expect(await why.textContent()).toMatch(
      /You recorded this inspection, so another supervisor must approve it/,
    );
    expect(await page.getByRole('button', { name: 'Approve inspection' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Return to inspector' }).waitFor();
    await why.scrollIntoViewIfNeeded();
    await screenshot(page, `own-approval-${size}`);
    await page.context().close();
  }

  // An administrator allows it from the review desk; the supervisor's desk then offers Approve.
  const admin = await app.signedIn('desktop', 'admin@pivotwatch.test');
  await admin.goto(`${app.baseUrl}/review`);
  const allow = admin.getByRole('checkbox', { name: 'Supervisors may approve inspections they recorded' });
  await allow.waitFor({ timeout: 30_000 });
  expect(await allow.getAttribute('aria-checked')).toBe('false');
  await allow.click();
  await admin.getByText(/^Changed .* by Rowan Ashby$/).waitFor();
  expect(await allow.getAttribute('aria-checked')).toBe('true');
  await allow.scrollIntoViewIfNeeded();
  await screenshot(admin, 'own-approval-setting-desktop');

  const desk = await app.signedIn('phone', 'supervisor@pivotwatch.test');
  await desk.goto(`${app.baseUrl}/review/${record.id}`);
  await desk.getByRole('button', { name: 'Approve inspection' }).waitFor({ timeout: 30_000 });
  expect(await desk.getByTestId('approval-refusal').count()).toBe(0);
});
