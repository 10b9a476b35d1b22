/**
 * Typed routes: tsc checks every link against `types/routes.d.ts`, which is committed (no dev server runs
 * before tsc in `npm test` or CI). It must be what Expo Router's generator makes of `app/` today, and it
 * must name every screen file under the file-routing rules Expo Router documents (docs.expo.dev, "Core
 * concepts of file-based routing"): a file's path is its URL, `index` is its folder, `(group)` folders are
 * left out of the URL, `[name]` is a parameter, `_layout` and `+not-found` are not links.
 */
import { readdirSync } from 'node:fs';
import { join, relative } from 'node:path';

import { APP_DIR, committedRouteTypes, routeTypes } from '@/scripts/route-types';

function screenFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? screenFiles(join(dir, e.name)) : /\.tsx?$/.test(e.name) ? [join(dir, e.name)] : [],
  );
}

/** A screen file's URL pattern, written from the rules above (not from the generator). */
function urlOf(file: string): string {
  const path = relative(APP_DIR, file)
    .replace(/\.tsx?$/, '')
    .split('/')
    .filter((part) => !/^\(.+\)$/.test(part));
  if (path[path.length - 1] === 'index') path.pop();
  return `/${path.join('/')}`;
}

/** Link pathname → its input parameters, read from the declaration's `hrefInputParams`. */
function linkTargets(declaration: string): Map<string, string> {
  const line = declaration.split('\n').find((l) => l.trim().startsWith('hrefInputParams:')) ?? '';
  return new Map([...line.matchAll(/`(\/[^`$]*)`[,;] params\??: ([^}]*\}?)/g)].map((m) => [m[1], m[2]]));
}

describe('typed routes', () => {
  it('the committed declaration is what the generator makes of app/ (else run scripts/route-types.ts)', () => {
    expect(committedRouteTypes()).toBe(routeTypes());
  });

  it('names every screen under app/ as a link target, with its parameters', () => {
    const targets = linkTargets(routeTypes());
    const screens = screenFiles(APP_DIR).filter((f) => !/(^|\/)(_layout|\+not-found)\.tsx?$/.test(f));
    expect(screens.length).toBeGreaterThan(30);
    for (const url of screens.map(urlOf)) {
      expect({ url, listed: targets.has(url) }).toEqual({ url, listed: true });
      for (const [, name] of url.matchAll(/\[(\w+)\]/g)) {
        expect({ url, name, typed: targets.get(url)?.includes(`${name}: string | number;`) }).toEqual({
          url,
          name,
          typed: true,
        });
      }
    }
  });

  it('lists no link target without a screen file (layouts are not targets)', () => {
    const urls = new Set(screenFiles(APP_DIR).map(urlOf));
    const targets = [...linkTargets(routeTypes()).keys()];
    expect(targets.length).toBeGreaterThan(30);
    // Expo Router adds its own sitemap screen; every other target must come from a file.
    expect(targets.filter((u) => u !== '/_sitemap' && !urls.has(u))).toEqual([]);
    expect(targets.some((u) => u.endsWith('_layout'))).toBe(false);
  });
});
