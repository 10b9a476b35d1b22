/**
 * Builds the web export into dist/ when it is missing or older than the sources.
 * Used by `npm start` and the browser tests; `npx tsx scripts/build-web.ts --force` rebuilds.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

import { buildServiceWorker } from './build-sw';
import { describePrecompress, precompressDir } from './precompress';
import { deferSharedChunk, moveSourceMaps } from './web-chunks';

export const ROOT = join(__dirname, '..');
export const DIST = join(ROOT, 'dist');
const STAMP = join(DIST, '.pivotwatch-build');
/** The export's source maps: which modules each chunk holds (kept out of dist/, see web-chunks.ts). */
export const WEB_MAPS = join(ROOT, 'artifacts', 'web-maps');

/** Everything that ends up in the web bundle. */
const SOURCES = [
  'app',
  'components',
  'features',
  'lib',
  'metro',
  'db',
  'drizzle',
  'assets',
  'fonts',
  'public',
  'app.json',
  'babel.config.js',
  'metro.config.js',
  'package-lock.json',
  'scripts/build-web.ts',
  'scripts/build-sw.ts',
  'scripts/precompress.ts',
  'scripts/web-chunks.ts',
];

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const st = statSync(path);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
  return newest;
}

export function webBuildIsStale(): boolean {
  if (!existsSync(STAMP) || !existsSync(join(DIST, 'index.html'))) return true;
  const built = statSync(STAMP).mtimeMs;
  return SOURCES.some((s) => newestMtime(join(ROOT, s)) > built);
}

/** Exports the app, then generates the service worker over the export (the offline app shell). */
export async function buildWeb({ force = false } = {}): Promise<void> {
  if (!force && !webBuildIsStale()) return;
  console.log('[pivotwatch] building the web app (expo export)…');
  const res = spawnSync(
    'npx',
    ['expo', 'export', '--platform', 'web', '--output-dir', 'dist', '--clear', '--source-maps'],
    {
      cwd: ROOT,
      stdio: ['ignore', 'inherit', 'inherit'],
      env: { ...process.env, CI: '1', EXPO_NO_TELEMETRY: '1' },
    },
  );
  if (res.status !== 0) throw new Error(`expo export failed with exit code ${res.status}`);
  moveSourceMaps(DIST, WEB_MAPS);
  const shared = deferSharedChunk(DIST);
  console.log(`[pivotwatch] shared chunk loads after sign-in: ${shared ?? 'none in this build'}`);
  const sw = await buildServiceWorker(DIST);
  sw.warnings.forEach((w) => console.warn(`[pivotwatch] service worker: ${w}`));
  console.log(
    `[pivotwatch] service worker: ${sw.count} files precached (${(sw.size / 1048576).toFixed(1)} MB)`,
  );
  console.log(`[pivotwatch] ${describePrecompress(await precompressDir(DIST))}`);
  writeFileSync(STAMP, new Date().toISOString());
}

if (require.main === module) {
  buildWeb({ force: process.argv.includes('--force') }).catch((err: unknown) => {
    console.error(err);
    process.exit(1);
  });
}
