import { randomUUID } from 'node:crypto';

import { eq } from 'drizzle-orm';
import request from 'supertest';

import { inspections } from '@/db/server/inspections';
import { rides } from '@/db/server/schema';
import { checklistTemplateSchema } from '@/features/registry/schema';
import { pullResponseSchema, type PullResponse } from '@/features/sync/pull-schema';
import { createUser, findSessionUser } from '@/server/auth/service';
import { demoRides } from '@/server/seed/demo';
import { buildPull } from '@/server/sync/pull';

import {
  expectApiError,
  makeTestServer,
  pushSigned,
  registerPhoneKey,
  signInAs,
  userIdOf,
  type TestServer,
} from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import {
  demoRide,
  imageBytes,
  makeRecord,
  otherReading,
  photoRefFor,
  sha256Hex,
  speedReading,
} from './sync-fixtures';

let server: TestServer;
let api: Clients;
let comet: ReturnType<typeof demoRide>;
let inspectorId: string;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  comet = demoRide(server.db, 'Twin Comet');
  inspectorId = userIdOf(server.db, 'inspector@pivotwatch.test');
});
afterAll(() => server.close());

const inspectorUser = () => {
  const user = findSessionUser(server.db, inspectorId);
  if (!user) throw new Error('no demo inspector');
  return user;
};
const tick = () => new Promise((resolve) => setTimeout(resolve, 5));

describe('GET /api/sync/pull', () => {
  test('the first pull has everything the inspector needs, in the shape the phone checks', async () => {
    const res = await api.inspector.get('/api/sync/pull');
    expect(res.status).toBe(200);
    const pull = pullResponseSchema.parse(res.body);
    expect(pull.cursor).toMatch(/^v1:/);
    expect(pull.rides?.map((r) => r.name).sort()).toEqual(demoRides.map((r) => r.name).sort());
    // Every demo ride has design data: each comes with its current version.
    expect(pull.designs?.map((d) => d.rideId).sort()).toEqual(pull.rides?.map((r) => r.id).sort());
    expect(pull.designs?.find((d) => d.rideId === comet.id)?.id).toBe(comet.designVersionId);
    // The phone reads templates with the register's full template schema.
    const templates = (pull.templates ?? []).map((t) => checklistTemplateSchema.parse(t));
    const classes = new Set(pull.rides?.map((r) => r.rideClass));
    expect(new Set(templates.map((t) => t.rideClass))).toEqual(classes);
    // The demo assigns some schedules to the demo inspector.
    expect(pull.assignments?.length).toBeGreaterThan(0);
    expect(pull.assignments?.every((a) => pull.rides?.some((r) => r.id === a.rideId))).toBe(true);
    expect(pull.decisions).toEqual([]);
    expect(pull.hasMore).toBe(false);
  });

  test('a pull with the cursor brings what changed: a ride, a new design version, an archived template', async () => {
    const first = pullResponseSchema.parse((await api.inspector.get('/api/sync/pull')).body);
    await tick();
    const kite = first.rides?.find((r) => r.name === 'Little Kite');
    if (!kite) throw new Error('no Little Kite');
    const patched = await api.supervisor.patch(`/api/rides/${kite.id}`, {
      status: 'restricted',
      statusReason: 'Swing brake pads at wear limit; riders over 1.2 m only until replaced.',
    });
    expect(patched.status).toBe(200);
    const kiteDesign = first.designs?.find((d) => d.rideId === kite.id);
    if (!kiteDesign) throw new Error('no design for Little Kite');
    const newDesign = await api.supervisor.put(`/api/rides/${kite.id}/design`, {
      reason: 'Maker’s revision B',
      data: { ...kiteDesign.data, source: { ...kiteDesign.data.source, revision: 'B' } },
    });
    expect(newDesign.status).toBe(201);
    const archivedId = first.templates?.[0]?.id as string;
    expect((await api.supervisor.delete(`/api/checklist-templates/${archivedId}`)).status).toBe(204);

    const res = await api.inspector.get(`/api/sync/pull?cursor=${encodeURIComponent(first.cursor)}`);
    const next = pullResponseSchema.parse(res.body);
    expect(next.cursor > first.cursor).toBe(true);
    const changedKite = next.rides?.find((r) => r.id === kite.id);
    expect(changedKite?.status).toBe('restricted');
    expect(next.designs?.find((d) => d.rideId === kite.id)).toMatchObject({
      id: newDesign.body.design.id,
      version: 2,
    });
    expect(next.removed?.templates).toContain(archivedId);
    expect(next.templates?.some((t) => t.id === archivedId)).toBe(false);
  });

  test('exactly the changes since the cursor (no look-back): nothing when nothing changed', async () => {
    const user = inspectorUser();
    const first = buildPull(server.db, user, null, { overlapMs: 0 });
    await tick();
    const quiet = buildPull(server.db, user, first.cursor, { overlapMs: 0 });
    expect(quiet).toMatchObject({ rides: [], designs: [], templates: [], decisions: [] });
    expect(quiet.removed).toBeUndefined();

    const skylark = demoRide(server.db, 'Skylark');
    await api.admin.patch(`/api/rides/${skylark.id}`, { description: 'Swinging ring on a 15 m arm' });
    const changed = buildPull(server.db, user, quiet.cursor, { overlapMs: 0 });
    expect(changed.rides?.map((r) => r.id)).toEqual([skylark.id]);
    expect(changed.designs?.map((d) => d.rideId)).toEqual([skylark.id]);
  });

  test('a supervisor’s decision on the inspector’s inspection is pulled once it is made', async () => {
    const user = inspectorUser();
    const record = makeRecord(comet);
    await api.inspector.push([record]);
    const before = buildPull(server.db, user, null, { overlapMs: 0 });
    expect(before.decisions).toEqual([]);
    await tick();
    // Review is a later issue; its decision is written here the way it will be stored.
    const supervisorId = userIdOf(server.db, 'supervisor@pivotwatch.test');
    server.db
      .update(inspections)
      .set({
        reviewState: 'returned',
        reviewedAt: new Date().toISOString(),
        reviewedBy: supervisorId,
        reviewNote: 'Photo of the axle retaining plate missing.',
      })
      .where(eq(inspections.id, record.id))
      .run();
    const after = buildPull(server.db, user, before.cursor, { overlapMs: 0 });
    expect(after.decisions).toEqual([
      expect.objectContaining({
        inspectionId: record.id,
        state: 'returned',
        note: 'Photo of the axle retaining plate missing.',
        decidedByName: 'Mira Delacourt',
      }),
    ]);
  });

  test('a cursor the server never gave is a 400 naming it; operators pull for their daily checks', async () => {
    const err = expectApiError(
      await api.inspector.get('/api/sync/pull?cursor=yesterday'),
      400,
      'validation_failed',
    );
    expect(err.issues?.[0].path).toBe('query.cursor');
    // What an operator's pull holds is checked in tests/server/daily-checks.test.ts.
    expect((await api.operator.get('/api/sync/pull')).status).toBe(200);
  });

  test('a cursor from the future (the clock was set back) is answered like a first pull', async () => {
    const ahead: PullResponse = buildPull(server.db, inspectorUser(), `v1:2999-01-01T00:00:00.000Z`);
    expect(ahead.rides?.length).toBe(server.db.select({ id: rides.id }).from(rides).all().length);
  });
});

describe('GET /api/inspections', () => {
  test('one inspection with readings, photos (and whether their bytes arrived), analysis and review state', async () => {
    const bytes = imageBytes(41);
    const record = makeRecord(comet, {
      readings: [speedReading(12), otherReading(0)],
      photos: [photoRefFor(bytes), photoRefFor(imageBytes(42))],
    });
    await api.inspector.push([record]);

    const first = (await api.inspector.get(`/api/inspections/${record.id}`)).body.inspection;
    expect(first).toMatchObject({
      id: record.id,
      rideId: comet.id,
      rideName: 'Twin Comet',
      inspectorName: 'Tomas Reyne',
      reviewState: 'submitted',
      readingCount: 2,
      photoCount: 2,
      photosMissing: 2,
    });
    expect(first.record).toEqual(record);
    expect(first.readings.map((r: { id: string }) => r.id).sort()).toEqual(
      record.readings.map((r) => r.id).sort(),
    );
    expect(first.photos.every((p: { received: boolean }) => !p.received)).toBe(true);

    await request(server.app)
      .put(`/api/photos/${sha256Hex(bytes)}`)
      .set('Authorization', `Bearer ${await signInAs(server.app, 'inspector@pivotwatch.test')}`)
      .set('Content-Type', 'image/jpeg')
      .send(Buffer.from(bytes));
    const later = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection;
    expect(later.photosMissing).toBe(1);
    const received = Object.fromEntries(
      later.photos.map((p: { sha256: string; received: boolean }) => [p.sha256, p.received]),
    );
    expect(received[sha256Hex(bytes)]).toBe(true);
    expect(received[sha256Hex(imageBytes(42))]).toBe(false);
  });

  test('another inspector’s inspection is a 404 for an inspector, readable by supervisors; operators 403', async () => {
    await createUser(server.db, {
      email: 'second.inspector@pivotwatch.test',
      name: 'Ines Harrow',
      role: 'inspector',
      password: 'second-inspector-pw',
      companyId: null,
    });
    const other = await signInAs(server.app, 'second.inspector@pivotwatch.test', 'second-inspector-pw');
    const record = makeRecord(comet);
    await pushSigned(server.app, other, await registerPhoneKey(server.app, other), [record]);

    expectApiError(await api.inspector.get(`/api/inspections/${record.id}`), 404, 'not_found');
    expect((await api.supervisor.get(`/api/inspections/${record.id}`)).status).toBe(200);
    expectApiError(await api.operator.get(`/api/inspections/${record.id}`), 403, 'forbidden');
    expectApiError(await api.supervisor.get(`/api/inspections/${randomUUID()}`), 404, 'not_found');

    const list = (await api.inspector.get('/api/inspections?pageSize=200')).body;
    expect(list.inspections.every((i: { inspectorId: string }) => i.inspectorId === inspectorId)).toBe(true);
    const all = (await api.supervisor.get('/api/inspections?pageSize=200')).body;
    expect(all.inspections.some((i: { id: string }) => i.id === record.id)).toBe(true);
  });

  test('the list filters by ride, inspector and mine, and pages', async () => {
    const skylark = demoRide(server.db, 'Skylark');
    await api.inspector.push([makeRecord(skylark), makeRecord(skylark), makeRecord(skylark)]);
    const byRide = (await api.supervisor.get(`/api/inspections?rideId=${skylark.id}&pageSize=2`)).body;
    expect(byRide.total).toBe(3);
    expect(byRide.inspections).toHaveLength(2);
    expect(byRide.inspections.every((i: { rideName: string }) => i.rideName === 'Skylark')).toBe(true);
    const page2 = (await api.supervisor.get(`/api/inspections?rideId=${skylark.id}&pageSize=2&page=2`)).body;
    expect(page2.inspections).toHaveLength(1);
    const mine = (await api.supervisor.get('/api/inspections?mine=1')).body;
    expect(
      mine.inspections.every((i: { inspectorName: string }) => i.inspectorName === 'Mira Delacourt'),
    ).toBe(true);
    const byInspector = (await api.supervisor.get(`/api/inspections?inspectorId=${inspectorId}&pageSize=200`))
      .body;
    expect(byInspector.total).toBeGreaterThanOrEqual(3);
    const err = expectApiError(
      await api.supervisor.get('/api/inspections?pageSize=500'),
      400,
      'validation_failed',
    );
    expect(err.issues?.[0].path).toBe('query.pageSize');
  });
});
