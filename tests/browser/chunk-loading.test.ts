/**
 * How the web app's lazy chunks arrive (features/shell/lazy-screens.ts): a reload of a signed-in page
 * starts fetching the signed-in code before the server has confirmed the session (it used to wait for
 * that answer and the first render). Service workers are blocked in this context: playwright's routes do
 * not see what a worker answers.
 */
import type { BrowserContext, Page } from 'playwright-core';

import { DEMO_PASSWORD, serverAndBrowser, sizes } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
jest.setTimeout(120_000);

async function phoneWithoutWorker(): Promise<{ context: BrowserContext; page: Page }> {
  const context = await app.browser.newContext({
    viewport: sizes.phone,
    deviceScaleFactor: 1,
    serviceWorkers: 'block',
  });
  const page = await context.newPage();
  return { context, page };
}

async function signInAs(page: Page, email: string) {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

const reviewHeading = (page: Page) => page.getByRole('heading', { name: /^Review$/ }).first();

test('a reload of a signed-in page fetches its screens before the server has confirmed the session', async () => {
  const { context, page } = await phoneWithoutWorker();
  try {
    await page.goto(`${app.baseUrl}/sign-in`);
    await signInAs(page, 'supervisor@pivotwatch.test');
    await reviewHeading(page).waitFor();

    // Hold the session's confirmation (GET /api/me) until the shared chunk has been asked for. Before,
    // the chunks were fetched only after this answer, so the page would never show.
    let sharedAsked!: () => void;
    const shared = new Promise<void>((resolve) => (sharedAsked = resolve));
    page.on('request', (req) => {
      if (/\/__common-[0-9a-f]+\.js$/.test(new URL(req.url()).pathname)) sharedAsked();
    });
    let heldUntilShared = false;
    await page.route('**/api/me', async (route) => {
      heldUntilShared = await Promise.race([
        shared.then(() => true),
        new Promise<boolean>((resolve) => setTimeout(() => resolve(false), 20_000)),
      ]);
      await route.continue();
    });
    await page.reload();
    await reviewHeading(page).waitFor();
    expect(heldUntilShared).toBe(true);
  } finally {
    await context.close();
  }
});
