/**
 * The real server in a child process on a fresh data directory holding the demo scenario, for the
 * benchmarks that time single requests over loopback (cycle-http.ts, notice-pdf.ts): the bench's own
 * event loop never shares the server's, and the server's CPU time is read from /proc.
 */
import type { ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';

import { startServerProcess } from '@/bench/http-load';
import { now } from '@/bench/timing';
import { loadConfig } from '@/server/config';
import { openDb } from '@/server/db';
import { demoPassword, seedDemoData } from '@/server/seed/demo';

export type SeededServer = {
  base: string;
  dataDir: string;
  pid: number | undefined;
  /** A bearer header for a demo user. */
  signIn: (email: string) => Promise<Record<string, string>>;
  stop: () => Promise<void>;
};

export async function startSeededServer(): Promise<SeededServer> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'pivotwatch-bench-'));
  const config = loadConfig({
    NODE_ENV: 'development',
    DATA_DIR: dataDir,
    WEB_DIR: path.join(dataDir, 'none'),
  });
  const database = openDb(config.dataDir);
  await seedDemoData(database.db, config);
  database.close();
  let server: { child: ChildProcess; base: string };
  try {
    server = await startServerProcess(dataDir);
  } catch (error) {
    fs.rmSync(dataDir, { recursive: true, force: true });
    throw error;
  }
  const { child, base } = server;
  return {
    base,
    dataDir,
    pid: child.pid,
    signIn: async (email) => {
      const res = await fetch(`${base}/api/auth/sign-in`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email, password: demoPassword }),
      });
      if (!res.ok) throw new Error(`sign-in as ${email} failed: ${res.status}`);
      return { authorization: `Bearer ${((await res.json()) as { token: string }).token}` };
    },
    stop: async () => {
      const exited = new Promise((resolve) => child.once('exit', resolve));
      child.kill('SIGTERM');
      await exited;
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });

export type Timed = {
  ms: number;
  status: number;
  /** Bytes as transferred (compressed when the server compressed them). */
  bytes: number;
  encoding: string | undefined;
  /** The body decoded, read after the timing. */
  text: () => string;
};

/**
 * One request timed from sending to its last byte, on a kept-alive connection as a browser holds one,
 * asking for gzip as a browser does. The body is decoded only after the clock stops.
 */
export function timedRequest(
  url: string,
  opts: { method?: string; headers?: Record<string, string>; body?: string } = {},
): Promise<Timed> {
  return new Promise((resolve, reject) => {
    const t0 = now();
    const req = http.request(
      url,
      {
        method: opts.method ?? 'GET',
        agent,
        headers: {
          'accept-encoding': 'gzip',
          ...(opts.body !== undefined ? { 'content-type': 'application/json' } : {}),
          ...opts.headers,
        },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('error', reject);
        res.on('end', () => {
          const ms = now() - t0;
          const raw = Buffer.concat(chunks);
          const encoding = res.headers['content-encoding'];
          resolve({
            ms,
            status: res.statusCode ?? 0,
            bytes: raw.length,
            encoding,
            text: () => (encoding === 'gzip' ? zlib.gunzipSync(raw) : raw).toString('utf8'),
          });
        });
      },
    );
    req.on('error', reject);
    req.end(opts.body);
  });
}

// /proc counts CPU time in USER_HZ ticks, 100 a second on Linux.
const clockTicks = 100;

/** CPU time (user + system, ms) a process has used so far, worker threads included; null without /proc. */
export function cpuMsOf(pid: number | undefined): number | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return ((Number(fields[11]) + Number(fields[12])) / clockTicks) * 1000;
  } catch {
    return null;
  }
}

export const loadLine = () =>
  `load average (1/5/15 min) ${os
    .loadavg()
    .map((l) => l.toFixed(1))
    .join(' / ')} on ${os.cpus().length} cores; other work on the machine lengthens every time`;
