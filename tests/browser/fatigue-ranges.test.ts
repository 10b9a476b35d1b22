/**
 * The review desk in the real app: a seeded Skylark inspection (invented demo design data with fatigue
 * details) shows each pivot's force ranges along and across its body, naming the body's frame, and the
 * fatigue table per detail with the standards named and the caution; at desktop and phone size.
 */

import { screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

// Development mode seeds the demo's submitted inspections for the desk.
const app = serverAndBrowser({ NODE_ENV: 'development' });

test('desk: a seeded inspection’s ranges in the body’s frame and its fatigue per detail', async () => {
  for (const size of ['desktop', 'phone'] as const) {
    const desk = await app.signedIn(size, 'supervisor@pivotwatch.test');
    await desk.waitForURL('**/review');
    await desk.goto(`${app.baseUrl}/review?q=Skylark`);
    await desk
      .getByRole('link', { name: /Skylark/ })
      .first()
      .click();
    await desk.waitForURL(/\/review\/[^/?]+$/);

    const loads = desk.getByLabel('Peak pivot loads');
    await loads.waitFor({ timeout: 30000 });
    await loads
      .getByText(/ \/ [\s\S]*\(.+ frame\)$/)
      .first()
      .waitFor();
    await loads.scrollIntoViewIfNeeded();
    await screenshot(desk, `review-ranges-${size}`);

    const fatigue = desk.getByLabel('Fatigue per detail');
    await fatigue.waitFor({ timeout: 30000 });
    await fatigue
      .getByText(/Operating cycle: /)
      .first()
      .waitFor();
    await desk
      .getByText(/ASTM E1049-85/)
      .first()
      .waitFor();
    await desk
      .getByText(/EN 1993-1-9 §7/)
      .first()
      .waitFor();
    await fatigue.scrollIntoViewIfNeeded();
    await screenshot(desk, `review-fatigue-${size}`);
    await desk.context().close();
  }
});
