import { randomUUID } from 'node:crypto';

import { count, eq } from 'drizzle-orm';

import { inspectionPhotos, inspectionReadings, inspections, syncBatches } from '@/db/server/inspections';
import { pushResultSchema, type InspectionRecord } from '@/features/records/schema';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, imageBytes, makeRecord, otherReading, photoRefFor, speedReading } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let comet: ReturnType<typeof demoRide>;
let skylark: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  comet = demoRide(server.db, 'Twin Comet');
  skylark = demoRide(server.db, 'Skylark');
});
afterAll(() => server.close());

const counts = () => ({
  inspections: server.db.select({ n: count() }).from(inspections).get()?.n,
  readings: server.db.select({ n: count() }).from(inspectionReadings).get()?.n,
  photos: server.db.select({ n: count() }).from(inspectionPhotos).get()?.n,
  batches: server.db.select({ n: count() }).from(syncBatches).get()?.n,
});

const push = (records: unknown[], batchId: string = randomUUID(), who = api.inspector) =>
  who.push(records, batchId);

describe('POST /api/sync/push', () => {
  test('a batch with one valid and one invalid record keeps the valid one and names the bad fields', async () => {
    const good = makeRecord(comet, {
      readings: [speedReading(12), otherReading(0), otherReading(1)],
      photos: [photoRefFor(imageBytes(1))],
    });
    const bad = {
      ...makeRecord(comet),
      type: 'weekly',
      readings: [{ ...speedReading(12), valueSI: 'fast' }],
    };
    const before = counts();

    const res = await push([good, bad]);
    expect(res.status).toBe(200);
    const body = pushResultSchema.parse(res.body);
    expect(body.results).toHaveLength(2);
    expect(body.results[0]).toEqual({ id: good.id, status: 'accepted' });
    expect(body.results[1]).toMatchObject({ id: bad.id, status: 'rejected' });
    const paths = body.results[1].issues?.map((i) => i.path) ?? [];
    // Paths are relative to the record, as the phone shows them beside its own fields.
    expect(paths).toEqual(expect.arrayContaining(['type', 'readings.0.valueSI']));

    const after = counts();
    expect(after.inspections).toBe((before.inspections ?? 0) + 1);
    expect(after.readings).toBe((before.readings ?? 0) + 3);
    expect(after.photos).toBe((before.photos ?? 0) + 1);
    const row = server.db.select().from(inspections).where(eq(inspections.id, good.id)).get();
    expect(row).toMatchObject({
      rideId: comet.id,
      designVersionId: comet.designVersionId,
      type: 'periodic',
      failedItems: 1,
      reviewState: 'submitted',
    });
    expect(row?.record).toEqual(good);
    expect(server.db.select().from(inspections).where(eq(inspections.id, bad.id)).get()).toBeUndefined();
  });

  test('the same batch again answers the stored result and writes nothing', async () => {
    const batchId = randomUUID();
    const records = [makeRecord(comet), makeRecord(comet, { rideId: 'no-such-ride' })];
    const first = await push(records, batchId);
    expect(first.status).toBe(200);
    expect(first.body.results.map((r: { status: string }) => r.status)).toEqual(['accepted', 'rejected']);
    const before = counts();

    const again = await push(records, batchId);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);
    // Even a different body under the same batch id gets the stored answer: the key is the batch id.
    const changed = await push([makeRecord(comet)], batchId);
    expect(changed.body).toEqual(first.body);
    expect(counts()).toEqual(before);
  });

  test('the same batch id from another user is that user’s own batch', async () => {
    const batchId = randomUUID();
    const mine = makeRecord(comet);
    const theirs = makeRecord(comet);
    expect((await push([mine], batchId)).body.results[0].status).toBe('accepted');
    expect((await push([theirs], batchId, api.supervisor)).body.results[0]).toEqual({
      id: theirs.id,
      status: 'accepted',
    });
  });

  test('a record already accepted, sent again in a new batch, is a duplicate and stored once', async () => {
    const record = makeRecord(comet, { readings: [speedReading(12), otherReading(0)] });
    expect((await push([record])).body.results[0].status).toBe('accepted');
    const before = counts();
    // Keys in another order are the same content.
    const reordered = Object.fromEntries(Object.entries(record).reverse());
    const res = await push([reordered, record]);
    expect(res.body.results).toEqual([
      { id: record.id, status: 'duplicate' },
      { id: record.id, status: 'duplicate' },
    ]);
    expect({ ...counts(), batches: before.batches }).toEqual(before);
  });

  test('the same id twice in one batch: the first is accepted, the second is a duplicate', async () => {
    const record = makeRecord(comet);
    const res = await push([record, record]);
    expect(res.body.results.map((r: { status: string }) => r.status)).toEqual(['accepted', 'duplicate']);
  });

  test('the same id with different content is refused: corrections are amendments', async () => {
    const record = makeRecord(comet);
    await push([record]);
    const edited: InspectionRecord = { ...record, notes: 'Changed my mind about the wind.' };
    const res = await push([edited]);
    expect(res.body.results[0]).toMatchObject({ id: record.id, status: 'rejected' });
    expect(res.body.results[0].issues[0].path).toBe('id');
    expect(res.body.results[0].issues[0].message).toMatch(/already accepted.*amendment/);
    const stored = server.db.select().from(inspections).where(eq(inspections.id, record.id)).get();
    expect(stored?.record.notes).toBe(record.notes);
  });

  test('an amendment of an accepted inspection of the same ride is accepted and linked', async () => {
    const original = makeRecord(comet);
    await push([original]);
    // An amendment may carry the original's readings over, ids and all.
    const amendment = makeRecord(comet, {
      amendsId: original.id,
      readings: original.readings,
      notes: 'Seat 3 lap bar re-tested after adjustment: locks normally.',
    });
    const res = await push([amendment]);
    expect(res.body.results[0]).toEqual({ id: amendment.id, status: 'accepted' });
    const row = server.db.select().from(inspections).where(eq(inspections.id, amendment.id)).get();
    expect(row?.amendsId).toBe(original.id);
    const detail = await api.supervisor.get(`/api/inspections/${original.id}`);
    expect(detail.body.inspection.amendedBy.map((a: { id: string }) => a.id)).toEqual([amendment.id]);
  });

  test('an amendment of an unknown inspection, or of another ride’s, is refused naming amendsId', async () => {
    const original = makeRecord(comet);
    await push([original]);
    const unknown = makeRecord(comet, { amendsId: randomUUID() });
    const otherRide = makeRecord(skylark, { amendsId: original.id });
    const res = await push([unknown, otherRide]);
    for (const r of res.body.results) {
      expect(r.status).toBe('rejected');
      expect(r.issues.map((i: { path: string }) => i.path)).toEqual(['amendsId']);
    }
  });

  test('an inspector may not amend another inspector’s inspection; a supervisor may', async () => {
    const bySupervisor = makeRecord(comet);
    await push([bySupervisor], randomUUID(), api.supervisor);
    const res = await push([makeRecord(comet, { amendsId: bySupervisor.id })]);
    expect(res.body.results[0].status).toBe('rejected');
    expect(res.body.results[0].issues[0].path).toBe('amendsId');

    const byInspector = makeRecord(comet);
    await push([byInspector]);
    const ok = await push([makeRecord(comet, { amendsId: byInspector.id })], randomUUID(), api.supervisor);
    expect(ok.body.results[0].status).toBe('accepted');
  });

  test('an unknown ride, or a design version of another ride, is refused naming the field', async () => {
    const res = await push([
      makeRecord(comet, { rideId: 'ride-that-does-not-exist' }),
      makeRecord(comet, { designVersionId: skylark.designVersionId }),
      makeRecord(comet, { designVersionId: 'no-such-version' }),
    ]);
    const paths = res.body.results.map((r: { issues: { path: string }[] }) => r.issues.map((i) => i.path));
    expect(paths).toEqual([['rideId'], ['designVersionId'], ['designVersionId']]);
  });

  test('no design version from the phone means the ride’s current one', async () => {
    const record = makeRecord({ id: comet.id, designVersionId: null, design: comet.design });
    await push([record]);
    const row = server.db.select().from(inspections).where(eq(inspections.id, record.id)).get();
    expect(row?.designVersionId).toBe(comet.designVersionId);
    expect(row?.record.designVersionId).toBeNull();
  });

  test('records that are not objects, or have no usable id, are rejected in place', async () => {
    const good = makeRecord(comet);
    const res = await push([42, { id: 'not-a-uuid' }, good]);
    expect(res.body.results[0]).toMatchObject({ id: null, status: 'rejected' });
    expect(res.body.results[1]).toMatchObject({ id: 'not-a-uuid', status: 'rejected' });
    expect(res.body.results[1].issues.map((i: { path: string }) => i.path)).toContain('id');
    expect(res.body.results[2]).toEqual({ id: good.id, status: 'accepted' });
  });

  test('a reading id used twice in one record is refused naming the second', async () => {
    const reading = speedReading(12);
    const res = await push([makeRecord(comet, { readings: [reading, { ...reading, valueSI: 1.3 }] })]);
    expect(res.body.results[0].status).toBe('rejected');
    expect(res.body.results[0].issues).toEqual([
      { path: 'readings.1.id', message: 'Appears twice in this record' },
    ]);
  });

  test('a body that is not a batch is a 400 naming the field, and nothing is written', async () => {
    const before = counts();
    const bad = await api.inspector.push([], 'x');
    const err = expectApiError(bad, 400, 'validation_failed');
    expect(err.issues?.map((i) => i.path).sort()).toEqual(['batchId', 'records']);
    expect(counts()).toEqual(before);
  });

  test('operators push daily checks only (tests/server/daily-checks.test.ts); without a token 401', async () => {
    const before = counts();
    const res = await push([makeRecord(comet)], randomUUID(), api.operator);
    expect(res.body.results[0]).toMatchObject({ status: 'rejected', issues: [{ path: 'type' }] });
    // Only the batch's answer is kept (so a re-send gets it back); no record of it.
    expect(counts()).toEqual({ ...before, batches: (before.batches ?? 0) + 1 });
    expectApiError(await push([makeRecord(comet)], randomUUID(), api.anonymous), 401, 'unauthorized');
  });
});
