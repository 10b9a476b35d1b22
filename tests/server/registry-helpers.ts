import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import type { Express } from 'express';
import request from 'supertest';

import { createApp } from '@/server/app';
import { loadConfig } from '@/server/config';
import { openDb } from '@/server/db';
import { createLogger } from '@/server/logger';
import { demoUsers, seedDemoData } from '@/server/seed/demo';

import { signedBatch, type PhoneKey } from '../support/phone-keys';
import { makeTempDir, registerPhoneKey, signInAs, type TestServer } from './helpers';

export type Email = (typeof demoUsers)[number]['email'];

/**
 * Signed-in request builders for every demo user of one app. Like the phone at sign-in, each person who
 * can push gets a phone key registered for them (POST /api/devices/keys); `push` sends records signed with
 * it (tests/support/phone-keys.ts).
 */
export async function demoClients(app: Express) {
  const tokens = new Map<string, string>();
  const keys = new Map<string, PhoneKey>();
  for (const user of demoUsers) {
    const token = await signInAs(app, user.email);
    tokens.set(user.email, token);
    if (user.role !== 'operator') keys.set(user.email, await registerPhoneKey(app, token));
  }
  return clientsOf(app, tokens, keys);
}

/** Request builders for the tokens given, each with `push` signing with that person's phone key. */
export function clientsOf(app: Express, tokens: Map<string, string>, keys: Map<string, PhoneKey>) {
  const as = (email: string | null) => {
    const auth = (req: request.Test) =>
      email ? req.set('Authorization', `Bearer ${tokens.get(email)}`) : req;
    const post = (path: string, body?: unknown) => auth(request(app).post(path)).send(body as object);
    const phoneKey = email ? keys.get(email) : undefined;
    return {
      get: (path: string) => auth(request(app).get(path)),
      post,
      put: (path: string, body?: unknown) => auth(request(app).put(path)).send(body as object),
      /** PUT of raw bytes (an upload by content), with the Content-Type given. */
      putBytes: (path: string, bytes: Buffer, type = 'application/pdf') =>
        auth(request(app).put(path).set('Content-Type', type)).send(bytes),
      patch: (path: string, body?: unknown) => auth(request(app).patch(path)).send(body as object),
      delete: (path: string) => auth(request(app).delete(path)),
      phoneKey,
      /** POST /api/sync/push with each record signed by this person's phone key (unsigned without one). */
      push: (records: readonly unknown[], batchId?: string) =>
        post(
          '/api/sync/push',
          phoneKey ? signedBatch(records, phoneKey, batchId) : { batchId: batchId ?? randomUUID(), records },
        ),
    };
  };
  return {
    as,
    admin: as('admin@pivotwatch.test'),
    supervisor: as('supervisor@pivotwatch.test'),
    inspector: as('inspector@pivotwatch.test'),
    operator: as('operator@pivotwatch.test'),
    operator2: as('operator2@pivotwatch.test'),
    anonymous: as(null),
  };
}

export type Clients = Awaited<ReturnType<typeof demoClients>>;

/**
 * A test server whose clock is pinned to `now`, seeded on that same day, so due dates and statuses are
 * the same whenever the tests run.
 */
export async function makePinnedServer(now: Date): Promise<TestServer> {
  const dataDir = makeTempDir();
  const config = loadConfig({
    NODE_ENV: 'test',
    DATA_DIR: dataDir,
    WEB_DIR: path.join(dataDir, 'no-web-build'),
  });
  const database = openDb(config.dataDir);
  await seedDemoData(database.db, config, { now });
  const app = createApp({
    db: database.db,
    config,
    logger: createLogger(config),
    signInLimit: { windowMs: 60_000, max: 10_000 },
    now: () => now,
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
