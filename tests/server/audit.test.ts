import { auditListResponseSchema, rideListPageSchema, type AuditEntry } from '@/features/registry/schema';
import { littleKiteDesign } from '@/server/seed/demo-design';

import { expectApiError, userIdOf, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';

let server: TestServer;
let api: Clients;
let kiteId: string;
beforeAll(async () => {
  server = await makePinnedServer(new Date('2025-06-02T09:00:00Z'));
  api = await demoClients(server.app);
  kiteId = rideListPageSchema.parse((await api.admin.get('/api/rides?q=Little%20Kite')).body).rides[0].id;
  // Four changes by two people: a company, a ride's status (which issues the operator a notice, a fifth
  // entry), a design version, a schedule.
  await api.admin.post('/api/companies', { name: 'Harrow Lane Amusements' });
  await api.supervisor.patch(`/api/rides/${kiteId}`, {
    status: 'restricted',
    statusReason: 'Gondola floor repair.',
  });
  await api.supervisor.put(`/api/rides/${kiteId}/design`, {
    reason: 'Riders at 55 kg',
    data: {
      ...littleKiteDesign,
      parts: littleKiteDesign.parts.map((p) => (p.kind === 'point' ? { ...p, massKg: 660 } : p)),
    },
  });
  await api.supervisor.post('/api/schedules', {
    rideId: kiteId,
    inspectionType: 'follow_up',
    dueOn: '2025-06-09',
  });
});
afterAll(() => server.close());

async function audit(query = '', as: Clients['admin'] = api.admin) {
  const res = await as.get(`/api/audit${query}`);
  expect(res.status).toBe(200);
  return auditListResponseSchema.parse(res.body);
}

test('newest first, with who, what and the record before and after', async () => {
  const { entries, total } = await audit();
  expect(total).toBe(5);
  expect(entries.map((e) => [e.entity, e.action, e.userName])).toEqual([
    ['schedule', 'create', 'Mira Delacourt'],
    ['design', 'create', 'Mira Delacourt'],
    ['notice', 'create', 'Mira Delacourt'],
    ['ride', 'update', 'Mira Delacourt'],
    ['company', 'create', 'Rowan Ashby'],
  ]);
  const ride = entries[3];
  expect(ride.summary).toBe('Ride Little Kite changed (status in_service → restricted)');
  expect(ride.before).toMatchObject({ status: 'in_service', statusReason: null });
  expect(ride.after).toMatchObject({ status: 'restricted', statusReason: 'Gondola floor repair.' });
  expect(entries[4]).toMatchObject({ before: null, after: { name: 'Harrow Lane Amusements' } });
  const times = entries.map((e) => e.at);
  expect(times).toEqual([...times].sort().reverse());
});

test('filters: entity, action, ride, author, text, time; oldest first', async () => {
  const ofRide = await audit(`?rideId=${kiteId}`);
  expect(ofRide.entries.map((e) => e.entity)).toEqual(['schedule', 'design', 'notice', 'ride']);
  expect((await audit('?entity=design,company')).total).toBe(2);
  expect((await audit('?action=update')).entries.map((e: AuditEntry) => e.entity)).toEqual(['ride']);
  expect((await audit(`?userId=${userIdOf(server.db, 'admin@pivotwatch.test')}`)).total).toBe(1);
  expect((await audit('?q=riders%20at%2055')).entries.map((e) => e.entity)).toEqual(['design']);
  expect((await audit('?from=2999-01-01')).total).toBe(0);
  const today = new Date().toISOString().slice(0, 10);
  expect((await audit(`?to=${today}`)).total).toBe(5);
  expect((await audit('?to=2000-01-01')).total).toBe(0);
  const oldest = await audit('?sort=at&pageSize=1');
  expect(oldest).toMatchObject({ total: 5, page: 1, pageSize: 1 });
  expect(oldest.entries.map((e) => e.entity)).toEqual(['company']);
});

test('supervisors read it too; inspectors and operators do not; bad filters → 400', async () => {
  expect((await audit('', api.supervisor)).total).toBe(5);
  expectApiError(await api.inspector.get('/api/audit'), 403, 'forbidden');
  expectApiError(await api.operator.get('/api/audit'), 403, 'forbidden');
  const bad = expectApiError(
    await api.admin.get('/api/audit?entity=people&from=soon'),
    400,
    'validation_failed',
  );
  expect(bad.issues?.map((i) => i.path).sort()).toEqual(['query.entity.0', 'query.from']);
});
