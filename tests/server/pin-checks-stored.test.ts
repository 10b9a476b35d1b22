/**
 * The stored analysis of an inspection keeps each pivot's EN 1993-1-8 §3.13.2 Table 3.10 pin checks at the
 * peak force over every load case (operating cycle and stops), and the envelope holds them as items. The
 * utilisations are checked against the Table's formulas written out here at the stored peak; the engine's
 * hand-worked example is in tests/engine/pin-checks.test.ts.
 */

import type { DesignData } from '@/features/loads/design-schema';
import { analysePending } from '@/server/sync/analysis';

import { makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { rodDesign } from '@/tests/support/rod-design';
import { demoRide, makeRecord, speedReading } from './sync-fixtures';

jest.setTimeout(60_000);

let server: TestServer;
let api: Clients;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
});
afterAll(() => server.close());

const MPa = 1e6;

test('pin checks at the peak over the load cases are stored, and their items are in the envelope', async () => {
  const rod: DesignData = rodDesign(300, 6, 'Rod with a clevis pin');
  rod.pivots[0] = {
    ...rod.pivots[0],
    pinCheck: {
      pinGrade: 'pin steel',
      pinFyPa: 460 * MPa,
      pinFuPa: 600 * MPa,
      plateGrade: 'S355',
      plateFyPa: 355 * MPa,
      innerPlateM: 0.04,
      outerPlateM: 0.025,
      gapM: 0.005,
      replaceable: true,
    },
  };
  rod.motion[0] = { ...rod.motion[0], serviceDecelRadS2: 0.3, emergencyDecelRadS2: 1.5 };
  const comet = demoRide(server.db, 'Twin Comet');
  const operatorCompanyId: string = (await api.admin.get(`/api/rides/${comet.id}`)).body.ride
    .operatorCompanyId;
  const created = await api.admin.post('/api/rides', {
    name: 'Clevis rod',
    rideClass: 'other',
    operatorCompanyId,
  });
  expect(created.status).toBe(201);
  const rideId: string = created.body.ride.id;
  const design = await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'Pin check test', data: rod });
  expect(design.status).toBe(201);

  const record = makeRecord(
    { id: rideId, designVersionId: design.body.design.id, design: rod },
    { readings: [speedReading(6)] },
  );
  const res = await api.inspector.push([record]);
  expect(res.body.results[0].status).toBe('accepted');
  await analysePending(server.db);
  const analysis = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection.analysis;

  const peaks: number[] = analysis.loadCases.map(
    (c: { joints: { peakForceN: number }[] }) => c.joints[0].peakForceN,
  );
  const F = Math.max(...peaks);
  // The emergency stop raises the force above the operating cycle's.
  expect(F).toBeGreaterThan(analysis.loadCases[0].joints[0].peakForceN);

  expect(analysis.pinChecks).toHaveLength(1);
  const [c] = analysis.pinChecks;
  expect(c).toMatchObject({ joint: 0, name: 'Main pivot', diameterM: 0.06 });
  expect(c.forceN).toBeCloseTo(F, 6);
  // Table 3.10 at d = 60 mm, γM0 = 1.0, γM2 = 1.25, γM6,ser = 1.0, γF = 1.0 (double shear, clevis).
  const A = (Math.PI * 0.06 ** 2) / 4;
  const W = (Math.PI * 0.06 ** 3) / 32;
  const shear = F / 2 / ((0.6 * A * 600 * MPa) / 1.25);
  const bending = (F * (0.04 + 4 * 0.005 + 2 * 0.025)) / 8 / (1.5 * W * 460 * MPa);
  expect(c.shear).toBeCloseTo(shear, 12);
  // The lug (F on 40 mm) uses more than a cheek (F/2 on 25 mm); f_y the plate's 355 MPa.
  expect(c.bearing).toBeCloseTo(F / (1.5 * 0.04 * 0.06 * 355 * MPa), 12);
  expect(c.bending).toBeCloseTo(bending, 12);
  expect(c.combined).toBeCloseTo(bending ** 2 + shear ** 2, 12);
  expect(c.bearingService).toBeCloseTo(F / (0.6 * 0.04 * 0.06 * 355 * MPa), 12);
  expect(c.bendingService).toBeCloseTo((F * 0.11) / 8 / (0.8 * W * 460 * MPa), 12);

  const items = analysis.envelope.filter((e: { id: string }) => e.id.startsWith('joints.0.pin.en1993.'));
  expect(items.map((e: { id: string }) => e.id.split('.').pop())).toEqual([
    'shear',
    'bearing',
    'bending',
    'combined',
    'bearing_ser',
    'bending_ser',
  ]);
  const bendingItem = items.find((e: { id: string }) => e.id.endsWith('.bending'));
  expect(bendingItem.ratio).toBeCloseTo(c.bending, 9);
  expect(bendingItem.loadCase).toBe('emergency_stop');
  expect(bendingItem.label).toContain('EN 1993-1-8 Table 3.10');
});
