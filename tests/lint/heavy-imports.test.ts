/**
 * Heavy libraries stay behind one door each, so the web bundle gives them a chunk of their own that loads
 * with the first screen that uses them (issue 16, "nothing heavy before it is needed"). Metro moves a
 * module reached from two lazy chunks into the shared chunk every signed-in page loads, so a second
 * static import of d3 anywhere would quietly put it back in front of every role.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

const ROOT = join(__dirname, '..', '..');
const APP_DIRS = ['app', 'components', 'features', 'lib', 'db'];

function sources(): { path: string; text: string }[] {
  const out: { path: string; text: string }[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      if (statSync(path).isDirectory()) walk(path);
      else if (/\.(ts|tsx|js|jsx)$/.test(name))
        out.push({ path: relative(ROOT, path), text: readFileSync(path, 'utf8') });
    }
  };
  for (const dir of APP_DIRS) walk(join(ROOT, dir));
  return out;
}

/** Static imports and re-exports that bring a module's code (not `import type`). */
function valueImports(text: string): string[] {
  const specs: string[] = [];
  const re = /^\s*(?:import|export)\s+(?!type\s)(?:[^'";]*?\s+from\s+)?['"]([^'"]+)['"]/gm;
  for (let m = re.exec(text); m; m = re.exec(text)) specs.push(m[1]);
  return specs;
}

const dynamicImports = (text: string) =>
  [...text.matchAll(/\bimport\(\s*['"]([^'"]+)['"]\s*\)/g)].map((m) => m[1]);

describe('heavy libraries behind one door', () => {
  const files = sources();

  test('the scanner sees static imports, re-exports and dynamic imports, and skips type imports', () => {
    const sample = [
      "import { line } from 'd3-shape';",
      "import type { ScaleLinear } from 'd3-scale';",
      "export { scaleUtc } from 'd3-scale';",
      "import 'side-effect';",
      "const m = import('@/components/chart-d3');",
    ].join('\n');
    expect(valueImports(sample)).toEqual(['d3-shape', 'd3-scale', 'side-effect']);
    expect(dynamicImports(sample)).toEqual(['@/components/chart-d3']);
  });

  test('only components/chart-d3.ts imports d3', () => {
    const importers = files
      .filter((f) => valueImports(f.text).some((s) => /^d3(-|$)/.test(s)))
      .map((f) => f.path);
    expect(importers).toEqual(['components/chart-d3.ts']);
  });

  test('on the web chart-d3 is reached only through the one import() in chart-d3-loader.web.ts', () => {
    const isChartD3 = (s: string) => /(^|\/)chart-d3$/.test(s);
    const staticUsers = files.filter((f) => valueImports(f.text).some(isChartD3)).map((f) => f.path);
    // The phone's loader imports it statically: native bundles are on the device.
    expect(staticUsers).toEqual(['components/chart-d3-loader.ts']);
    const dynamicUsers = files.filter((f) => dynamicImports(f.text).some(isChartD3)).map((f) => f.path);
    expect(dynamicUsers).toEqual(['components/chart-d3-loader.web.ts']);
  });

  test('the design file code (CSV and JSON) is reached in the app only through the one import() in csv-loader.web.ts', () => {
    const isDesignFile = (s: string) => s === '@/features/registry/csv';
    const staticUsers = files
      .filter((f) => f.path !== 'features/registry/csv.ts' && valueImports(f.text).some(isDesignFile))
      .map((f) => f.path);
    // The phone's loader imports it statically: native bundles are on the device.
    expect(staticUsers).toEqual(['features/registry/csv-loader.ts']);
    const dynamicUsers = files.filter((f) => dynamicImports(f.text).some(isDesignFile)).map((f) => f.path);
    expect(dynamicUsers).toEqual(['features/registry/csv-loader.web.ts']);
  });

  test('the record chain’s code (Ed25519 through @noble/curves) is reached in the app only through the one import() in ledger-loader.web.ts', () => {
    const isLedger = (s: string) => s === '@/features/ledger';
    const staticUsers = files
      .filter((f) => !f.path.startsWith('features/ledger/') && valueImports(f.text).some(isLedger))
      .map((f) => f.path);
    // The phone's loader imports it statically: native bundles are on the device.
    expect(staticUsers).toEqual(['features/device-db/ledger-loader.ts']);
    const dynamicUsers = files.filter((f) => dynamicImports(f.text).some(isLedger)).map((f) => f.path);
    expect(dynamicUsers).toEqual(['features/device-db/ledger-loader.web.ts']);
    const curveUsers = files
      .filter((f) => valueImports(f.text).some((s) => s.startsWith('@noble/curves')))
      .map((f) => f.path);
    expect(curveUsers).toEqual(['features/ledger/chain.ts']);
  });

  test('the api feature’s runs-anywhere index does not bring the PDF download (the sign-in form needs it)', () => {
    const index = files.find((f) => f.path === 'features/api/index.ts');
    expect(index && valueImports(index.text).filter((s) => /pdf-download/.test(s))).toEqual([]);
  });
});
