/**
 * The real server as its own process (`node --import tsx server/main.ts`, one process, so SIGKILL reaches
 * the server itself and not a wrapper), on PORT=0 and a given DATA_DIR, for the crash tests.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import readline from 'node:readline';

import { repoRoot } from '@/server/paths';

export type ServerProcess = {
  /** http://127.0.0.1:<port> */
  url: string;
  child: ChildProcess;
  /** Resolves with the signal or exit code when the process has ended. */
  ended: Promise<string>;
  /** SIGKILL: no handler runs, nothing is flushed or closed. */
  kill: () => Promise<string>;
};

export async function spawnServer(dataDir: string, env: Record<string, string> = {}): Promise<ServerProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join('server', 'main.ts')], {
    cwd: repoRoot,
    env: {
      ...process.env,
      NODE_ENV: 'test',
      LOG_LEVEL: 'info',
      PORT: '0',
      DATA_DIR: dataDir,
      WEB_DIR: path.join(dataDir, 'no-web-build'),
      SEED_DEMO: '0',
      BACKUP_INTERVAL: 'off',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const ended = new Promise<string>((resolve) =>
    child.once('exit', (code, signal) => resolve(signal ?? String(code))),
  );
  let stderr = '';
  child.stderr?.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const url = await new Promise<string>((resolve, reject) => {
    const lines = readline.createInterface({ input: child.stdout! });
    const timer = setTimeout(() => reject(new Error(`server did not start in 60 s:\n${stderr}`)), 60_000);
    lines.on('line', (line) => {
      try {
        const entry = JSON.parse(line) as { msg?: string; url?: string };
        if (entry.msg === 'Pivotwatch is listening' && entry.url) {
          clearTimeout(timer);
          resolve(entry.url.replace('localhost', '127.0.0.1'));
        }
      } catch {
        // Not a log line.
      }
    });
    void ended.then((how) => {
      clearTimeout(timer);
      reject(new Error(`server ended (${how}) before listening:\n${stderr}`));
    });
  });
  return {
    url,
    child,
    ended,
    kill: () => {
      child.kill('SIGKILL');
      return ended;
    },
  };
}

export async function signIn(url: string, email: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: 'pivotwatch-demo' }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${email}: ${res.status} ${await res.text()}`);
  return ((await res.json()) as { token: string }).token;
}
