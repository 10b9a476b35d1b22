/**
 * After `expo export`: keeps the signed-in app's shared chunk off the sign-in page, and keeps the source
 * maps beside the export rather than in it.
 *
 * Metro splits the web bundle at every `import()` (features/shell/lazy-screens.ts imports one bundle per
 * area), and Expo's serializer moves whatever two of those chunks share into `__common-<hash>.js`, which
 * its index.html loads eagerly with the entry. That chunk is signed-in code only (the entry keeps what the
 * sign-in page needs), so `deferSharedChunk` takes its `<script>` out of the page and leaves the address
 * in `<meta name="pivotwatch-shared">`; the app runs it before the first bundle (features/shell/
 * load-shared.web.ts). The service worker still precaches it with every other chunk.
 *
 * The maps (`--source-maps`) say which modules each chunk holds; tests/browser/web-split.test.ts reads
 * them. They are moved to artifacts/web-maps/ so the server neither serves nor precaches them.
 */
import { existsSync, mkdirSync, readFileSync, readdirSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** Where Metro writes the web chunks inside the export, as a path and as the URL the page uses. */
export const CHUNK_DIR = join('_expo', 'static', 'js', 'web');
const CHUNK_URL = '/_expo/static/js/web/';

const SHARED_SCRIPT =
  /[ \t]*<script src="(\/_expo\/static\/js\/web\/__common-[0-9a-f]+\.js)"[^>]*><\/script>\n?/;
export const SHARED_META = 'pivotwatch-shared';

/**
 * Takes the shared chunk's `<script>` out of index.html and records its URL in a `<meta>` instead.
 * Returns the URL, or null when the export has no shared chunk (a build without `import()`).
 */
export function deferSharedChunk(distDir: string): string | null {
  const htmlPath = join(distDir, 'index.html');
  const html = readFileSync(htmlPath, 'utf8');
  const found = SHARED_SCRIPT.exec(html);
  if (!found) {
    if (html.includes('__common-')) throw new Error('index.html loads __common in an unexpected form');
    return null;
  }
  const url = found[1];
  const meta = `<meta name="${SHARED_META}" content="${url}" />`;
  const rewritten = html.replace(found[0], '').replace('</head>', `${meta}\n</head>`);
  if (!rewritten.includes(meta)) throw new Error('index.html has no </head> to put the shared chunk in');
  writeFileSync(htmlPath, rewritten);
  return url;
}

/**
 * Moves every chunk's `.map` from the export to `mapsDir` (emptied first) and drops the chunks'
 * `sourceMappingURL` comments, which would point at files the server no longer has.
 */
export function moveSourceMaps(distDir: string, mapsDir: string): number {
  const chunkDir = join(distDir, CHUNK_DIR);
  rmSync(mapsDir, { recursive: true, force: true });
  mkdirSync(mapsDir, { recursive: true });
  let moved = 0;
  for (const name of readdirSync(chunkDir)) {
    if (!name.endsWith('.js.map')) continue;
    renameSync(join(chunkDir, name), join(mapsDir, name));
    const js = join(chunkDir, name.slice(0, -'.map'.length));
    if (existsSync(js)) {
      const code = readFileSync(js, 'utf8');
      writeFileSync(js, code.replace(/^\/\/# sourceMappingURL=\S+\n?/m, ''));
    }
    moved += 1;
  }
  return moved;
}

/** The URLs of the scripts index.html loads, in order. */
export function eagerScripts(html: string): string[] {
  return [...html.matchAll(/<script[^>]*\ssrc="([^"]+)"/g)].map((m) => m[1]);
}

/** The chunk's file name for a URL of the page (`/_expo/static/js/web/entry-….js` → `entry-….js`). */
export const chunkName = (url: string) => (url.startsWith(CHUNK_URL) ? url.slice(CHUNK_URL.length) : url);
