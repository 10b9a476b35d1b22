/**
 * Shared by the review desk's server tests: pushing inspections as the demo inspector (or a second
 * inspector made for the test) and reading the audit log. Values are invented; physics checks name their
 * source where they make one.
 */

import type { Express } from 'express';
import { and, asc, eq } from 'drizzle-orm';
import request from 'supertest';

import { auditLog } from '@/db/server/schema';
import type { InspectionRecord } from '@/features/records/schema';
import { createUser } from '@/server/auth/service';
import type { Db } from '@/server/db';
import { auditRowOrder } from '@/server/registry/audit-query';
import { analysePending } from '@/server/sync/analysis';

import { pushSigned, registerPhoneKey, signInAs } from './helpers';
import type { Clients } from './registry-helpers';

type Client = Clients['inspector'];

/** Pushes records as `client`, expects every one accepted, and waits for the server's analysis. */
export async function pushAccepted(db: Db, client: Client, records: InspectionRecord[]): Promise<void> {
  const res = await client.push(records);
  expect(res.status).toBe(200);
  expect(res.body.results.map((r: { status: string }) => r.status)).toEqual(records.map(() => 'accepted'));
  await analysePending(db);
}

/** A second inspector with their own signed-in client, for "only their own" checks. */
export async function secondInspector(app: Express, db: Db, email = 'ines.harrow@pivotwatch.test') {
  const password = 'second-inspector-pw';
  const user = await createUser(db, {
    email,
    name: 'Ines Harrow',
    role: 'inspector',
    password,
    companyId: null,
  });
  const token = await signInAs(app, email, password);
  const key = await registerPhoneKey(app, token);
  const auth = (req: request.Test) => req.set('Authorization', `Bearer ${token}`);
  return {
    user,
    get: (path: string) => auth(request(app).get(path)),
    post: (path: string, body?: unknown) => auth(request(app).post(path)).send(body as object),
    push: (records: readonly unknown[]) => pushSigned(app, token, key, records),
  };
}

/** The audit entries of one record, oldest first. */
export function auditOf(db: Db, entity: 'finding' | 'inspection' | 'schedule', entityId: string) {
  return db
    .select()
    .from(auditLog)
    .where(and(eq(auditLog.entity, entity), eq(auditLog.entityId, entityId)))
    .orderBy(asc(auditLog.at), asc(auditRowOrder))
    .all();
}
