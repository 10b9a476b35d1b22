/**
 * GET /api/inspections/:id/cycle: the ride cycle behind an inspection's load check, recomputed by the
 * server from the design-data version and readings the analysis used.
 *
 * The physics check is a uniform slender rod of mass m and length L pinned at one end and driven at a
 * constant ω in a vertical plane. Newton's second law for its mass centre, F_pin = m·a_G − m·g with
 * a_G = −ω²·(L/2) toward the pin, gives at the rod's angle θ (from the horizontal):
 *   along the rod   F = −m·ω²·L/2 + m·g·sin θ   (so m·ω²·L/2 ± m·g at the bottom and the top)
 *   across the rod  F = m·g·cos θ
 * (fixed-axis rotation of a rigid body: Meriam & Kraige, Engineering Mechanics: Dynamics, and Hibbeler,
 * Engineering Mechanics: Dynamics, rigid-body kinetics chapters; from memory).
 */
import { randomUUID } from 'node:crypto';

import { eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { inspectionCycleInput } from '@/features/records/analysis';
import { ENGINE_ASSUMPTIONS, ENGINE_VERSION } from '@/features/loads/engine';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { pushAccepted, secondInspector } from './review-desk-fixtures';
import { rodDesign } from '@/tests/support/rod-design';
import { demoRide, makeRecord, rpmToRadS, speedReading } from './sync-fixtures';

// Seeding hashes five passwords; on a busy machine that alone can take seconds.
jest.setTimeout(30_000);

let server: TestServer;
let api: Clients;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
});
afterAll(() => server.close());

const m = 300;
const L = 6;
const rpm = 12;

async function rodRide(name: string) {
  const operatorCompanyId: string = (await api.admin.get(`/api/rides/${demoRide(server.db, 'Skylark').id}`))
    .body.ride.operatorCompanyId;
  const created = await api.admin.post('/api/rides', { name, rideClass: 'other', operatorCompanyId });
  expect(created.status).toBe(201);
  return created.body.ride.id as string;
}

type JointJson = {
  name: string;
  angleRad: number[];
  forceAlongN: number[];
  forceAcrossN: number[];
  peakForce: { value: number };
  peakTorque: { value: number };
  extremes: { magnitudeN: { min: number; max: number } };
};

test('the recomputed cycle of a rod inspection follows the closed form, sample by sample', async () => {
  const rod = rodDesign(m, L, 'Test rod for the review desk');
  const rideId = await rodRide('Review rod');
  const design = await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'Test rod', data: rod });
  expect(design.status).toBe(201);
  const record = makeRecord(
    { id: rideId, designVersionId: design.body.design.id, design: rod },
    { readings: [speedReading(rpm)] },
  );
  await pushAccepted(server.db, api.inspector, [record]);

  const res = await api.supervisor.get(`/api/inspections/${record.id}/cycle`);
  expect(res.status).toBe(200);
  expect(res.body.engineVersion).toBe(ENGINE_VERSION);
  expect(res.body.assumptions).toEqual([...ENGINE_ASSUMPTIONS]);
  const g: number = res.body.gravityMS2;
  expect(g).toBeCloseTo(9.80665, 10); // standard gravity (CGPM 1901)
  const joint: JointJson = res.body.joints[0];
  const w = rpmToRadS(rpm);
  expect(joint.angleRad).toHaveLength(res.body.samples);
  let worst = 0;
  joint.angleRad.forEach((theta, k) => {
    const along = -m * w * w * (L / 2) + m * g * Math.sin(theta);
    const across = m * g * Math.cos(theta);
    worst = Math.max(worst, Math.abs(joint.forceAlongN[k] - along), Math.abs(joint.forceAcrossN[k] - across));
  });
  expect(worst).toBeLessThan(1e-6 * m * g);
  // Largest magnitude m·g + m·ω²·L/2 at the bottom, smallest |m·ω²·L/2 − m·g| at the top; sampled at 360
  // points per turn, the peaks may fall a hair short of the exact extremes.
  const centripetal = m * w * w * (L / 2);
  expect(joint.peakForce.value).toBeLessThanOrEqual((m * g + centripetal) * (1 + 1e-9));
  expect(joint.peakForce.value).toBeGreaterThan((m * g + centripetal) * (1 - 1e-4));
  expect(joint.extremes.magnitudeN.min).toBeGreaterThanOrEqual(Math.abs(centripetal - m * g) * (1 - 1e-9));
  expect(joint.extremes.magnitudeN.min).toBeLessThan(Math.abs(centripetal - m * g) * (1 + 1e-4));

  // It is exactly the stored analysis's cycle: same peaks, same status.
  const stored = server.db.select().from(inspections).where(eq(inspections.id, record.id)).get()?.analysis;
  expect(stored?.joints[0].peakForceN).toBe(joint.peakForce.value);
  expect(stored?.joints[0].peakTorqueNm).toBe(joint.peakTorque.value);
  expect(stored?.status).toBe(res.body.status);
  expect(stored?.samples).toBe(res.body.samples);

  // And exactly what the calculator's endpoint answers for the same inputs (the same shape, the same
  // numbers), so the calculator's result view draws it unchanged.
  const calculator = await api.supervisor.post(
    '/api/loads/cycle',
    JSON.parse(JSON.stringify(inspectionCycleInput(rod, record.readings, stored?.samples))),
  );
  expect(calculator.status).toBe(200);
  expect(res.body).toEqual(calculator.body);

  // 360 samples of one rod fit the bounded answer whole; asking for every sample gives the same answer.
  expect(res.body.resolution).toBe('full');
  expect((await api.supervisor.get(`/api/inspections/${record.id}/cycle?resolution=full`)).body).toEqual(
    res.body,
  );
  const bad = await api.supervisor.get(`/api/inspections/${record.id}/cycle?resolution=every`);
  expect(expectApiError(bad, 400, 'validation_failed').issues?.map((i) => i.path)).toEqual([
    'query.resolution',
  ]);
});

test('the design version the analysis used is kept when the ride’s design data changes later', async () => {
  const rod = rodDesign(m, L, 'Rod, revision A');
  const rideId = await rodRide('Review rod, revised');
  const v1 = (await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'Revision A', data: rod })).body
    .design;
  const record = makeRecord(
    { id: rideId, designVersionId: v1.id, design: rod },
    { readings: [speedReading(rpm)] },
  );
  await pushAccepted(server.db, api.inspector, [record]);
  const before = (await api.supervisor.get(`/api/inspections/${record.id}/cycle`)).body;
  const heavier = rodDesign(2 * m, L, 'Rod, revision B');
  expect(
    (await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'Revision B', data: heavier })).status,
  ).toBe(201);
  const after = (await api.supervisor.get(`/api/inspections/${record.id}/cycle`)).body;
  expect(after.joints[0].peakForce.value).toBe(before.joints[0].peakForce.value);
});

test('without design data there is no cycle: a 404 that says why', async () => {
  const rideId = await rodRide('Rod awaiting data');
  const record = makeRecord({ id: rideId, designVersionId: null });
  await pushAccepted(server.db, api.inspector, [record]);
  const err = expectApiError(
    await api.supervisor.get(`/api/inspections/${record.id}/cycle`),
    404,
    'not_found',
  );
  expect(err.message).toMatch(/^This inspection has no design data/);
});

test('inspectors read only their own; operators 403; unknown 404', async () => {
  const record = makeRecord(demoRide(server.db, 'Twin Comet'), { readings: [speedReading(11)] });
  await pushAccepted(server.db, api.inspector, [record]);
  expect((await api.inspector.get(`/api/inspections/${record.id}/cycle`)).status).toBe(200);
  expect((await api.admin.get(`/api/inspections/${record.id}/cycle`)).status).toBe(200);
  const other = await secondInspector(server.app, server.db);
  expectApiError(await other.get(`/api/inspections/${record.id}/cycle`), 404, 'not_found');
  expectApiError(await api.operator.get(`/api/inspections/${record.id}/cycle`), 403, 'forbidden');
  expectApiError(await api.supervisor.get(`/api/inspections/${randomUUID()}/cycle`), 404, 'not_found');
});

describe('kept answers: computed once per inspection and inputs, a new answer when they change', () => {
  const peakOf = (rpmNow: number) => {
    const w = rpmToRadS(rpmNow);
    return m * 9.80665 + m * w * w * (L / 2);
  };

  test('the same answer and ETag again, a 304 for it, a new one for a changed record and for an amendment', async () => {
    const rod = rodDesign(m, L, 'Rod, kept answers');
    const rideId = await rodRide('Review rod, kept');
    const design = await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'Kept', data: rod });
    const ride = { id: rideId, designVersionId: design.body.design.id, design: rod };
    const original = makeRecord(ride, { readings: [speedReading(rpm)] });
    await pushAccepted(server.db, api.inspector, [original]);
    const url = `/api/inspections/${original.id}/cycle`;

    const first = await api.supervisor.get(url);
    expect(first.status).toBe(200);
    const etag = first.headers.etag as string;
    expect(etag).toMatch(/^W\/"/);
    // Largest pin force m·g + m·ω²·L/2 (closed form above), sampled at 360 points per turn.
    expect(first.body.joints[0].peakForce.value).toBeGreaterThan(peakOf(rpm) * (1 - 1e-4));
    const again = await api.supervisor.get(url);
    expect(again.headers.etag).toBe(etag);
    expect(again.body).toEqual(first.body);
    // Conditional GET with the validator held (RFC 9110 §13.1.2): nothing resent.
    const revalidated = await api.supervisor.get(url).set('If-None-Match', etag);
    expect(revalidated.status).toBe(304);

    // The answer rests on the record's stored hash: a record rewritten in place with its hash (not a
    // path the product has: a stored record never changes) shows the answer is kept, not recomputed, and
    // a new hash gives a new answer from the new readings.
    const faster = { ...original, readings: [speedReading(2 * rpm)] };
    server.db.update(inspections).set({ record: faster }).where(eq(inspections.id, original.id)).run();
    expect((await api.supervisor.get(url)).headers.etag).toBe(etag);
    server.db
      .update(inspections)
      .set({ contentSha256: 'f'.repeat(64) })
      .where(eq(inspections.id, original.id))
      .run();
    const rewritten = await api.supervisor.get(url);
    expect(rewritten.headers.etag).not.toBe(etag);
    expect(rewritten.body.joints[0].peakForce.value).toBeGreaterThan(peakOf(2 * rpm) * (1 - 1e-4));
    expect(rewritten.body.joints[0].peakForce.value).toBeLessThanOrEqual(peakOf(2 * rpm) * (1 + 1e-9));
    server.db
      .update(inspections)
      .set({ record: original, contentSha256: 'e'.repeat(64) })
      .where(eq(inspections.id, original.id))
      .run();
    expect((await api.supervisor.get(url)).body).toEqual(first.body);

    // An amendment with other readings is its own inspection with its own answer; the original keeps its.
    const amendment = makeRecord(ride, { readings: [speedReading(1.5 * rpm)], amendsId: original.id });
    await pushAccepted(server.db, api.inspector, [amendment]);
    const amended = await api.supervisor.get(`/api/inspections/${amendment.id}/cycle`);
    expect(amended.status).toBe(200);
    expect(amended.headers.etag).not.toBe(etag);
    expect(amended.body.joints[0].peakForce.value).toBeGreaterThan(peakOf(1.5 * rpm) * (1 - 1e-4));
    expect(amended.body.joints[0].peakForce.value).toBeLessThanOrEqual(peakOf(1.5 * rpm) * (1 + 1e-9));
    expect((await api.supervisor.get(url)).body).toEqual(first.body);

    // Asked for several times at once (one computation), at the other resolution (kept apart): the same
    // numbers, since 360 samples of one rod fit the bounded answer whole.
    const together = await Promise.all([1, 2, 3].map(() => api.admin.get(`${url}?resolution=full`)));
    together.forEach((r) => expect(r.body).toEqual(first.body));
  });
});
