import fs from 'node:fs';
import path from 'node:path';

import type { Express } from 'express';
import request from 'supertest';

import { createApp } from '@/server/app';
import { loadConfig } from '@/server/config';
import { openDb } from '@/server/db';
import { createLogger } from '@/server/logger';
import { demoUsers, seedDemoData } from '@/server/seed/demo';

import { makeTempDir, signInAs, type TestServer } from './helpers';

export type Email = (typeof demoUsers)[number]['email'];

/** Signed-in request builders for every demo user of one app. */
export async function demoClients(app: Express) {
  const tokens = new Map<string, string>();
  for (const user of demoUsers) tokens.set(user.email, await signInAs(app, user.email));
  const as = (email: string | null) => {
    const auth = (req: request.Test) =>
      email ? req.set('Authorization', `Bearer ${tokens.get(email)}`) : req;
    return {
      get: (path: string) => auth(request(app).get(path)),
      post: (path: string, body?: unknown) => auth(request(app).post(path)).send(body as object),
      put: (path: string, body?: unknown) => auth(request(app).put(path)).send(body as object),
      patch: (path: string, body?: unknown) => auth(request(app).patch(path)).send(body as object),
      delete: (path: string) => auth(request(app).delete(path)),
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
