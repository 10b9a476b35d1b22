/**
 * The real start-up (server/main.ts): it listens where HOST says, loopback by default, and seeds the demo
 * users (published password) only on loopback or with SEED_DEMO=1.
 */
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';

import { startServer } from '@/server/main';
import { demoPassword } from '@/server/seed/demo';

import { makeTempDir } from './helpers';

const dirs: string[] = [];
afterAll(() => {
  for (const dir of dirs) fs.rmSync(dir, { recursive: true, force: true });
});
function env(extra: Record<string, string> = {}) {
  const dataDir = makeTempDir('pivotwatch-listen-');
  dirs.push(dataDir);
  return { PORT: '0', DATA_DIR: dataDir, NODE_ENV: 'test', WEB_DIR: `${dataDir}/web`, HOST: '', ...extra };
}

const demoSignIn = (url: string) =>
  fetch(`${url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'admin@pivotwatch.test', password: demoPassword }),
  });

/** Whether a TCP connection to host:port is accepted. */
function connects(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port });
    socket.setTimeout(2000);
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
    socket.once('timeout', () => {
      socket.destroy();
      resolve(false);
    });
  });
}

/** An IPv4 address of this machine that is not loopback, when it has one (containers may not). */
const lanAddress = Object.values(os.networkInterfaces())
  .flat()
  .find((i) => i && i.family === 'IPv4' && !i.internal)?.address;

test('by default it listens on 127.0.0.1 only, says so in its URL, and seeds the demo users', async () => {
  const server = await startServer({ env: env(), handleSignals: false });
  try {
    expect(server.config.host).toBe('127.0.0.1');
    expect(server.url).toBe(`http://127.0.0.1:${server.port}`);
    expect(await connects('127.0.0.1', server.port)).toBe(true);
    if (lanAddress) expect(await connects(lanAddress, server.port)).toBe(false);
    expect((await demoSignIn(server.url)).status).toBe(200);
  } finally {
    await server.close();
  }
});

test('HOST=0.0.0.0 listens on every interface and does not seed the demo users', async () => {
  const server = await startServer({ env: env({ HOST: '0.0.0.0' }), handleSignals: false });
  try {
    expect(server.config.seedDemo).toBe(false);
    expect(await connects('127.0.0.1', server.port)).toBe(true);
    if (lanAddress) expect(await connects(lanAddress, server.port)).toBe(true);
    expect((await demoSignIn(server.url)).status).toBe(401);
  } finally {
    await server.close();
  }
});

test('HOST=0.0.0.0 with SEED_DEMO=1 seeds them, as asked', async () => {
  const server = await startServer({ env: env({ HOST: '0.0.0.0', SEED_DEMO: '1' }), handleSignals: false });
  try {
    expect((await demoSignIn(server.url)).status).toBe(200);
  } finally {
    await server.close();
  }
});
