// tsc loads global declarations in the order files reach it, and the last `setTimeout` loaded wins. This
// file is the first root file (in name order) that reaches the server's node typings, which would let React
// Native's globals (number timers) load after them and break `setTimeout(...).unref()` in server/main.ts.
// Loading React Native's first keeps node's last, as for every other file. (`node:timers` does not help:
// @types/node declares its timers as the globals.) The first bench file in name order must keep this line.
/// <reference types="react-native" />
/**
 * Load for the review-queue bench: the real server in a child process (so the load generator does not
 * share its event loop), driven by autocannon over loopback, with the server's CPU time per request read
 * from /proc.
 */
import { type ChildProcess, execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

import autocannon from 'autocannon';

import { startLocalServer } from '@/scripts/local-server';

export const CONNECTIONS = 50;

export const fmt = (v: number, digits = 0) => v.toLocaleString('en', { maximumFractionDigits: digits });
const percentile = (sorted: number[], p: number) =>
  sorted.length ? sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))] : NaN;

/** `nodeArgs` go before the script, e.g. `--cpu-prof` flags for a profile of the server alone. */
export async function startServerProcess(
  dataDir: string,
  nodeArgs: string[] = [],
): Promise<{ child: ChildProcess; base: string }> {
  const { child, baseUrl } = await startLocalServer({
    dataDir,
    nodeArgs,
    env: {
      WEB_DIR: path.join(dataDir, 'none'),
      NODE_ENV: 'development',
      SEED_DEMO: '0',
      // One log line per request is written in production; the bench measures the queue, not the log.
      LOG_LEVEL: 'warn',
    },
    timeoutMs: 120_000,
  });
  return { child, base: baseUrl };
}

const clockTicks = (() => {
  try {
    return Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;
  } catch {
    return 100;
  }
})();

/** CPU time (user + system, ms) the process has used so far, from /proc; null where there is none. */
function cpuMsOf(pid: number | undefined): number | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    // utime and stime are the 14th and 15th fields of the line, the 12th and 13th after the name.
    return ((Number(fields[11]) + Number(fields[12])) / clockTicks) * 1000;
  } catch {
    return null;
  }
}

export type Figures = {
  p50: number;
  p95: number;
  p99: number;
  rps: number;
  requests: number;
  bad: number;
  bytes: number;
  /** The server process's CPU time per request (µs), null where it cannot be read. */
  serverCpuUs: number | null;
};

export async function drive(
  base: string,
  paths: string[],
  headers: Record<string, string>,
  seconds: number,
  serverPid?: number,
): Promise<Figures> {
  const cpuBefore = cpuMsOf(serverPid);
  const times: number[] = [];
  let bad = 0;
  let bytes = 0;
  let next = 0;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      {
        url: base,
        connections: CONNECTIONS,
        duration: seconds,
        headers,
        requests: [
          {
            method: 'GET',
            setupRequest: (request) => ({ ...request, path: paths[next++ % paths.length] }),
          },
        ],
      },
      (error: unknown, done) => (error ? reject(error) : resolve(done)),
    );
    instance.on('response', (_client, statusCode, resBytes, responseTime) => {
      times.push(responseTime);
      bytes += resBytes;
      if (statusCode !== 200) bad++;
    });
  });
  const cpuAfter = cpuMsOf(serverPid);
  times.sort((a, b) => a - b);
  return {
    p50: percentile(times, 0.5),
    p95: percentile(times, 0.95),
    p99: percentile(times, 0.99),
    rps: times.length / result.duration,
    requests: times.length,
    bad: bad + result.errors + result.timeouts,
    bytes: times.length ? bytes / times.length : 0,
    serverCpuUs:
      cpuBefore === null || cpuAfter === null || !times.length
        ? null
        : ((cpuAfter - cpuBefore) * 1000) / times.length,
  };
}

export function print(label: string, f: Figures) {
  console.log(
    `${label.padEnd(22)} p50 ${fmt(f.p50, 2)} ms  p95 ${fmt(f.p95, 2)} ms  p99 ${fmt(f.p99, 2)} ms  ${fmt(f.rps)} req/s  (${fmt(f.requests)} requests, ${f.bad} not 200, ${fmt(f.bytes / 1024, 1)} kB each)`,
  );
  if (f.serverCpuUs !== null)
    console.log(
      `${''.padEnd(22)} server CPU ${fmt(f.serverCpuUs)} µs per request: about ${fmt(1e6 / f.serverCpuUs)} req/s from one free core`,
    );
}
