/**
 * The real server (server/main.ts) in a child process on a free loopback port: the one starter that the
 * browser tests (tests/support/browser/harness.ts), `npm run bench:web` and the HTTP benches share.
 * It runs as `node --import tsx server/main.ts` in its own process, so a load generator or a browser does
 * not share its event loop, and `nodeArgs` (e.g. `--cpu-prof`) reach the server itself.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const ROOT = join(__dirname, '..');

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      srv.close(() => (typeof addr === 'object' && addr ? resolve(addr.port) : reject(new Error('no port'))));
    });
  });
}

export type LocalServerOptions = {
  /** Set after the defaults (loopback HOST, LOG_LEVEL=warn, the port and data folder). */
  env?: Record<string, string>;
  /** Node's own flags, placed before the script. */
  nodeArgs?: string[];
  /** An existing data folder, left in place on stop; by default a fresh temporary one, removed on stop. */
  dataDir?: string;
  /** How long the server may take to answer `/api/health` (default 90 s: a cold tsx start on a busy machine). */
  timeoutMs?: number;
};

export type LocalServer = {
  baseUrl: string;
  dataDir: string;
  child: ChildProcess;
  /** Stops the server (SIGTERM, then SIGKILL after 5 s) and removes a temporary data folder. */
  stop: () => Promise<void>;
};

export async function startLocalServer(options: LocalServerOptions = {}): Promise<LocalServer> {
  const port = await freePort();
  const ownDataDir = options.dataDir === undefined;
  const dataDir = options.dataDir ?? mkdtempSync(join(tmpdir(), 'pivotwatch-local-'));
  const child = spawn(
    process.execPath,
    [...(options.nodeArgs ?? []), '--import', 'tsx', join(ROOT, 'server', 'main.ts')],
    {
      cwd: ROOT,
      env: {
        ...process.env,
        // Loopback, whatever the calling shell exports: demo users are seeded only there.
        HOST: '127.0.0.1',
        LOG_LEVEL: 'warn',
        ...options.env,
        PORT: String(port),
        DATA_DIR: dataDir,
      },
      stdio: ['ignore', 'ignore', 'pipe'],
    },
  );
  // Read stderr for the whole run: an unread pipe would stall the server once its buffer fills.
  let stderr = '';
  child.stderr?.on('data', (chunk: Buffer) => (stderr += chunk.toString()));

  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      const exited = new Promise((resolve) => child.once('exit', resolve));
      child.kill('SIGTERM');
      let timer: NodeJS.Timeout | undefined;
      await Promise.race([exited, new Promise((resolve) => (timer = setTimeout(resolve, 5000)))]);
      clearTimeout(timer);
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
    }
    // The pipe would otherwise keep a test runner waiting after the run.
    child.stderr?.destroy();
    if (ownDataDir) rmSync(dataDir, { recursive: true, force: true });
  };

  const baseUrl = `http://127.0.0.1:${port}`;
  const timeoutMs = options.timeoutMs ?? 90_000;
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    if (child.exitCode !== null) {
      await stop();
      throw new Error(`the server stopped at start (${child.exitCode}):\n${stderr}`);
    }
    const up = await fetch(`${baseUrl}/api/health`).then(
      (res) => res.ok,
      () => false,
    );
    if (up) return { baseUrl, dataDir, child, stop };
    if (Date.now() > deadline) {
      await stop();
      throw new Error(`the server did not answer within ${timeoutMs / 1000} s:\n${stderr}`);
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}
