/**
 * `npm run bench:web`: the web app's speed budget (issue #16), measured in the project.
 * Builds the export when stale (scripts/build-web.ts), starts the real server on a fresh data folder with
 * the demo data, drives Debian's chromium at phone size (390×844) through playwright and CDP, and prints
 * per phase the bytes transferred (compressed, as the server sent them), split JavaScript / fonts / other,
 * with the goal and PASS/MISS beside each figure:
 *  1. opening the app until the sign-in form is visible (and until the sign-in page is quiet);
 *  2. each role's first screen after signing in on a fresh profile, counted from opening the app, and
 *     apart from it what the service worker precaches in the background afterwards;
 *  3. the offline reload of the inspector's Today until interactive, CPU slowed 4×, median of the runs.
 * Byte counts are deterministic for a build; the reload time is not (the machine's other load shows).
 *
 * Options: `--runs <n>` offline reloads (default 7, at least 5), `--force` rebuild the export,
 * `--url <baseUrl>` measure a server already running with demo data instead (nothing is built).
 * Run it under the browser lock when others share the machine: `flock /tmp/pw-browser.lock npm run bench:web`.
 */
import { cpus, loadavg } from 'node:os';

import { chromium } from 'playwright-core';

import { launchOptions } from './browser';
import { buildWeb } from './build-web';
import { startLocalServer } from './local-server';
import {
  GOALS,
  measureFirstScreen,
  measureOfflineReload,
  measureSignIn,
  median,
  ROLES,
  type FirstScreen,
  type Transfer,
} from './web-transfer';

const kb = (bytes: number) => `${Math.round(bytes / 1000).toLocaleString('en-GB')} KB`;
const verdict = (ok: boolean) => (ok ? 'PASS' : 'MISS');

function row(label: string, t: Transfer, goal = ''): string {
  const cells = [kb(t.js), kb(t.fonts), kb(t.other), kb(t.total)].map((c) => c.padStart(9));
  return `${label.padEnd(44)}${cells.join(' ')}  ${String(t.requests).padStart(4)}  ${goal}`;
}

function option(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

async function measure(baseUrl: string, runs: number) {
  const browser = await chromium.launch(launchOptions());
  const screens: FirstScreen[] = [];
  try {
    console.log(
      `chromium ${browser.version()}, phone viewport 390×844, fresh profile per phase; 1 KB = 1,000 bytes`,
    );
    console.log(
      `${''.padEnd(44)}${['JS', 'fonts', 'other', 'total'].map((h) => h.padStart(9)).join(' ')}  reqs  goal`,
    );

    const signIn = await measureSignIn(browser, baseUrl);
    const jsOk = signIn.visible.js <= GOALS.jsBeforeSignIn;
    const allOk = signIn.visible.total <= GOALS.allBeforeSignIn;
    console.log(
      row(
        '1. until the sign-in form is visible',
        signIn.visible,
        `JS ≤ ${kb(GOALS.jsBeforeSignIn)} ${verdict(jsOk)} · all ≤ ${kb(GOALS.allBeforeSignIn)} ${verdict(allOk)}`,
      ),
    );
    const settledOk =
      signIn.settled.js <= GOALS.jsBeforeSignIn && signIn.settled.total <= GOALS.allBeforeSignIn;
    console.log(
      row('   until the sign-in page is quiet', signIn.settled, `same goals ${verdict(settledOk)}`),
    );
    if (signIn.byWorker.requests)
      console.log(row('     of which the service worker (precache)', signIn.byWorker));

    for (const role of ROLES) {
      const screen = await measureFirstScreen(browser, baseUrl, role);
      screens.push(screen);
      const goal =
        role === 'inspector'
          ? `all ≤ ${kb(GOALS.inspectorTodayFirstVisit)} ${verdict(screen.first.total <= GOALS.inspectorTodayFirstVisit)}`
          : '';
      console.log(row(`2. ${role} first screen (${screen.path})`, screen.first, goal));
      console.log(row('   + service worker precache in the background', screen.background));
      if (role !== 'inspector') await screen.context.close();
    }

    const inspector = screens.find((s) => s.role === 'inspector')!;
    const reloads = await measureOfflineReload(inspector, runs);
    const seconds = reloads.map((r) => r.seconds);
    const med = median(seconds);
    console.log(
      `3. offline reload to an interactive Today, CPU 4× slower: median ${med.toFixed(2)} s ` +
        `(n=${seconds.length}, ${Math.min(...seconds).toFixed(2)}–${Math.max(...seconds).toFixed(2)} s)  ` +
        `goal ≤ ${GOALS.offlineReloadSeconds.toFixed(1)} s ${verdict(med <= GOALS.offlineReloadSeconds)}`,
    );
    console.log(
      `   main thread's CPU time per reload (throttled, less disturbed by other load): median ` +
        `${median(reloads.map((r) => r.mainThreadCpu)).toFixed(2)} s`,
    );
    console.log('\nlargest transfers (inspector, first visit):');
    for (const f of inspector.log.largest())
      console.log(`  ${kb(f.bytes).padStart(9)}  ${f.kind.padEnd(5)} ${f.byWorker ? '(sw) ' : ''}${f.url}`);
  } finally {
    for (const s of screens) await s.context.close().catch(() => undefined);
    await browser.close();
  }
}

async function main() {
  const runs = Math.max(5, Number(option('--runs') ?? 7));
  const url = option('--url');
  console.log(
    `node ${process.version}, ${cpus().length} cores, load average ${loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')} at start`,
  );
  if (url) {
    await measure(url, runs);
    return;
  }
  await buildWeb({ force: process.argv.includes('--force') });
  const server = await startLocalServer();
  try {
    await measure(server.baseUrl, runs);
  } finally {
    await server.stop();
  }
  console.log(
    `load average ${loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')} at the end`,
  );
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
