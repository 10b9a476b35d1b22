import fs from 'node:fs';

import { startFakeSmtp } from '@/server/mail';
import { startServer } from '@/server/main';
import { demoPassword, demoUsers } from '@/server/seed/demo';

import { makeTempDir } from './helpers';

const dirs: string[] = [];
afterAll(() => {
  for (const dir of dirs) fs.rmSync(dir, { recursive: true, force: true });
});
function tempDir() {
  const dir = makeTempDir('pivotwatch-main-');
  dirs.push(dir);
  return dir;
}

async function signIn(url: string, email: string) {
  return fetch(`${url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: demoPassword }),
  });
}

test('starts on a free port, seeds, serves the API; a restart keeps users and sessions', async () => {
  const dataDir = tempDir();
  const env = { PORT: '0', DATA_DIR: dataDir, NODE_ENV: 'test', WEB_DIR: `${dataDir}/web` };

  const first = await startServer({ env, handleSignals: false });
  let token: string;
  try {
    expect(first.port).toBeGreaterThan(0);
    const health = await fetch(`${first.url}/api/health`);
    expect(await health.json()).toEqual({ ok: true });
    const res = await signIn(first.url, 'admin@pivotwatch.test');
    expect(res.status).toBe(200);
    token = (await res.json()).token;
  } finally {
    await first.close();
  }
  await expect(fetch(`${first.url}/api/health`)).rejects.toThrow();

  const second = await startServer({ env, handleSignals: false });
  try {
    // Same DATA_DIR: the kept secret still verifies the old token, and no second set of users was seeded.
    const me = await fetch(`${second.url}/api/me`, { headers: { Authorization: `Bearer ${token}` } });
    expect(me.status).toBe(200);
    const admin = await signIn(second.url, 'admin@pivotwatch.test');
    const users = await fetch(`${second.url}/api/admin/users`, {
      headers: { Authorization: `Bearer ${(await admin.json()).token}` },
    });
    expect((await users.json()).users).toHaveLength(demoUsers.length);
  } finally {
    await second.close();
  }
});

test('in production no demo users are seeded', async () => {
  const dataDir = tempDir();
  // Production needs a real SMTP server; a loopback mailbox stands in for it.
  const smtp = await startFakeSmtp({ dir: `${dataDir}/smtp` });
  const server = await startServer({
    env: {
      PORT: '0',
      DATA_DIR: dataDir,
      SMTP_URL: smtp.url,
      NODE_ENV: 'production',
      LOG_LEVEL: 'silent',
      WEB_DIR: `${dataDir}/web`,
    },
    handleSignals: false,
  });
  try {
    const res = await signIn(server.url, 'admin@pivotwatch.test');
    expect(res.status).toBe(401);
  } finally {
    await server.close();
    await smtp.close();
  }
});

test('production without SMTP_URL refuses to start: notices would go nowhere', async () => {
  const dataDir = tempDir();
  await expect(
    startServer({
      env: { PORT: '0', DATA_DIR: dataDir, NODE_ENV: 'production', LOG_LEVEL: 'silent' },
      handleSignals: false,
    }),
  ).rejects.toThrow(/SMTP_URL/);
});

test('a bad environment is refused before anything starts', async () => {
  const dataDir = tempDir();
  await expect(startServer({ env: { PORT: 'x', DATA_DIR: dataDir }, handleSignals: false })).rejects.toThrow(
    /PORT/,
  );
  expect(fs.readdirSync(dataDir)).toEqual([]);
});
