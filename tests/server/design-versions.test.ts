import { count, eq } from 'drizzle-orm';

import { auditLog, designVersions } from '@/db/server/schema';
import { analyseCycle } from '@/features/loads/engine';
import { designToCycleInput, type DesignData } from '@/features/loads/design-schema';
import {
  designResponseSchema,
  designVersionListResponseSchema,
  rideDetailResponseSchema,
  rideListPageSchema,
} from '@/features/registry/schema';
import { littleKiteDesign, skylarkDesign } from '@/server/seed/demo-design';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';

let server: TestServer;
let api: Clients;
let skylarkId: string;
let kiteId: string;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  const list = rideListPageSchema.parse((await api.admin.get('/api/rides')).body).rides;
  skylarkId = list.find((r) => r.name === 'Skylark')?.id ?? '';
  kiteId = list.find((r) => r.name === 'Little Kite')?.id ?? '';
});
afterAll(() => server.close());

const versionCount = () => server.db.select({ n: count() }).from(designVersions).get()?.n;

/** Skylark with a replaced main pivot shaft: a plausible change an engineer would record. */
const biggerShaft: DesignData = {
  ...skylarkDesign,
  source: { ...skylarkDesign.source, revision: 'D' },
  pivots: skylarkDesign.pivots.map((p) =>
    p.joint === 0 ? { ...p, nominalDiameterM: 0.17, minimumDiameterM: 0.1688 } : p,
  ),
};

describe('PUT /api/rides/:id/design makes a new version', () => {
  test('version 2 by the supervisor; version 1 stays as it was and still analyses the same', async () => {
    const res = await api.supervisor.put(`/api/rides/${skylarkId}/design`, {
      reason: 'Main pivot shaft replaced by a 170 mm shaft (maker’s revision D).',
      data: biggerShaft,
      basedOnVersion: 1,
    });
    expect(res.status).toBe(201);
    const design = designResponseSchema.parse(res.body).design;
    expect(design).toMatchObject({
      version: 2,
      origin: 'editor',
      createdByName: 'Mira Delacourt',
      data: biggerShaft,
    });

    const detail = rideDetailResponseSchema.parse((await api.inspector.get(`/api/rides/${skylarkId}`)).body);
    expect(detail.design?.version).toBe(2);
    const current = designResponseSchema.parse(
      (await api.inspector.get(`/api/rides/${skylarkId}/design`)).body,
    );
    expect(current.design).toEqual(design);

    const list = designVersionListResponseSchema.parse(
      (await api.inspector.get(`/api/rides/${skylarkId}/design/versions`)).body,
    );
    expect(list.versions.map((v) => [v.version, v.createdByName])).toEqual([
      [2, 'Mira Delacourt'],
      [1, 'Rowan Ashby'],
    ]);
    expect(list.versions[0]).not.toHaveProperty('data');

    const v1 = designResponseSchema.parse(
      (await api.inspector.get(`/api/rides/${skylarkId}/design/versions/1`)).body,
    );
    expect(v1.design.data).toEqual(skylarkDesign);
    // An old result can be reproduced exactly from the version it used.
    const fromStored = analyseCycle(designToCycleInput(v1.design.data));
    const fromSource = analyseCycle(designToCycleInput(skylarkDesign));
    expect(fromStored.joints.map((j) => j.peakForce.value)).toEqual(
      fromSource.joints.map((j) => j.peakForce.value),
    );
  });

  test('the audit log has the change with the version before and after', () => {
    const entry = server.db
      .select()
      .from(auditLog)
      .where(eq(auditLog.entity, 'design'))
      .all()
      .find((e) => e.rideId === skylarkId);
    expect(entry).toMatchObject({ action: 'create' });
    expect(entry?.summary).toMatch(/^Skylark: design data version 2 — Main pivot shaft replaced/);
    expect(entry?.before).toEqual({ version: 1, data: skylarkDesign });
    expect(entry?.after).toMatchObject({ version: 2, origin: 'editor', data: biggerShaft });
  });

  test('a change made from an older version → 409 version_conflict, nothing saved', async () => {
    const before = versionCount();
    const error = expectApiError(
      await api.admin.put(`/api/rides/${skylarkId}/design`, {
        reason: 'Edited from the old version',
        data: { ...biggerShaft, nearMargin: 0.85 },
        basedOnVersion: 1,
      }),
      409,
      'version_conflict',
    );
    expect(error.message).toMatch(/version 2 is now current/);
    expect(versionCount()).toBe(before);
  });

  test('the same data again → 409 design_unchanged, whatever the key order', async () => {
    const reordered = Object.fromEntries(Object.entries(biggerShaft).reverse());
    expectApiError(
      await api.admin.put(`/api/rides/${skylarkId}/design`, { reason: 'No change', data: reordered }),
      409,
      'design_unchanged',
    );
  });

  test('invalid data or no reason → 400 naming the fields (data.…), nothing saved', async () => {
    const before = versionCount();
    const broken = {
      ...littleKiteDesign,
      pivots: [{ ...littleKiteDesign.pivots[0], minimumDiameterM: 0.1 }],
      parts: [{ ...littleKiteDesign.parts[0], massKg: -5 }, ...littleKiteDesign.parts.slice(1)],
    };
    const error = expectApiError(
      await api.admin.put(`/api/rides/${kiteId}/design`, { reason: '', data: broken }),
      400,
      'validation_failed',
    );
    expect(error.issues?.map((i) => i.path).sort()).toEqual([
      'data.parts.0.massKg',
      'data.pivots.0.minimumDiameterM',
      'reason',
    ]);
    expect(versionCount()).toBe(before);
  });

  test('unknown rides and versions → 404', async () => {
    expectApiError(await api.admin.get('/api/rides/nope/design'), 404, 'not_found');
    expectApiError(await api.admin.get(`/api/rides/${skylarkId}/design/versions/99`), 404, 'not_found');
    expectApiError(
      await api.admin.put('/api/rides/nope/design', { reason: 'x', data: littleKiteDesign }),
      404,
      'not_found',
    );
    const badVersion = expectApiError(
      await api.admin.get(`/api/rides/${skylarkId}/design/versions/first`),
      400,
      'validation_failed',
    );
    expect(badVersion.issues?.[0].path).toBe('params.version');
  });

  test('a ride without design data: GET gives null; the first version is 1 (basedOnVersion 0)', async () => {
    const created = await api.admin.post('/api/rides', {
      name: 'Test Kite',
      rideClass: 'pendulum_swing',
      operatorCompanyId: (await api.admin.get('/api/companies?q=Corvane')).body.companies[0].id,
    });
    const id = created.body.ride.id;
    expect((await api.inspector.get(`/api/rides/${id}/design`)).body).toEqual({ design: null });
    const res = await api.admin.put(`/api/rides/${id}/design`, {
      reason: 'First entry',
      data: littleKiteDesign,
      basedOnVersion: 0,
    });
    expect(designResponseSchema.parse(res.body).design.version).toBe(1);
  });
});
