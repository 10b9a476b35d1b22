import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import type { Express } from 'express';
import request from 'supertest';

import { eq } from 'drizzle-orm';

import { users } from '@/db/server/schema';
import { apiErrorSchema } from '@/lib/api-errors';
import { createApp } from '@/server/app';
import { loadConfig, type Config, type Env } from '@/server/config';
import { openDb, type Db } from '@/server/db';
import { createLogger } from '@/server/logger';
import { demoPassword, seedDemoData } from '@/server/seed/demo';

import { newPhoneKey, signedBatch, type PhoneKey } from '../support/phone-keys';

export function makeTempDir(prefix = 'pivotwatch-test-'): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), prefix));
}

export type TestServer = {
  app: Express;
  db: Db;
  config: Config;
  dataDir: string;
  close: () => void;
};

/**
 * A fresh app on its own temp DATA_DIR, migrated and (by default) seeded with the demo scenario.
 * The sign-in limit is generous unless a test asks for the real one, so other tests don't trip it.
 */
export async function makeTestServer(
  opts: {
    env?: Env;
    seed?: boolean;
    /** 'app-default' leaves the limit to createApp (10 failures per 15 minutes). */
    signInLimit?: { windowMs: number; max: number } | 'app-default';
    /** Failed sign-ins per account e-mail; unset follows `signInLimit` (server/auth/router.ts). */
    accountSignInLimit?: { windowMs: number; max: number };
  } = {},
): Promise<TestServer> {
  const dataDir = makeTempDir();
  const config = loadConfig({
    NODE_ENV: 'test',
    DATA_DIR: dataDir,
    WEB_DIR: path.join(dataDir, 'no-web-build'),
    ...opts.env,
  });
  const database = openDb(config.dataDir);
  if (opts.seed ?? true) await seedDemoData(database.db, config);
  const app = createApp({
    db: database.db,
    config,
    logger: createLogger(config),
    signInLimit:
      opts.signInLimit === 'app-default'
        ? undefined
        : (opts.signInLimit ?? { windowMs: 60_000, max: 10_000 }),
    accountSignInLimit: opts.accountSignInLimit,
  });
  return {
    app,
    db: database.db,
    config,
    dataDir,
    close: () => {
      database.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export async function signInAs(app: Express, email: string, password = demoPassword): Promise<string> {
  const res = await request(app).post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${res.text}`);
  return res.body.token;
}

/** Registers a new phone key for the person signed in with `token`, as the phone does after sign-in. */
export async function registerPhoneKey(app: Express, token: string): Promise<PhoneKey> {
  const key = newPhoneKey();
  const res = await request(app)
    .post('/api/devices/keys')
    .set('Authorization', `Bearer ${token}`)
    .send({ publicKey: key.publicKey, label: 'Test phone' });
  if (res.status !== 201) throw new Error(`phone key registration failed: ${res.status} ${res.text}`);
  return key;
}

/** POST /api/sync/push as a phone: with `token`, each record signed by `key` (tests/support/phone-keys.ts). */
export const pushSigned = (app: Express, token: string, key: PhoneKey, records: readonly unknown[]) =>
  request(app).post('/api/sync/push').set('Authorization', `Bearer ${token}`).send(signedBatch(records, key));

export function userIdOf(db: Db, email: string): string {
  const row = db.select({ id: users.id }).from(users).where(eq(users.email, email)).get();
  if (!row) throw new Error(`no user ${email}`);
  return row.id;
}

/** Asserts the one JSON error shape, the status and code, and that nothing internal leaked. */
export function expectApiError(res: request.Response, status: number, code: string) {
  expect(res.status).toBe(status);
  expect(res.headers['content-type']).toMatch(/^application\/json/);
  const parsed = apiErrorSchema.safeParse(res.body);
  expect(parsed.success).toBe(true);
  expect(res.body.error.code).toBe(code);
  expect(res.body.error.message.length).toBeGreaterThan(0);
  expect(res.text).not.toMatch(/\bat .+\.(ts|js):\d+|node_modules|stack/i);
  return res.body.error as { code: string; message: string; issues?: { path: string; message: string }[] };
}
