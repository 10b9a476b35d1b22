/**
 * The server's stored analysis of a free-swing ride with stops (the demo pendulum, Skylark, whose design
 * data marks its swing free and gives service and emergency stop decelerations), and an analysis stored by
 * engine 1.0.0 before models and load cases were recorded. The physics is checked in
 * tests/engine/inspection-analysis.test.ts and tests/engine/load-cases.test.ts against closed forms; here
 * the stored analysis must be exactly what the phone's shared code computes.
 */
import { randomUUID } from 'node:crypto';

import { eq } from 'drizzle-orm';

import { inspections, type StoredAnalysis } from '@/db/server/inspections';
import { analyseInspection } from '@/features/records/analysis';
import type { Reading } from '@/features/records/schema';
import { inspectionDetailSchema } from '@/features/review/inspection-schema';
import { analysePending } from '@/server/sync/analysis';

import { makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';

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
const swingReading = (kind: 'amplitude' | 'period', valueSI: number, unit: string): Reading => ({
  id: randomUUID(),
  kind,
  joint: 0,
  label: kind === 'amplitude' ? 'Swing amplitude' : 'Swing period',
  valueSI,
  unit,
  method: kind === 'amplitude' ? 'gauge' : 'stopwatch',
  takenAt: '2026-05-04T08:10:00.000Z',
});
const push = (records: unknown[]) => api.inspector.push(records);
const detail = async (id: string) => (await api.supervisor.get(`/api/inspections/${id}`)).body.inspection;

test('a free-swing ride is analysed as a free swing, with its period compared and its stops stored', async () => {
  expect(skylark.design.motion[0]).toMatchObject({ kind: 'swing', freeSwing: true });
  // 11.5 s measured against the free swing's ≈ 10.4 s: more than 5 % apart.
  const readings = [swingReading('amplitude', deg(108), '°'), swingReading('period', 11.5, 's')];
  const record = makeRecord(skylark, { readings });
  expect((await push([record])).body.results[0].status).toBe('accepted');
  await analysePending(server.db);

  const got = await detail(record.id);
  const a = got.analysis as StoredAnalysis;
  const direct = analyseInspection(skylark.design, record.readings);
  expect(a.models?.[0]).toEqual({ joint: 0, name: 'Main arm', model: 'free_swing', source: 'readings' });
  expect(a.models?.[1]).toMatchObject({ model: 'fixed', source: 'design' });

  expect(a.periodChecks).toHaveLength(1);
  const check = a.periodChecks?.[0];
  expect(check?.measuredS).toBe(11.5);
  expect(check?.computedS).toBe(direct.joints[0].freePeriodS);
  expect(check?.difference).toBeLessThan(-0.05);
  expect(a.warnings?.find((w) => w.code === 'period_check')?.level).toBe('warning');

  expect(a.loadCases?.map((c) => c.kind)).toEqual(['operating', 'service_stop', 'emergency_stop']);
  expect(a.loadCases?.[1].decelRadS2).toEqual([skylark.design.motion[0].serviceDecelRadS2, null]);
  // Peaks only: no histories in the stored JSON.
  expect(JSON.stringify(a.loadCases)).not.toMatch(/forceXN|"run"/);
  expect(a.governingCase).toBe(direct.governingCase);
  expect(a.status).toBe(direct.status);
  // Each envelope value names its case, and a stop's peak is the one stored where it governs.
  for (const item of a.envelope)
    expect(['operating', 'service_stop', 'emergency_stop']).toContain(item.loadCase);
  const force = a.envelope.find((e) => e.id === 'joints.0.force');
  expect(force?.value).toBe(Math.max(...(a.loadCases ?? []).map((c) => c.joints[0].peakForceN)));

  // The review desk reads it all back, and the recomputed cycle is the same analysis.
  const parsed = inspectionDetailSchema.parse(got);
  expect(parsed.analysis?.governingCase).toBe(a.governingCase);
  expect(parsed.analysis?.envelope.find((e) => e.id === 'joints.0.force')?.loadCase).toBe(force?.loadCase);
  const cycle = (await api.supervisor.get(`/api/inspections/${record.id}/cycle`)).body;
  expect(cycle.status).toBe(a.status);
  expect(cycle.envelope).toEqual(JSON.parse(JSON.stringify(a.envelope)));
  expect(cycle.warnings.map((w: { code: string }) => w.code)).toContain('period_check');
});

test('an analysis stored by engine 1.0.0, without models or cases, still reads and displays', async () => {
  const record = makeRecord(skylark, { readings: [swingReading('amplitude', deg(109), '°')] });
  await push([record]);
  await analysePending(server.db);
  const row = server.db.select().from(inspections).where(eq(inspections.id, record.id)).get();
  const stored = row?.analysis as StoredAnalysis;
  // As engine 1.0.0 wrote it: none of the new fields, envelope items without a case.
  const { models: _m, loadCases: _l, governingCase: _g, periodChecks: _p, warnings: _w, ...old } = stored;
  const legacy: StoredAnalysis = {
    ...old,
    engineVersion: '1.0.0',
    envelope: old.envelope.map(({ loadCase: _c, ...e }) => e),
  };
  server.db.update(inspections).set({ analysis: legacy }).where(eq(inspections.id, record.id)).run();

  const got = await detail(record.id);
  const parsed = inspectionDetailSchema.parse(got);
  expect(parsed.analysis?.engineVersion).toBe('1.0.0');
  expect(parsed.analysis?.models).toBeUndefined();
  expect(parsed.analysis?.loadCases).toBeUndefined();
  expect(parsed.analysis?.envelope.every((e) => e.loadCase === undefined)).toBe(true);
  expect(parsed.analysis?.status).toBe(legacy.status);
});
