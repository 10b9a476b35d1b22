/**
 * The server's word on a record: who recorded it (the token's user, never someone else's work sent from a
 * shared phone), when (no submission after the server received it, no start after the submission, and
 * the schedule moved by the server's receipt when the phone's clock ran ahead), and who may approve it
 * (not the person who recorded it, unless the inspection body allows it).
 */

import { and, eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { inspectionSchedules } from '@/db/server/schema';
import { pushResultSchema } from '@/features/records/schema';
import { inspectionResponseSchema } from '@/features/review/inspection-schema';
import { selfApprovalSettingSchema } from '@/features/review/schema';

import { expectApiError, userIdOf, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { pushAccepted } from './review-desk-fixtures';
import { demoRide, makeRecord } from './sync-fixtures';

const now = new Date('2026-05-04T12:00:00.000Z');
jest.setTimeout(30_000);

let server: TestServer;
let api: Clients;
let skylark: ReturnType<typeof demoRide>;
let inspectorId: string;
beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
  skylark = demoRide(server.db, 'Skylark');
  inspectorId = userIdOf(server.db, 'inspector@pivotwatch.test');
});
afterAll(() => server.close());

const countInspections = () => server.db.select({ id: inspections.id }).from(inspections).all().length;

async function pushOne(record: object, client = api.inspector) {
  const res = await client.push([record]);
  expect(res.status).toBe(200);
  return pushResultSchema.parse(res.body).results[0];
}

describe('the author of a record', () => {
  test('a record written by another person is refused, naming authorId, and nothing is stored', async () => {
    const supervisorId = userIdOf(server.db, 'supervisor@pivotwatch.test');
    const before = countInspections();
    const result = await pushOne(makeRecord(skylark, { authorId: supervisorId }));
    expect(result.status).toBe('rejected');
    expect(result.issues?.map((i) => i.path)).toEqual(['authorId']);
    expect(countInspections()).toBe(before);
  });

  test("the sender's own record is accepted, and one from before phones wrote an author still is", async () => {
    expect((await pushOne(makeRecord(skylark, { authorId: inspectorId }))).status).toBe('accepted');
    const legacy = makeRecord(skylark);
    delete legacy.authorId;
    expect((await pushOne(legacy)).status).toBe('accepted');
    const stored = server.db.select().from(inspections).where(eq(inspections.id, legacy.id)).get();
    expect(stored?.inspectorId).toBe(inspectorId);
  });
});

describe('the time of record', () => {
  // The server receives with the real clock (receivedAt); the margin is ingest's 5-minute skew.
  const fromNow = (ms: number) => new Date(Date.now() + ms).toISOString();

  test('a submission more than the skew after receipt is refused on submittedAt', async () => {
    const record = makeRecord(skylark, { startedAt: fromNow(-60_000), submittedAt: fromNow(60 * 60_000) });
    const result = await pushOne(record);
    expect(result).toMatchObject({ status: 'rejected' });
    expect(result.issues?.map((i) => i.path)).toEqual(['submittedAt']);
  });

  test('a phone clock a minute ahead is within the skew', async () => {
    const record = makeRecord(skylark, { startedAt: fromNow(-60_000), submittedAt: fromNow(60_000) });
    expect((await pushOne(record)).status).toBe('accepted');
  });

  test('a start after the submission is refused on startedAt', async () => {
    const record = makeRecord(skylark, {
      startedAt: '2026-05-04T09:00:00.000Z',
      submittedAt: '2026-05-04T08:40:00.000Z',
    });
    const result = await pushOne(record);
    expect(result.status).toBe('rejected');
    expect(result.issues?.map((i) => i.path)).toEqual(['startedAt']);
  });

  test('approval moves the schedule by the receipt day when a stored submission is later than it', async () => {
    // A record stored before ingest refused future times: the phone said 20 May, the server got it 4 May.
    const record = makeRecord(skylark, { type: 'periodic' });
    await pushAccepted(server.db, api.inspector, [record]);
    server.db
      .update(inspections)
      .set({ submittedAt: '2026-05-20T10:00:00.000Z', receivedAt: '2026-05-04T09:00:00.000Z' })
      .where(eq(inspections.id, record.id))
      .run();
    expect(
      (await api.supervisor.post(`/api/inspections/${record.id}/decision`, { decision: 'approve' })).status,
    ).toBe(200);
    const schedule = server.db
      .select()
      .from(inspectionSchedules)
      .where(
        and(eq(inspectionSchedules.rideId, skylark.id), eq(inspectionSchedules.inspectionType, 'periodic')),
      )
      .get();
    expect(schedule?.lastDoneOn).toBe('2026-05-04');
  });
});

describe('approving one’s own inspection', () => {
  const decide = (id: string, body: object, client = api.supervisor) =>
    client.post(`/api/inspections/${id}/decision`, body);

  test('is refused by default with the reason, shown to the desk; returning stays possible', async () => {
    const own = makeRecord(skylark);
    await pushAccepted(server.db, api.supervisor, [own]);
    const err = expectApiError(await decide(own.id, { decision: 'approve' }), 403, 'own_inspection');
    expect(err.message).toMatch(/You recorded this inspection/);
    expect(server.db.select().from(inspections).where(eq(inspections.id, own.id)).get()?.reviewState).toBe(
      'submitted',
    );

    const detail = inspectionResponseSchema.parse(
      (await api.supervisor.get(`/api/inspections/${own.id}`)).body,
    );
    expect(detail.inspection.approvalRefusal).toMatch(/another supervisor must approve it/);
    // Another decider reads the same inspection with nothing in the way.
    const forAdmin = inspectionResponseSchema.parse((await api.admin.get(`/api/inspections/${own.id}`)).body);
    expect(forAdmin.inspection.approvalRefusal).toBeNull();

    expect((await decide(own.id, { decision: 'return', note: 'Add the pivot 2 photo' })).status).toBe(200);
  });

  test('only an administrator changes the setting; once allowed, the supervisor approves their own', async () => {
    const before = selfApprovalSettingSchema.parse(
      (await api.supervisor.get('/api/settings/self-approval')).body.selfApproval,
    );
    expect(before).toEqual({ allowed: false, updatedAt: null, updatedByName: null });
    expectApiError(
      await api.supervisor.put('/api/settings/self-approval', { allowed: true }),
      403,
      'forbidden',
    );
    expectApiError(await api.admin.put('/api/settings/self-approval', {}), 400, 'validation_failed');
    expectApiError(
      await api.admin.put('/api/settings/self-approval', { allowed: true, extra: 1 }),
      400,
      'validation_failed',
    );

    const put = await api.admin.put('/api/settings/self-approval', { allowed: true });
    expect(put.status).toBe(200);
    expect(put.body.selfApproval).toMatchObject({ allowed: true, updatedByName: 'Rowan Ashby' });

    const own = makeRecord(skylark);
    await pushAccepted(server.db, api.supervisor, [own]);
    expect((await decide(own.id, { decision: 'approve' })).status).toBe(200);
    await api.admin.put('/api/settings/self-approval', { allowed: false });
  });
});
