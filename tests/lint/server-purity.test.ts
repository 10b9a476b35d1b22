/**
 * The server never loads React, React Native, Expo or a route: it runs the features' contracts and pure
 * modules (the same load engine and rules as the phone) and nothing of the UI. Lint checks each import on
 * its own; this walks everything the server's entry points reach, so a pure-looking module that pulls in
 * a screen two steps away is caught too.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

const root = path.resolve(__dirname, '../..');
const serverEntries = ['server/main.ts', 'server/app.ts', 'scripts/start.ts'];
const uiPackages =
  /^(react|react-dom|react-native|react-native-[\w-]+|expo|expo-[\w-]+|@expo\/[\w-]+|@tanstack\/react-query|@react-navigation\/[\w-]+)(\/|$)/;

const importPattern =
  /(?:^|\n)\s*(?:import|export)\s+(?:type\s+)?(?:[\s\S]*?\s+from\s+)?['"]([^'"]+)['"]|require\(\s*['"]([^'"]+)['"]\s*\)|import\(\s*['"]([^'"]+)['"]\s*\)/g;

function resolveLocal(from: string, spec: string): string | null {
  const base = spec.startsWith('@/')
    ? path.join(root, spec.slice(2))
    : path.resolve(path.dirname(from), spec);
  for (const ext of ['', '.ts', '.tsx', '.js', '/index.ts', '/index.tsx']) {
    const p = base + ext;
    if (existsSync(p) && !p.endsWith('/')) {
      try {
        readFileSync(p);
        return p;
      } catch {
        // a folder: try the next form
      }
    }
  }
  return null;
}

function reach(
  entries: string[],
  forbidden: RegExp = uiPackages,
): { files: Set<string>; offences: string[] } {
  const files = new Set<string>();
  const offences: string[] = [];
  const queue = entries.map((e) => path.join(root, e));
  while (queue.length > 0) {
    const file = queue.pop()!;
    if (files.has(file)) continue;
    files.add(file);
    const rel = path.relative(root, file);
    if (file.endsWith('.tsx')) offences.push(`${rel} is a React module`);
    if (/^(app|components|tests)\//.test(rel)) offences.push(`${rel} is outside what the server may load`);
    const text = readFileSync(file, 'utf8');
    for (const m of text.matchAll(importPattern)) {
      // A type-only import loads nothing.
      if (/^\s*(import|export)\s+type\b/.test(m[0])) continue;
      const spec = m[1] ?? m[2] ?? m[3];
      if (!spec) continue;
      if (spec.startsWith('@/') || spec.startsWith('.')) {
        const target = resolveLocal(file, spec);
        if (target) queue.push(target);
        else offences.push(`${rel}: cannot resolve ${spec}`);
      } else if (forbidden.test(spec)) offences.push(`${rel} imports ${spec}`);
    }
  }
  return { files, offences };
}

test('nothing the server loads is React, Expo, a route or a test', () => {
  const { files, offences } = reach(serverEntries);
  // The walk must really have gone through the server, the engine and the features' contracts.
  const rel = [...files].map((f) => path.relative(root, f));
  expect(rel).toContain('server/routes/index.ts');
  expect(rel).toContain('features/loads/engine/index.ts');
  expect(rel.some((f) => f.startsWith('features/records/'))).toBe(true);
  expect(offences).toEqual([]);
});

/**
 * A feature's index.ts is its public API for code that runs anywhere (the server, pure modules, node
 * tests); what needs React Native goes through its ui.ts. Expo's storage and crypto modules run in node.
 */
const appRuntime =
  /^(react-native|react-native-[\w-]+|@expo\/vector-icons|expo-router|expo-file-system|expo-image-picker|expo-image-manipulator|expo-document-picker|expo-font|d3-[\w-]+)(\/|$)/;

test("no feature's index.ts reaches React Native, a component or a chart", () => {
  const features = readdirSync(path.join(root, 'features')).filter((f) =>
    existsSync(path.join(root, 'features', f, 'index.ts')),
  );
  expect(features.length).toBeGreaterThan(10);
  const { offences } = reach(
    features.map((f) => path.join('features', f, 'index.ts')),
    appRuntime,
  );
  expect(offences).toEqual([]);
});
