import type { Express } from 'express';
import request from 'supertest';

import { demoUsers } from '@/server/seed/demo';

import { signInAs } from './helpers';

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
