/**
 * The review queue from the keyboard, against the real server and web export with the demo scenario: a
 * supervisor at a desk (1440×900) lists the keys with ?, moves the highlight with j/j/k, opens the
 * highlighted inspection with Enter and starts an approval with a, which brings the decision forward and
 * approves nothing. On the way, the queue's columns: every date on one line and the demo's site and
 * operator names whole, at 1440 and at 1024 px wide.
 *
 * References: WCAG 2.1 SC 2.1.4 (character key shortcuts), WAI-ARIA 1.2 and the APG's dialog pattern
 * (a modal dialog is labelled and Escape closes it), HTML (Enter on a focused link follows it).
 * j/k, Enter/o and ? are common practice on mail and review desks (from memory).
 */
import type { Page } from 'playwright-core';

import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

// Development mode seeds the demo scenario's submitted inspections.
const app = serverAndBrowser({ NODE_ENV: 'development' });

const table = (page: Page) => page.getByRole('table', { name: 'Review queue' });
const rowLinks = (page: Page) => table(page).getByRole('link');

/** Every date the table shows ("3 Dec 2026", lib/dates.ts), with its box and whether its text is cut. */
async function dateBoxes(page: Page) {
  return table(page).evaluate((el) =>
    Array.from(el.querySelectorAll('div[dir], div'))
      .filter((d) => d.children.length === 0 && /^\d{1,2} [A-Z][a-z]{2} \d{4}$/.test(d.textContent ?? ''))
      .map((d) => ({
        text: d.textContent,
        height: d.getBoundingClientRect().height,
        lineHeight: parseFloat(getComputedStyle(d).lineHeight),
        cut: d.scrollWidth > d.clientWidth + 1,
      })),
  );
}

/** The boxes of the table's texts equal to `name`: whether each is cut (an ellipsis or a line clamp). */
async function nameBoxes(page: Page, name: string) {
  return table(page).evaluate(
    (el, wanted) =>
      Array.from(el.querySelectorAll('div'))
        .filter((d) => d.children.length === 0 && d.textContent === wanted)
        .map((d) => ({
          cut: d.scrollWidth > d.clientWidth + 1 || d.scrollHeight > d.clientHeight + 1,
          visible: d.getBoundingClientRect().width > 0,
        })),
    name,
  );
}

async function expectColumnsFit(page: Page) {
  const dates = await dateBoxes(page);
  expect(dates.length).toBeGreaterThan(0);
  for (const d of dates) {
    // One line: the box is one line-height tall (22 px for the figure font), and nothing is cut.
    expect(d.height).toBeLessThan(d.lineHeight * 1.5);
    expect(d.cut).toBe(false);
  }
  // The demo's longest site and operator names, shown whole (lib: server/seed/demo.ts).
  for (const name of ['Lowfield Common fairground', 'Corvane Travelling Shows', 'Tamsworth Pier Leisure']) {
    const boxes = await nameBoxes(page, name);
    expect(boxes.length).toBeGreaterThan(0);
    for (const b of boxes) expect(b).toEqual({ cut: false, visible: true });
  }
}

test('? lists the keys, j/j/k highlight, Enter opens, a starts an approval without approving; columns fit', async () => {
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await rowLinks(desk).nth(2).waitFor({ timeout: 30000 });

  // Columns that fit at 1440×900 and at 1024 px.
  await expectColumnsFit(desk);
  await screenshot(desk, 'queue-columns-desktop');
  await desk.setViewportSize({ width: 1024, height: 768 });
  await table(desk)
    .getByRole('columnheader', { name: /Ride · site · operator/i })
    .waitFor();
  await expectColumnsFit(desk);
  await screenshot(desk, 'queue-columns-1024');
  await desk.setViewportSize({ width: 1440, height: 900 });
  await table(desk)
    .getByRole('columnheader', { name: /Past due/i })
    .waitFor();

  // ? opens the list of keys: a labelled modal dialog; Escape closes it.
  await desk.keyboard.press('?');
  const help = desk.getByRole('dialog', { name: 'Keyboard shortcuts' });
  await help.waitFor();
  for (const words of ['Highlight the next item', 'Highlight the previous item', 'Open the highlighted item'])
    await help.getByText(words).waitFor();
  await screenshot(desk, 'queue-keyboard-help-desktop');
  await desk.keyboard.press('Escape');
  await help.waitFor({ state: 'detached' });
  // The visible button opens it too.
  await desk.getByRole('button', { name: 'Keyboard shortcuts' }).click();
  await help.waitFor();
  await help.getByRole('button', { name: 'Close' }).click();
  await help.waitFor({ state: 'detached' });

  // j, j, k: the highlight on the first row, marked current, its link focused.
  await desk.locator('body').click({ position: { x: 600, y: 60 } });
  for (const key of ['j', 'j', 'k']) await desk.keyboard.press(key);
  const first = rowLinks(desk).first();
  await expect(table(desk).getByRole('row').nth(1).getAttribute('aria-current')).resolves.toBe('true');
  expect(await table(desk).locator('[aria-current="true"]').count()).toBe(1);
  expect(await first.evaluate((el) => el === document.activeElement)).toBe(true);
  const href = await first.getAttribute('href');
  expect(href).toMatch(/^\/review\/[^/]+$/);
  await screenshot(desk, 'queue-keyboard-highlight-desktop');

  // Enter opens it.
  await desk.keyboard.press('Enter');
  await desk.waitForURL(`**${href}`);
  const inspectionId = (href as string).split('/').pop() as string;
  const approve = desk.getByRole('button', { name: 'Approve inspection' });
  await approve.waitFor({ timeout: 30000 });

  // a brings the approval forward, focused on its button, and approves nothing.
  await desk.keyboard.press('a');
  await desk.getByText(/Nothing is approved until you do/).waitFor();
  expect(await approve.evaluate((el) => el === document.activeElement)).toBe(true);
  await screenshot(desk, 'queue-keyboard-approve-desktop');
  await desk.waitForTimeout(500);
  const token = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const detail = await apiGet<{ inspection: { reviewState: string } }>(
    app.baseUrl,
    `/api/inspections/${inspectionId}`,
    token,
  );
  expect(detail.inspection.reviewState).toBe('submitted');
});
