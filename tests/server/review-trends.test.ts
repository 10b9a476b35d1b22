/**
 * GET /api/rides/:id/trends: a ride's inspections oldest first, with the peak pivot forces of the
 * server's analyses and the latest pin diameter and clearance measured per pivot, under the pivot names
 * and limits of the ride's current design data. The peaks are compared with the shared analysis code the
 * phone runs (features/inspections/analysis), whose physics the engine tests check against closed forms.
 */
import { randomUUID } from 'node:crypto';

import { analyseInspection } from '@/features/records/analysis';
import type { Reading } from '@/features/records/schema';
import { trendsResponseSchema } from '@/features/review/schema';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { pushAccepted, secondInspector } from './review-desk-fixtures';
import { demoRide, makeRecord } from './sync-fixtures';

// Seeding hashes five passwords; on a busy machine that alone can take seconds.
jest.setTimeout(30_000);

let server: TestServer;
let api: Clients;
let skylark: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  skylark = demoRide(server.db, 'Skylark');
});
afterAll(() => server.close());

const deg = (d: number) => (d * Math.PI) / 180;

function reading(kind: Reading['kind'], joint: number, valueSI: number, takenAt: string): Reading {
  return {
    id: randomUUID(),
    kind,
    joint,
    label: kind,
    valueSI,
    unit: kind === 'amplitude' ? '°' : 'mm',
    method: kind === 'amplitude' ? 'typed' : kind === 'clearance' ? 'dial_indicator' : 'micrometer',
    takenAt,
  };
}

/** One Skylark inspection on `day` with a swing amplitude and main-pivot wear readings. */
function inspectionOn(
  day: string,
  amplitudeDeg: number,
  diameterM: number,
  clearanceM: number,
  extra: Reading[] = [],
) {
  const at = (hh: string) => `${day}T${hh}:00:00.000Z`;
  const readings = [
    reading('amplitude', 0, deg(amplitudeDeg), at('08')),
    reading('pin_diameter', 0, diameterM, at('09')),
    reading('clearance', 0, clearanceM, at('09')),
    ...extra,
  ];
  return makeRecord(skylark, {
    type: 'periodic',
    startedAt: at('07'),
    submittedAt: at('10'),
    readings,
  });
}

test('points come oldest first with their peaks and the latest wear readings per pivot', async () => {
  const march = inspectionOn('2026-03-02', 100, 0.1599, 0.00024);
  const april = inspectionOn('2026-04-01', 105, 0.15975, 0.00031, [
    // A second clearance reading later the same day replaces the first; the gondola spindle is read once.
    reading('clearance', 0, 0.00033, '2026-04-01T09:30:00.000Z'),
    reading('clearance', 1, 0.00012, '2026-04-01T09:40:00.000Z'),
  ]);
  const may = inspectionOn('2026-05-01', 110, 0.15962, 0.00038);
  // Pushed newest first, to show the order comes from the submission times.
  await pushAccepted(server.db, api.inspector, [may, march, april]);

  const res = await api.supervisor.get(`/api/rides/${skylark.id}/trends`);
  expect(res.status).toBe(200);
  const trends = trendsResponseSchema.parse(res.body);
  expect(trends.rideId).toBe(skylark.id);
  // The pivot names and limits of Skylark's design data (server/seed/demo-design.ts).
  expect(trends.joints).toEqual([
    { joint: 0, name: 'Main pivot shaft', maxForceN: 620e3, minPinDiameterM: 0.1588, maxClearanceM: 0.0006 },
    {
      joint: 1,
      name: 'Gondola slewing bearing spindle',
      maxForceN: 420e3,
      minPinDiameterM: 0.139,
      maxClearanceM: 0.0004,
    },
  ]);
  const points = trends.points.filter((p) => [march.id, april.id, may.id].includes(p.inspectionId));
  expect(points.map((p) => p.inspectionId)).toEqual([march.id, april.id, may.id]);
  expect(points.map((p) => p.submittedAt)).toEqual([march, april, may].map((r) => r.submittedAt));
  expect(points.every((p) => p.type === 'periodic' && p.reviewState === 'submitted')).toBe(true);

  for (const [point, record] of [
    [points[0], march],
    [points[1], april],
    [points[2], may],
  ] as const) {
    const direct = analyseInspection(skylark.design, record.readings);
    expect(point.peakForceN).toEqual(direct.joints.map((j) => j.peakForce.value));
    expect(point.analysisStatus).toBe(direct.status);
  }
  // A wider swing loads the main pivot more: the drift the chart is for.
  expect(points[0].peakForceN[0]).toBeLessThan(points[2].peakForceN[0] as number);

  expect(points.map((p) => p.pins)).toEqual([
    [{ joint: 0, diameterM: 0.1599, clearanceM: 0.00024 }],
    [
      { joint: 0, diameterM: 0.15975, clearanceM: 0.00033 },
      { joint: 1, diameterM: null, clearanceM: 0.00012 },
    ],
    [{ joint: 0, diameterM: 0.15962, clearanceM: 0.00038 }],
  ]);
});

test('an amended inspection is shown through its amendment only', async () => {
  const original = inspectionOn('2026-05-10', 100, 0.1595, 0.0004);
  await pushAccepted(server.db, api.inspector, [original]);
  const amendment = {
    ...inspectionOn('2026-05-10', 100, 0.1595, 0.00041),
    amendsId: original.id,
    submittedAt: '2026-05-10T12:00:00.000Z',
  };
  await pushAccepted(server.db, api.inspector, [amendment]);
  const ids = trendsResponseSchema
    .parse((await api.supervisor.get(`/api/rides/${skylark.id}/trends`)).body)
    .points.map((p) => p.inspectionId);
  expect(ids).toContain(amendment.id);
  expect(ids).not.toContain(original.id);
});

test('a ride with no inspections has its joints and no points; staff read, operators 403, unknown 404', async () => {
  const wheel = demoRide(server.db, 'Lantern Wheel');
  const empty = trendsResponseSchema.parse((await api.inspector.get(`/api/rides/${wheel.id}/trends`)).body);
  expect(empty.points).toEqual([]);
  expect(empty.joints.map((j) => j.name)).toEqual(['Wheel axle', 'Gondola hanger pin']);
  expect((await api.admin.get(`/api/rides/${wheel.id}/trends`)).status).toBe(200);
  expectApiError(await api.operator.get(`/api/rides/${skylark.id}/trends`), 403, 'forbidden');
  expectApiError(await api.anonymous.get(`/api/rides/${skylark.id}/trends`), 401, 'unauthorized');
  expectApiError(await api.supervisor.get('/api/rides/missing/trends'), 404, 'not_found');
});

test('an inspector sees only their own inspections in a ride’s trends, as with the inspections themselves', async () => {
  const other = await secondInspector(server.app, server.db, 'trends.other@pivotwatch.test');
  const theirs = inspectionOn('2026-05-12', 104, 0.1597, 0.0003);
  const res = await other.push([theirs]);
  expect(res.body.results[0].status).toBe('accepted');
  const idsFor = async (client: Pick<Clients['inspector'], 'get'>) =>
    trendsResponseSchema
      .parse((await client.get(`/api/rides/${skylark.id}/trends`)).body)
      .points.map((p) => p.inspectionId);
  expect(await idsFor(api.inspector)).not.toContain(theirs.id);
  expect(await idsFor(other)).toEqual([theirs.id]);
  expect(await idsFor(api.supervisor)).toContain(theirs.id);
});
