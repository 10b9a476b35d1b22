/**
 * `npm test`: static checks, unit and server tests, then browser tests. Ends with the line
 * `tests: N passed, N failed`: jest's counts over every test, plus one for each static check.
 * Exits non-zero on any failure.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

import { CHROMIUM_PATH } from '@/scripts/browser';

const ROOT = join(__dirname, '..');
const OUT = join(ROOT, 'artifacts', 'test-results');
const bin = (name: string) => join(ROOT, 'node_modules', '.bin', name);

type Step = { name: string; ok: boolean; passed: number; failed: number };
const steps: Step[] = [];

function run(cmd: string, args: string[], env: Record<string, string> = {}): boolean {
  const res = spawnSync(cmd, args, { cwd: ROOT, stdio: 'inherit', env: { ...process.env, ...env } });
  return res.status === 0;
}

function check(name: string, cmd: string, args: string[]) {
  console.log(`\n▶ ${name}`);
  const ok = run(cmd, args);
  // Each static check counts as one test in the closing line, so a failing check is never hidden.
  steps.push({ name, ok, passed: ok ? 1 : 0, failed: ok ? 0 : 1 });
}

function jest(name: string, args: string[]) {
  console.log(`\n▶ ${name}`);
  const file = join(OUT, `${name.replace(/\W+/g, '-')}.json`);
  const ok = run(bin('jest'), [...args, '--json', `--outputFile=${file}`]);
  let passed = 0;
  let failed = 0;
  if (existsSync(file)) {
    const r = JSON.parse(readFileSync(file, 'utf8')) as {
      numPassedTests: number;
      numFailedTests: number;
      numRuntimeErrorTestSuites: number;
    };
    passed = r.numPassedTests;
    // A suite that fails to load runs no test; count it as a failure so it is never silent.
    failed = r.numFailedTests + r.numRuntimeErrorTestSuites;
  } else if (!ok) {
    failed = 1;
  }
  steps.push({ name, ok, passed, failed });
}

/** Debian's chromium drives the browser tests; install it when we can, else say how. */
function ensureChromium(): boolean {
  if (existsSync(CHROMIUM_PATH)) return true;
  if (process.getuid?.() === 0) {
    console.log('▶ installing Debian chromium for the browser tests');
    if (run('apt-get', ['update']) && run('apt-get', ['install', '-y', 'chromium'])) return true;
  }
  console.error(
    'Browser tests need Debian chromium: run `apt-get update && apt-get install -y chromium` as root.',
  );
  return false;
}

mkdirSync(OUT, { recursive: true });
const quick = process.argv.includes('--no-browser');

check('lint (eslint)', bin('eslint'), ['.', '--max-warnings=0']);
check('format (prettier --check)', bin('prettier'), ['--check', '.']);
// tsc checks every link against types/routes.d.ts; say plainly when that file no longer matches app/.
check('route types (types/routes.d.ts matches app/)', bin('tsx'), ['scripts/route-types.ts', '--check']);
check('types (tsc --noEmit)', bin('tsc'), ['--noEmit', '-p', 'tsconfig.json']);
jest('unit and server tests', ['--ci']);
if (!quick) {
  if (ensureChromium()) jest('browser tests', ['--ci', '-c', 'jest.browser.config.js']);
  else steps.push({ name: 'browser tests', ok: false, passed: 0, failed: 1 });
}

const passed = steps.reduce((n, s) => n + s.passed, 0);
const failed = steps.reduce((n, s) => n + s.failed, 0);
console.log('\nSummary');
for (const s of steps) {
  const counts = s.passed + s.failed > 0 ? ` (${s.passed} passed, ${s.failed} failed)` : '';
  console.log(`  ${s.ok ? 'ok  ' : 'FAIL'} ${s.name}${counts}`);
}
const allOk = steps.every((s) => s.ok);
console.log(`tests: ${passed} passed, ${allOk ? failed : Math.max(failed, 1)} failed`);
process.exit(allOk ? 0 : 1);
