/**
 * How the web app's lazy chunks arrive (features/shell/lazy-screens.ts, lazy-screen.tsx, stale-build.web.ts):
 *  - a reload of a signed-in page starts fetching the signed-in code before the server has confirmed the
 *    session (it used to wait for that answer and the first render);
 *  - a deploy while someone is mid-visit, before the service worker holds the app: the chunks of the build
 *    their page started with are gone (404). The page reloads once to the new build and carries on; if the
 *    chunks still do not come, it says so plainly and reloads no more.
 * Service workers are blocked in these contexts: the cases are those before the worker holds the app, and
 * playwright's routes do not see what a worker answers.
 */
import type { BrowserContext, Page, Route } from 'playwright-core';

import { CHUNK_FAILED_MESSAGE } from '@/features/shell/stale-build.web';
import { DEMO_PASSWORD, serverAndBrowser, sizes } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
jest.setTimeout(120_000);

const CHUNKS = '/_expo/static/js/web/';
/** A lazy chunk (not the entry or Metro's runtime, which index.html loads). */
const isLazyChunk = (path: string) =>
  path.startsWith(CHUNKS) && !/\/(entry|__expo-metro-runtime)-[0-9a-f]+\.js$/.test(path);

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

/**
 * From now on the server has a new build: every page it sends names another entry script (the same code
 * under a new address), and the old build's lazy chunks answer 404 while `chunksGone()` says so.
 * Returns how many pages (documents) were asked for since.
 */
async function deploy(page: Page, chunksGone: () => boolean): Promise<{ documents: () => number }> {
  let documents = 0;
  await page.route('**/*', async (route: Route) => {
    const request = route.request();
    const url = new URL(request.url());
    if (isLazyChunk(url.pathname) && chunksGone()) {
      await route.fulfill({ status: 404, contentType: 'text/plain', body: 'Not found' });
      return;
    }
    const asksForPage =
      request.resourceType() === 'document' ||
      (request.resourceType() === 'fetch' && !url.pathname.startsWith('/api/'));
    if (!asksForPage) {
      await route.continue();
      return;
    }
    if (request.resourceType() === 'document') documents += 1;
    const response = await route.fetch();
    const html = await response.text();
    await route.fulfill({
      response,
      body: html.replace(/(\/entry-[0-9a-f]+\.js)"/, '$1?build=2"'),
    });
  });
  return { documents: () => documents };
}

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

test("a deploy mid-visit: the old build's chunks are gone, the page reloads once to the new build and goes on", async () => {
  const { context, page } = await phoneWithoutWorker();
  try {
    await page.goto(`${app.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    let reloaded = false;
    const served = await deploy(page, () => !reloaded);
    page.on('framenavigated', (frame) => {
      if (frame === page.mainFrame() && served.documents() > 0) reloaded = true;
    });
    await signInAs(page, 'supervisor@pivotwatch.test');
    await reviewHeading(page).waitFor({ timeout: 60_000 });
    expect(served.documents()).toBe(1);
    // The page runs the new build now.
    const entry = await page.evaluate(
      () => document.querySelector('script[src*="/entry-"]')?.getAttribute('src') ?? '',
    );
    expect(entry).toMatch(/\?build=2$/);
  } finally {
    await context.close();
  }
});

test('chunks that still fail after that one reload: a plain message, and no more reloads', async () => {
  const { context, page } = await phoneWithoutWorker();
  try {
    await page.goto(`${app.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    const served = await deploy(page, () => true);
    await signInAs(page, 'supervisor@pivotwatch.test');
    await page.getByText(CHUNK_FAILED_MESSAGE).first().waitFor({ timeout: 60_000 });
    // Still one reload a few seconds on (a loop would have asked for the page again by now).
    await page.waitForTimeout(3000);
    expect(served.documents()).toBe(1);
    await expect(page.getByText(CHUNK_FAILED_MESSAGE).first().isVisible()).resolves.toBe(true);
  } finally {
    await context.close();
  }
});
