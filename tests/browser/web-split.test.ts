/**
 * The web bundle is split by area (features/shell/lazy-screens.ts): the page before sign-in runs only the
 * entry (shell, sign-in, set-password), and everything else loads after sign-in, when first needed.
 *
 * Two views of the same export:
 *  - what each chunk holds, read from the build's source maps (scripts/web-chunks.ts keeps them in
 *    artifacts/web-maps/): the entry carries none of the signed-in features or their heavy libraries;
 *  - what a fresh phone browser fetches: before the sign-in form only the page's own scripts, no shared
 *    chunk, no SQLite worker or .wasm and no service worker; after signing in the inspector gets the
 *    device database and the worker, a supervisor neither.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';

import type { Page } from 'playwright-core';

import { WEB_MAPS } from '@/scripts/build-web';
import { CHUNK_DIR, SHARED_META, chunkName, eagerScripts } from '@/scripts/web-chunks';
import { ROOT, serverAndBrowser, signIn } from '@/tests/support/browser/harness';

const DIST = join(ROOT, 'dist');
const html = () => readFileSync(join(DIST, 'index.html'), 'utf8');

/** The modules a chunk holds (paths from the project root), from its source map. */
function modulesOf(chunk: string): string[] {
  const map = JSON.parse(readFileSync(join(WEB_MAPS, `${chunk}.map`), 'utf8')) as { sources: string[] };
  return map.sources.map((s) => s.replace(/^\/+/, ''));
}

const chunkFiles = () => readdirSync(join(DIST, CHUNK_DIR)).filter((f) => f.endsWith('.js'));
const chunkNamed = (prefix: string) => {
  const found = chunkFiles().filter((f) => f.startsWith(`${prefix}-`));
  expect(found).toHaveLength(1);
  return found[0];
};

/** What must not run before sign-in: signed-in features, and the libraries only they use. */
const NOT_BEFORE_SIGN_IN: RegExp[] = [
  /^node_modules\/mathjs\//,
  /^node_modules\/d3-[a-z-]+\//,
  /^node_modules\/drizzle-orm\//,
  /^node_modules\/expo-sqlite\//,
  /^node_modules\/workbox-window\//,
  /^features\/(device-db|sync|loads|fatigue|registry|records|instruments|motion-recording|photos)\//,
  /^features\/(pivot-life|notices|review|inspections|ride-page|home|calculator|admin|tap-timer)\//,
  /^features\/api\/pdf-download/,
  /^features\/shell\/(app-shell|signed-in-frame|account-screen|sign-out-card|bundles\/)/,
];

describe('what each chunk of the export holds', () => {
  test('index.html runs the entry and the runtime only; the shared chunk is named in a <meta>', () => {
    const page = html();
    const eager = eagerScripts(page).map(chunkName);
    expect(eager).toEqual([
      expect.stringMatching(/^__expo-metro-runtime-/),
      expect.stringMatching(/^entry-/),
    ]);
    const shared = new RegExp(`<meta name="${SHARED_META}" content="([^"]+)"`).exec(page)?.[1];
    expect(shared).toMatch(/^\/_expo\/static\/js\/web\/__common-[0-9a-f]+\.js$/);
    expect(existsSync(join(DIST, shared!))).toBe(true);
  });

  test('the entry holds sign-in and set-password and none of the signed-in app', () => {
    const entry = [...modulesOf(chunkNamed('entry')), ...modulesOf(chunkNamed('__expo-metro-runtime'))];
    // The maps are read right: the sign-in path is there.
    expect(entry).toEqual(
      expect.arrayContaining([
        'features/auth/sign-in-screen.tsx',
        'features/auth/set-password-screen.tsx',
        'features/shell/app-layout.tsx',
        'node_modules/expo-router/build/index.js',
      ]),
    );
    const misplaced = entry.filter((m) => NOT_BEFORE_SIGN_IN.some((re) => re.test(m)));
    expect(misplaced).toEqual([]);
  });

  test("each area's screens are in that area's chunk, not in the entry", () => {
    const where = (module: string) =>
      chunkFiles()
        .filter((f) => modulesOf(f).includes(module))
        .map((f) => f.replace(/-[0-9a-f]+\.js$/, ''));
    expect(where('features/inspections/today-screen.tsx')).toEqual(['inspector']);
    expect(where('features/review/queue-screen.tsx')).toEqual(['review']);
    expect(where('features/home/operator-home.tsx')).toEqual(['operator']);
    expect(where('features/admin/people-screen.tsx')).toEqual(['admin']);
    expect(where('features/registry/rides-list-screen.tsx')).toEqual(['rides']);
    // The device database's engine: its worker is a chunk of its own, started only by the inspector's frame.
    expect(where('node_modules/expo-sqlite/web/worker.ts')).toEqual(['worker']);
  });

  test('heavy libraries sit in chunks of their own, behind their one import(); mathjs in none', () => {
    const holders = (re: RegExp) =>
      chunkFiles()
        .filter((f) => modulesOf(f).some((m) => re.test(m)))
        .map((f) => f.replace(/-[0-9a-f]+\.js$/, ''));
    // components/chart-d3-loader.web.ts, fetched with the first chart drawn.
    expect(holders(/^node_modules\/d3-[a-z-]+\//)).toEqual(['chart-d3']);
    // features/registry/design-export-card.tsx, fetched on the first Download press.
    expect(holders(/^features\/registry\/design-file\/csv-(import|export)\.ts$/)).toEqual(['csv']);
    // Unit factors are generated at build time (scripts/gen-unit-factors.ts).
    expect(holders(/^node_modules\/mathjs\//)).toEqual([]);
  });
});

const app = serverAndBrowser();

/** The worker's own fetch of the .wasm is not the page's; before sign-in there must be none at all. */
type Fetched = { scripts: string[]; wasm: string[]; fonts: string[] };

/** Every script, .wasm and font the page fetches from now on (by file name). */
function recordFetches(page: Page): Fetched {
  const fetched: Fetched = { scripts: [], wasm: [], fonts: [] };
  page.on('request', (req) => {
    const name = new URL(req.url()).pathname.split('/').pop() ?? '';
    if (name.endsWith('.wasm')) fetched.wasm.push(name);
    else if (name.endsWith('.woff2')) fetched.fonts.push(name);
    else if (req.resourceType() === 'script' || name.endsWith('.js')) fetched.scripts.push(name);
  });
  return fetched;
}

/** Font files by face (`sans-400.<hash>.woff2` → `sans-400`). */
const faces = (names: string[]) => [...new Set(names.map((n) => n.split('.')[0]))].sort();

const prefixes = (names: string[]) => [...new Set(names.map((n) => n.replace(/-[0-9a-f]+\.js$/, '')))].sort();

const serviceWorkers = (page: Page) =>
  page.evaluate(async () => (await navigator.serviceWorker.getRegistrations()).length);

test('before the sign-in form only the entry loads; the inspector then gets its screens and the database', async () => {
  const page = await app.openPage('phone');
  const fetched = recordFetches(page);
  await page.goto(`${app.baseUrl}/`);
  await page.getByLabel('E-mail').waitFor();
  await page.waitForLoadState('networkidle');
  expect(prefixes(fetched.scripts)).toEqual(['__expo-metro-runtime', 'entry']);
  expect(fetched.wasm).toEqual([]);
  // Only the faces the sign-in page draws (components/app-fonts.web.ts): no figures' mono face, no icons.
  expect(faces(fetched.fonts)).toEqual(['sans-400', 'sans-600', 'sans-700']);
  expect(await serviceWorkers(page)).toBe(0);

  await signIn(page, app.baseUrl, 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page
    .getByRole('heading', { name: /^Good (morning|afternoon|evening), Tomas$/ })
    .first()
    .waitFor();
  const after = prefixes(fetched.scripts);
  expect(after).toEqual(expect.arrayContaining(['__common', 'frame', 'inspector', 'worker']));
  // The signed-in pages' faces come with their code.
  expect(faces(fetched.fonts)).toEqual(['feather-icons', 'mono-500', 'sans-400', 'sans-600', 'sans-700']);
  // Only the inspector's area: the desk's and the register's chunks wait until those pages are opened.
  expect(after).not.toContain('review');
  expect(after).not.toContain('rides');
  // The service worker is registered now, after sign-in, and precaches every chunk for offline use.
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 60000 });
  await page.context().close();
});

test('a supervisor never starts the device database', async () => {
  const page = await app.openPage('phone');
  const fetched = recordFetches(page);
  await signIn(page, app.baseUrl, 'supervisor@pivotwatch.test');
  await page.waitForURL('**/review');
  await page
    .getByRole('heading', { name: /^Review$/ })
    .first()
    .waitFor();
  await page
    .getByText(/Tidebreaker/)
    .first()
    .waitFor();
  const after = prefixes(fetched.scripts);
  expect(after).toEqual(expect.arrayContaining(['__common', 'frame', 'review']));
  expect(after).not.toContain('inspector');
  expect(after).not.toContain('worker');
  await page.context().close();
});
