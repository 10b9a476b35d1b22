import { mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Browser, type Page, chromium } from 'playwright-core';

import { launchOptions } from '@/scripts/browser';
import { startLocalServer } from '@/scripts/local-server';
import { newPhoneKey, signedBatch } from '@/tests/support/phone-keys';

export const ROOT = join(__dirname, '..', '..', '..');
export const SHOTS = join(ROOT, 'artifacts', 'screenshots');
export const DEMO_PASSWORD = 'pivotwatch-demo';

export const sizes = {
  phone: { width: 390, height: 844 },
  desktop: { width: 1440, height: 900 },
} as const;
export type SizeName = keyof typeof sizes;

export type Running = { baseUrl: string; dataDir: string; stop: () => Promise<void> };

/** Starts the real server on a free loopback port with an empty temporary DATA_DIR (scripts/local-server.ts). */
export async function startPivotwatch(env: Record<string, string> = {}): Promise<Running> {
  const { baseUrl, dataDir, stop } = await startLocalServer({
    env: { NODE_ENV: 'test', ...env },
    timeoutMs: 60_000,
  });
  return { baseUrl, dataDir, stop };
}

export async function launchBrowser(extraArgs: string[] = []): Promise<Browser> {
  return chromium.launch(launchOptions(extraArgs));
}

export async function openPage(browser: Browser, size: SizeName): Promise<Page> {
  const context = await browser.newContext({ viewport: sizes[size], deviceScaleFactor: 1 });
  const page = await context.newPage();
  page.on('pageerror', (err) => console.error(`[page error] ${err.message}`));
  return page;
}

export async function signIn(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** A session token for an account, through the API (for checks behind the browser's back). */
export async function apiToken(baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  return ((await res.json()) as { token: string }).token;
}

/**
 * POST /api/sync/push as a phone sends it: a new phone key (tests/support/phone-keys.ts, @noble/curves)
 * registered for the token's person, each record signed with it. Answers the response.
 */
export async function pushAsPhone(baseUrl: string, token: string, records: unknown[]): Promise<Response> {
  const key = newPhoneKey();
  const registered = await fetch(`${baseUrl}/api/devices/keys`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
    body: JSON.stringify({ publicKey: key.publicKey, label: 'Test phone' }),
  });
  expect(registered.status).toBe(201);
  return fetch(`${baseUrl}/api/sync/push`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
    body: JSON.stringify(signedBatch(records, key)),
  });
}

/** GET an API path with a token; the answer's JSON, after checking it was a 200. */
export async function apiGet<T>(baseUrl: string, path: string, token: string): Promise<T> {
  const res = await fetch(`${baseUrl}${path}`, { headers: { authorization: `Bearer ${token}` } });
  expect(res.status).toBe(200);
  return (await res.json()) as T;
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: join(SHOTS, `${name}.png`) });
}

/** A browser file's server and browser, started before its first test and stopped after its last. */
export type ServerAndBrowser = {
  readonly baseUrl: string;
  readonly dataDir: string;
  readonly browser: Browser;
  /** Stops the server now (the browser stays); stopping again after the file is harmless. */
  stop: () => Promise<void>;
  /** A fresh server in place of the stopped one (a new port and an empty data folder). */
  restart: () => Promise<void>;
  /** A page in a context of its own at 390×844 ('phone') or 1440×900 ('desktop'). */
  openPage: (size: SizeName) => Promise<Page>;
  /** A page of its own, signed in through the sign-in form. */
  signedIn: (size: SizeName, email: string, password?: string) => Promise<Page>;
};

/**
 * Starts the real server (with `env`) and Debian's chromium for the calling test file, and stops both
 * after it. Call it at the top of the file; read its fields inside tests and hooks. `browserArgs`: more
 * chromium switches, worked out once the server runs (e.g. a fake camera playing a file made for it).
 */
export function serverAndBrowser(
  env: Record<string, string> = {},
  opts: { browserArgs?: (baseUrl: string) => Promise<string[]> } = {},
): ServerAndBrowser {
  let app: Running | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    app = await startPivotwatch(env);
    browser = await launchBrowser((await opts.browserArgs?.(app.baseUrl)) ?? []);
  });
  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });
  const running = (): Running => {
    if (!app) throw new Error('The server starts in beforeAll: use it inside a test or a hook.');
    return app;
  };
  const started = (): Browser => {
    if (!browser) throw new Error('The browser starts in beforeAll: use it inside a test or a hook.');
    return browser;
  };
  return {
    get baseUrl() {
      return running().baseUrl;
    },
    get dataDir() {
      return running().dataDir;
    },
    get browser() {
      return started();
    },
    stop: () => running().stop(),
    restart: async () => {
      await running().stop();
      app = await startPivotwatch(env);
    },
    openPage: (size) => openPage(started(), size),
    signedIn: async (size, email, password) => {
      const page = await openPage(started(), size);
      await signIn(page, running().baseUrl, email, password);
      // Signed in once the app leaves the sign-in page: a test that goes elsewhere sooner cancels the
      // sign-in and lands signed out. (A wrong password, given on purpose, stays on the page.)
      if (password === undefined)
        await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'), { timeout: 30_000 });
      return page;
    },
  };
}

/**
 * A real JPEG file to pick as a photo (the file chooser wants a path): chromium renders `text` on a
 * plain background, in a page of its own so the app's pages are not disturbed.
 */
export async function jpegPhoto(
  browser: Browser,
  text: string,
  look: { background: string; fontPx: number; name?: string },
): Promise<string> {
  const name = look.name ?? `${text.replace(/\W+/g, '-')}.jpg`;
  const file = join(mkdtempSync(join(tmpdir(), 'pivotwatch-photo-')), name);
  const p = await browser.newPage({ viewport: { width: 640, height: 480 } });
  await p.setContent(
    `<body style="margin:0;background:${look.background};font:${look.fontPx}px sans-serif;color:#fff">${text}</body>`,
  );
  await p.screenshot({ path: file, type: 'jpeg', quality: 80 });
  await p.close();
  return file;
}

/**
 * On the phone's Today page: starts a periodic inspection of a ride (choosing the type when the ride's
 * card asks for one) and waits for the recording page.
 */
export async function startPeriodicInspection(page: Page, rideName: string) {
  const card = page.getByLabel(`Ride ${rideName}`);
  await card.waitFor({ timeout: 30000 });
  await card
    .getByRole('button', { name: /Start inspection|Another type/ })
    .first()
    .click();
  if (await card.getByRole('radio', { name: 'Periodic' }).count())
    await card.getByRole('radio', { name: 'Periodic' }).click();
  await page.waitForURL('**/inspect/**');
}

/**
 * On the inspection's Readings step: types a reading of the first pivot, chooses how it was measured and
 * the instrument from the register (nothing is chosen for the inspector), then adds it.
 */
export async function addReading(
  page: Page,
  r: { field: string; value: string; method: string; instrument: RegExp; add: RegExp },
) {
  await page.getByRole('textbox', { name: r.field }).first().fill(r.value);
  await page.getByRole('radio', { name: r.method }).first().click();
  await page.getByRole('radio', { name: r.instrument }).first().click();
  await page.getByRole('button', { name: r.add }).first().click();
}

/** A swing amplitude by digital inclinometer and a period by stopwatch, as most walks record them. */
export const swingAmplitude = (value: string) => ({
  field: 'Swing amplitude (each side)',
  value,
  method: 'Gauge (feeler, caliper, angle)',
  instrument: /^Digital inclinometer, serial/,
  add: /^Add swing amplitude/,
});
export const swingPeriod = (value: string) => ({
  field: 'Period (one turn or one swing)',
  value,
  method: 'Stopwatch',
  instrument: /^Digital stopwatch, serial/,
  add: /^Add period/,
});
