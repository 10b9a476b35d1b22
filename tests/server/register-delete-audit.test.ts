/**
 * Every delete the register's screens offer leaves an audit entry with the record as it was, and a
 * refused delete leaves nothing at all (no row removed, no entry). Company deletes are covered in
 * register-api.test.ts, schedules in schedules.test.ts, checklist archiving in checklist-templates.test.ts;
 * this file covers the site and the ride, whose successful deletes were not checked for their entry.
 */
import { count, eq } from 'drizzle-orm';

import { auditLog, rides, sites, users } from '@/db/server/schema';
import { rideResponseSchema, siteListResponseSchema, siteResponseSchema } from '@/features/registry/schema';
import { auditRowOrder } from '@/server/registry/audit-query';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';

let server: TestServer;
let api: Clients;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
});
afterAll(() => server.close());

const entriesOf = (id: string) =>
  server.db.select().from(auditLog).where(eq(auditLog.entityId, id)).orderBy(auditRowOrder).all();
const auditCount = () => server.db.select({ n: count() }).from(auditLog).get()?.n ?? 0;

async function corvaneId(): Promise<string> {
  const res = await api.admin.get('/api/sites?q=Lowfield');
  return siteListResponseSchema.parse(res.body).sites[0].operatorCompanyId;
}

test('a site deleted by an admin: gone, with a delete entry holding the site as it was', async () => {
  const created = await api.admin.post('/api/sites', {
    name: 'Brackley Meadow',
    kind: 'fairground',
    locality: 'Brackley',
    timeZone: 'Europe/London',
    operatorCompanyId: await corvaneId(),
  });
  const site = siteResponseSchema.parse(created.body).site;
  expect((await api.admin.delete(`/api/sites/${site.id}`)).status).toBe(204);
  expect(server.db.select().from(sites).where(eq(sites.id, site.id)).all()).toHaveLength(0);

  const entries = entriesOf(site.id);
  expect(entries.map((e) => `${e.entity} ${e.action}`)).toEqual(['site create', 'site delete']);
  expect(entries[1]).toMatchObject({ before: site, after: null, summary: 'Site Brackley Meadow removed' });
  const admin = server.db.select().from(users).where(eq(users.email, 'admin@pivotwatch.test')).get();
  expect(entries[1].userId).toBe(admin?.id);
});

test('a ride entered by mistake: deleted with its entry under the ride; a supervisor is refused (403), nothing written', async () => {
  const site = siteListResponseSchema.parse((await api.admin.get('/api/sites?q=Tamsworth')).body).sites[0];
  const created = await api.admin.post('/api/rides', {
    name: 'Moth Spinner (typed twice)',
    rideClass: 'rotating_arm',
    siteId: site.id,
    operatorCompanyId: site.operatorCompanyId,
  });
  const ride = rideResponseSchema.parse(created.body).ride;

  const before = auditCount();
  expectApiError(await api.supervisor.delete(`/api/rides/${ride.id}`), 403, 'forbidden');
  expect(auditCount()).toBe(before);

  expect((await api.admin.delete(`/api/rides/${ride.id}`)).status).toBe(204);
  expect(server.db.select().from(rides).where(eq(rides.id, ride.id)).all()).toHaveLength(0);
  const entries = entriesOf(ride.id);
  expect(entries.map((e) => `${e.entity} ${e.action}`)).toEqual(['ride create', 'ride delete']);
  expect(entries[1]).toMatchObject({ rideId: ride.id, after: null });
  expect(entries[1].before).toMatchObject({ id: ride.id, name: 'Moth Spinner (typed twice)' });
});

test('a refused delete (a site with rides) writes no entry and removes nothing', async () => {
  const busy = siteListResponseSchema.parse((await api.admin.get('/api/sites?q=Tamsworth')).body).sites[0];
  const before = auditCount();
  const error = expectApiError(await api.admin.delete(`/api/sites/${busy.id}`), 409, 'in_use');
  expect(error.message).toMatch(/still has \d+ ride\(s\)/);
  expect(auditCount()).toBe(before);
  expect(server.db.select().from(sites).where(eq(sites.id, busy.id)).all()).toHaveLength(1);
});
