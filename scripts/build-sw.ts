/**
 * Generates the service worker over the web export (workbox-build `generateSW`), so the app shell — the
 * HTML, the entry bundle, fonts, the SQLite worker and its .wasm — loads with no network at all.
 * The app's data does not go through the service worker: it lives in the device database, and `/api/`
 * is never answered from a cache.
 *
 * `skipWaiting: false`: a new version installs in the background and waits; the app shows an update
 * prompt (features/sync/service-worker.web.ts) and the inspector chooses when to reload, so a version
 * never changes under a half-typed form. `clientsClaim: true`: the very first worker takes the page it
 * was installed from, so the app works offline from the first visit on, without a second load.
 *
 * Run: `npx tsx scripts/build-sw.ts [distDir]` (default dist/), or call `buildServiceWorker(distDir)`.
 */
import { join } from 'node:path';

import { generateSW } from 'workbox-build';

/** The entry bundle is ~1.5 MB and the SQLite .wasm ~0.6 MB; the default limit (2 MB) is too tight. */
const MAX_PRECACHE_FILE_BYTES = 8 * 1024 * 1024;

export type ServiceWorkerBuild = { swPath: string; count: number; size: number; warnings: string[] };

export async function buildServiceWorker(distDir: string): Promise<ServiceWorkerBuild> {
  const swPath = join(distDir, 'sw.js');
  const { count, size, warnings } = await generateSW({
    globDirectory: distDir,
    globPatterns: ['**/*.{html,js,css,json,webmanifest,ico,png,svg,ttf,otf,woff,woff2,wasm}'],
    // The worker itself, the build stamp and expo's build metadata are not part of the shell.
    globIgnores: ['sw.js', 'sw.js.map', 'workbox-*.js', 'metadata.json', '.pivotwatch-build'],
    swDest: swPath,
    mode: 'production',
    sourcemap: false,
    // One file: nothing else to fetch (and to allow in the CSP) when the worker starts.
    inlineWorkboxRuntime: true,
    maximumFileSizeToCacheInBytes: MAX_PRECACHE_FILE_BYTES,
    // Names with a content hash change when their content does; no revision query needed.
    dontCacheBustURLsMatching: /\/_expo\/static\/|[.-][0-9a-f]{16,}(@\d+x)?\.[a-z0-9]+$/i,
    // Every route of the single-page app is the same index.html; the API is never a navigation target.
    navigateFallback: '/index.html',
    navigateFallbackDenylist: [/^\/api\//],
    skipWaiting: false,
    clientsClaim: true,
    cleanupOutdatedCaches: true,
  });
  return { swPath, count, size, warnings };
}

if (require.main === module) {
  const dir = process.argv[2] ?? join(__dirname, '..', 'dist');
  buildServiceWorker(dir).then(
    ({ count, size, warnings }) => {
      warnings.forEach((w) => console.warn(`[pivotwatch] service worker: ${w}`));
      console.log(
        `[pivotwatch] service worker: ${count} files precached (${(size / 1048576).toFixed(1)} MB)`,
      );
    },
    (err: unknown) => {
      console.error(err);
      process.exit(1);
    },
  );
}
