/**
 * What a phone downloads from the web export, measured in Debian's chromium: the bytes of each response as
 * they came over the wire (headers and compressed body: CDP's `Network.loadingFinished.encodedDataLength`,
 * which playwright reports as `request.sizes()`), split into JavaScript, fonts and everything else, and
 * kept apart for the page and for its service worker (whose precaching runs in the background).
 * Used by `scripts/bench-web.ts` (figures beside the goals) and `tests/browser/budget.test.ts` (the sizes,
 * which are deterministic for a build, asserted).
 */
import type { Browser, BrowserContext, Page, Request } from 'playwright-core';

export const PHONE = { width: 390, height: 844 } as const;
export const DEMO_PASSWORD = 'pivotwatch-demo';

/** Issue #16's goals (its "Goals" table), in bytes (1 KB = 1,000 bytes, as the issue counts) and seconds. */
export const GOALS = {
  jsBeforeSignIn: 400_000,
  allBeforeSignIn: 550_000,
  inspectorTodayFirstVisit: 1_000_000,
  offlineReloadSeconds: 1.0,
} as const;

export type Kind = 'js' | 'fonts' | 'other';
export type Transfer = { js: number; fonts: number; other: number; total: number; requests: number };
type Entry = { at: number; url: string; kind: Kind; bytes: number; byWorker: boolean; fromCache: boolean };

export function kindOf(url: string, resourceType: string): Kind {
  const path = new URL(url).pathname;
  if (resourceType === 'font' || /\.(ttf|otf|woff2?)$/i.test(path)) return 'fonts';
  if (resourceType === 'script' || /\.m?js$/i.test(path)) return 'js';
  return 'other';
}

function sum(entries: Entry[]): Transfer {
  const t: Transfer = { js: 0, fonts: 0, other: 0, total: 0, requests: entries.length };
  for (const e of entries) {
    t[e.kind] += e.bytes;
    t.total += e.bytes;
  }
  return t;
}

/**
 * Every finished request of one browser context (its pages, their dedicated workers and its service
 * worker), with the time it finished. Answers served from the service worker's cache crossed no network
 * and count zero bytes.
 */
export class TransferLog {
  private entries: Entry[] = [];
  private pending = new Set<Promise<void>>();
  private inFlight = 0;
  private lastActivity = Date.now();

  constructor(context: BrowserContext) {
    context.on('request', () => {
      this.inFlight += 1;
      this.lastActivity = Date.now();
    });
    context.on('requestfailed', () => this.settle());
    context.on('requestfinished', (request) => {
      const done = this.record(request).finally(() => {
        this.pending.delete(done);
        this.settle();
      });
      this.pending.add(done);
    });
  }

  private settle() {
    this.inFlight = Math.max(0, this.inFlight - 1);
    this.lastActivity = Date.now();
  }

  private async record(request: Request) {
    const at = Date.now();
    const url = request.url();
    if (!/^https?:/.test(url)) return;
    const response = await request.response();
    const sizes = await request.sizes().catch(() => null);
    const fromCache = response?.fromServiceWorker() ?? false;
    // A dedicated worker's script (the device database's) arrives over the network with its headers, yet
    // CDP reports its body as 0 bytes: its declared length is what crossed. (A hit in the HTTP cache has no
    // header bytes either and stays 0.)
    const declared = Number((await response?.headerValue('content-length').catch(() => null)) ?? 0);
    const body =
      sizes && sizes.responseBodySize === 0 && sizes.responseHeadersSize > 0 && response?.status() === 200
        ? declared
        : (sizes?.responseBodySize ?? 0);
    const bytes = fromCache || !sizes ? 0 : sizes.responseHeadersSize + body;
    this.entries.push({
      at,
      url,
      kind: kindOf(url, request.resourceType()),
      bytes,
      byWorker: request.serviceWorker() !== null,
      fromCache,
    });
  }

  /** Waits for the sizes of every request finished so far. */
  async flush(): Promise<void> {
    while (this.pending.size) await Promise.all([...this.pending]);
  }

  /** Resolves once no request has been in flight for `quietMs` (or after `timeoutMs`, whichever first). */
  async idle(quietMs = 800, timeoutMs = 60_000): Promise<void> {
    const deadline = Date.now() + timeoutMs;
    while (Date.now() < deadline) {
      if (this.inFlight === 0 && Date.now() - this.lastActivity >= quietMs) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    await this.flush();
  }

  /**
   * Network bytes of requests that finished after `from` and by `to` (ms since the epoch): by the page and
   * its dedicated workers (`page`), by the service worker (`worker`), or both (the default).
   */
  between(from: number, to: number, by: 'page' | 'worker' | 'both' = 'both'): Transfer {
    return sum(
      this.entries.filter(
        (e) =>
          !e.fromCache && e.at > from && e.at <= to && (by === 'both' || (by === 'worker') === e.byWorker),
      ),
    );
  }

  /**
   * The service worker's bytes per file that the page also asked for by `to`: when the worker's precache
   * fetched a file first, the page got it from a cache (the worker's, or the HTTP cache the fetch filled)
   * for next to nothing, yet it waited for those bytes all the same.
   */
  private sharedByWorker(to: number): Map<string, number> {
    const asked = new Set(this.entries.filter((e) => !e.byWorker && e.at <= to).map((e) => e.url));
    const shared = new Map<string, number>();
    for (const e of this.entries)
      if (e.byWorker && !e.fromCache && e.at <= to && asked.has(e.url))
        shared.set(e.url, Math.max(shared.get(e.url) ?? 0, e.bytes));
    return shared;
  }

  /**
   * What the page needed by `to`: its own network bytes (and its dedicated workers'), each file counted
   * at least with the bytes the service worker fetched it with (see `sharedByWorker`).
   */
  needed(to: number): Transfer {
    const shared = this.sharedByWorker(to);
    const own = this.entries.filter((e) => !e.byWorker && e.at <= to);
    const counted = new Set<string>();
    const entries = own.map((e) => {
      const fromWorker = counted.has(e.url) ? 0 : (shared.get(e.url) ?? 0);
      counted.add(e.url);
      return { ...e, bytes: Math.max(e.fromCache ? 0 : e.bytes, fromWorker) };
    });
    return sum(entries);
  }

  /** The rest of the service worker's fetches: its precache of what the page had not asked for by `to`. */
  background(to: number): Transfer {
    const shared = this.sharedByWorker(to);
    return sum(this.entries.filter((e) => e.byWorker && !e.fromCache && !shared.has(e.url)));
  }

  /** The largest files, for reading a figure that missed its goal. */
  largest(n = 8): { url: string; kind: Kind; bytes: number; byWorker: boolean }[] {
    return [...this.entries]
      .filter((e) => !e.fromCache)
      .sort((a, b) => b.bytes - a.bytes)
      .slice(0, n)
      .map(({ url, kind, bytes, byWorker }) => ({ url: new URL(url).pathname, kind, bytes, byWorker }));
  }
}

/**
 * Phase 1 (everything transferred, the service worker's fetches included): `visible` until the sign-in
 * form is on screen; `settled` until the sign-in page is quiet (fonts that swap in late, a service worker
 * precaching before anyone signed in); `byWorker` the service worker's share of `settled`.
 */
export type SignInPhase = { visible: Transfer; settled: Transfer; byWorker: Transfer; log: TransferLog };

/** A fresh profile (no cache, no service worker, no storage) at phone size. */
export async function freshPhone(
  browser: Browser,
): Promise<{ context: BrowserContext; page: Page; log: TransferLog }> {
  const context = await browser.newContext({ viewport: PHONE, deviceScaleFactor: 1 });
  const log = new TransferLog(context);
  const page = await context.newPage();
  return { context, page, log };
}

export async function measureSignIn(browser: Browser, baseUrl: string): Promise<SignInPhase> {
  const { context, page, log } = await freshPhone(browser);
  try {
    await page.goto(`${baseUrl}/`);
    await page.getByLabel('E-mail').waitFor({ state: 'visible', timeout: 60_000 });
    const shownAt = Date.now();
    await log.flush();
    const visible = log.between(0, shownAt);
    await log.idle();
    return {
      visible,
      settled: log.between(0, Infinity),
      byWorker: log.between(0, Infinity, 'worker'),
      log,
    };
  } finally {
    await context.close();
  }
}

export type Role = 'inspector' | 'supervisor' | 'operator' | 'admin';
export const ROLES: Role[] = ['inspector', 'supervisor', 'operator', 'admin'];

/** How each role's first screen shows it has loaded: its main heading (and, for Today, a ride card). */
async function firstScreenReady(page: Page, role: Role) {
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'), { timeout: 60_000 });
  if (role === 'inspector') {
    await page
      .getByRole('heading', { name: /^Good (morning|afternoon|evening)/ })
      .first()
      .waitFor({ timeout: 60_000 });
    // The first sync has put the inspector's rides into the device database.
    await page
      .getByText(/Tamsworth Pier/)
      .first()
      .waitFor({ timeout: 60_000 });
  } else {
    await page.getByRole('heading').first().waitFor({ timeout: 60_000 });
  }
}

export type FirstScreen = {
  role: Role;
  path: string;
  /**
   * What the screen needed: every request the page started from opening the app until the screen showed,
   * with all its bytes however late they arrived (files the page took from the service worker count with
   * the bytes the worker fetched them with).
   */
  first: Transfer;
  /** The rest of the service worker's precache, fetched in the background until it controls the page. */
  background: Transfer;
  log: TransferLog;
  /** The context stays open (the offline reload continues in it); close it when done. */
  context: BrowserContext;
  tab: Page;
};

/**
 * Phase 2: a role's first screen on a fresh profile, counting from opening the app (the sign-in page
 * included) until the screen has shown (each request then started counted whole); apart from it, what
 * the service worker precaches and the page loads ahead in the background once the network is quiet.
 */
export async function measureFirstScreen(
  browser: Browser,
  baseUrl: string,
  role: Role,
  /** Holds each answer to the phone's sync pull back this long, as a slow phone or network would. */
  { slowPullMs = 0 }: { slowPullMs?: number } = {},
): Promise<FirstScreen> {
  const { context, page, log } = await freshPhone(browser);
  if (slowPullMs > 0)
    await context.route('**/api/sync/pull*', async (route) => {
      await new Promise((r) => setTimeout(r, slowPullMs));
      await route.continue();
    });
  await page.goto(`${baseUrl}/`);
  await page.getByLabel('E-mail').fill(`${role}@pivotwatch.test`);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await firstScreenReady(page, role);
  // What the screen needed is what the page had asked for by the time it showed (however long those
  // requests then took): requests it starts afterwards — the role's other areas, loaded ahead once the
  // service worker holds the app (lazy-screens.ts) — are not waited for by anyone looking at this screen.
  const readyAt = Date.now();
  await log.idle();
  // The worker installs in the background; its precache is done when it controls the page.
  await page
    .waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 90_000 })
    .catch(() => undefined);
  await log.idle(1500);
  return {
    role,
    path: new URL(page.url()).pathname,
    first: log.needed(readyAt),
    background: log.background(readyAt),
    log,
    context,
    tab: page,
  };
}

/** One offline reload: wall-clock seconds, and the main thread's CPU seconds for the new page. */
export type Reload = { seconds: number; mainThreadCpu: number };

/**
 * Phase 3: with the network off and the CPU slowed `slowdown` times (DevTools' CPU throttling), reloads
 * the signed-in inspector's Today `runs` times, each until Today is interactive (its heading and a ride's
 * start button on screen). Besides the wall-clock time it reads the page's main-thread CPU time (CDP
 * `Performance` in thread ticks: the document's own, which restarts with each navigation), which other
 * processes on a busy machine disturb far less.
 */
export async function measureOfflineReload(
  inspector: FirstScreen,
  runs: number,
  slowdown = 4,
): Promise<Reload[]> {
  const page = inspector.tab;
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 90_000 });
  const cdp = await inspector.context.newCDPSession(page);
  await cdp.send('Performance.enable', { timeDomain: 'threadTicks' });
  await inspector.context.setOffline(true);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: slowdown });
  const reloads: Reload[] = [];
  try {
    for (let i = 0; i < runs; i += 1) {
      const started = performance.now();
      await page.reload({ waitUntil: 'commit' });
      await page
        .getByRole('heading', { name: /^Good (morning|afternoon|evening)/ })
        .first()
        .waitFor({ timeout: 60_000 });
      await page
        .getByRole('button', { name: /Start inspection|Another type/ })
        .first()
        .waitFor({ timeout: 60_000 });
      const seconds = (performance.now() - started) / 1000;
      const { metrics } = await cdp.send('Performance.getMetrics');
      const mainThreadCpu = metrics.find((m) => m.name === 'TaskDuration')?.value ?? NaN;
      reloads.push({ seconds, mainThreadCpu });
    }
  } finally {
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 });
    await inspector.context.setOffline(false);
    await cdp.detach();
  }
  return reloads;
}

export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}
