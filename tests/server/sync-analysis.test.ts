/**
 * The server's own analysis of pushed inspections. The physics check uses a uniform slender rod turning at
 * constant speed in a vertical plane about one end: peak pin force m·g + m·ω²·L/2 at the bottom of the
 * circle (standard rigid-body result, e.g. Meriam & Kraige, Engineering Mechanics: Dynamics; from memory).
 * Everything else compares with features/inspections/analysis, the code the phone runs.
 */
import fs from 'node:fs';
import path from 'node:path';

import { eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { analyseInspection, previewOf } from '@/features/records/analysis';
import { ENGINE_VERSION } from '@/features/loads/engine';
import { registerDeviceKey } from '@/server/auth/device-keys';
import { findSessionUser } from '@/server/auth/service';
import { createApp } from '@/server/app';
import { loadConfig } from '@/server/config';
import { openDb } from '@/server/db';
import { createLogger } from '@/server/logger';
import { seedDemoData } from '@/server/seed/demo';
import { analysePending, ANALYSIS_SAMPLES, noDesignNote } from '@/server/sync/analysis';
import { ingestBatch } from '@/server/sync/ingest';

import { newPhoneKey, signedBatch } from '../support/phone-keys';
import { makeTempDir, makeTestServer, userIdOf, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { rodDesign } from '@/tests/support/rod-design';
import { demoRide, makeRecord, otherReading, rpmToRadS, speedReading } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let comet: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  comet = demoRide(server.db, 'Twin Comet');
});
afterAll(() => server.close());

const push = (records: unknown[]) => api.inspector.push(records);
const detail = async (id: string) => (await api.supervisor.get(`/api/inspections/${id}`)).body.inspection;

test('the analysis appears after the push, with engine and design versions, and matches the phone’s code', async () => {
  const readings = [speedReading(12.6), otherReading(0)];
  const record = makeRecord(comet, { readings });
  expect((await push([record])).body.results[0].status).toBe('accepted');
  await analysePending(server.db);

  const got = await detail(record.id);
  expect(got.analysedAt).not.toBeNull();
  expect(got.analysisNote).toBeNull();
  const a = got.analysis;
  expect(a.engineVersion).toBe(ENGINE_VERSION);
  expect(a.designVersionId).toBe(comet.designVersionId);
  expect(a.designVersion).toBe(1);
  expect(a.samples).toBe(ANALYSIS_SAMPLES);

  const direct = analyseInspection(comet.design, readings);
  expect(a.joints).toHaveLength(direct.joints.length);
  direct.joints.forEach((j, i) => {
    expect(a.joints[i].peakForceN).toBe(j.peakForce.value);
    expect(a.joints[i].peakTorqueNm).toBe(j.peakTorque.value);
  });
  expect(a.status).toBe(direct.status);
  expect(got.analysisStatus).toBe(direct.status);
  expect(a.envelope.map((e: { id: string }) => e.id)).toEqual(direct.envelope.map((e) => e.id));
  // The phone's preview was made by the same code on the same inputs.
  expect(a.device).toEqual(record.preview);
  expect(a.differences).toEqual([]);
});

test('where the phone’s preview differs, the analysis says how', async () => {
  const readings = [speedReading(12)];
  const honest = previewOf(analyseInspection(comet.design, readings));
  const record = makeRecord(comet, {
    readings,
    preview: { ...honest, engineVersion: '0.9.0', peakForceN: honest.peakForceN.map((f) => f * 0.8) },
  });
  await push([record]);
  await analysePending(server.db);
  const { differences } = (await detail(record.id)).analysis;
  expect(differences).toEqual([
    `Engine version: phone 0.9.0, server ${ENGINE_VERSION}.`,
    expect.stringMatching(/^Pivot 1 peak force: phone \d+ N, server \d+ N\.$/),
  ]);
});

test('a measured speed gives the textbook peak pin force of a rod turning about its end', async () => {
  const m = 300;
  const L = 6;
  const g = 9.80665;
  const rod = rodDesign(m, L, 'Test rod for the sync tests');
  const operatorCompanyId: string = (await api.admin.get(`/api/rides/${comet.id}`)).body.ride
    .operatorCompanyId;
  const created = await api.admin.post('/api/rides', {
    name: 'Test rod',
    rideClass: 'other',
    operatorCompanyId,
  });
  expect(created.status).toBe(201);
  const rideId: string = created.body.ride.id;
  const design = await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'Test rod', data: rod });
  expect(design.status).toBe(201);

  const rpm = 12;
  const record = makeRecord(
    { id: rideId, designVersionId: design.body.design.id, design: rod },
    {
      readings: [speedReading(rpm)],
    },
  );
  await push([record]);
  await analysePending(server.db);
  const peak: number = (await detail(record.id)).analysis.joints[0].peakForceN;
  const w = rpmToRadS(rpm);
  const textbook = m * g + (m * w * w * L) / 2;
  // Sampled at 360 points per turn, the peak can fall just short of the bottom of the circle.
  expect(peak).toBeLessThanOrEqual(textbook * (1 + 1e-9));
  expect(peak).toBeGreaterThan(textbook * (1 - 1e-4));
});

test('a ride without design data gets a note instead of an analysis', async () => {
  const comp: string = (await api.admin.get(`/api/rides/${comet.id}`)).body.ride.operatorCompanyId;
  const created = await api.admin.post('/api/rides', {
    name: 'Carousel awaiting data',
    rideClass: 'other',
    operatorCompanyId: comp,
  });
  const record = makeRecord({ id: created.body.ride.id, designVersionId: null });
  expect((await push([record])).body.results[0].status).toBe('accepted');
  await analysePending(server.db);
  const got = await detail(record.id);
  expect(got.analysis).toBeNull();
  expect(got.analysisNote).toBe(noDesignNote);
  expect(got.analysedAt).not.toBeNull();
  expect(got.designVersionId).toBeNull();
});

test('analysePending resolves only when nothing accepted is left unanalysed', async () => {
  const records = Array.from({ length: 12 }, (_, i) =>
    makeRecord(comet, { readings: [speedReading(10 + i / 4)] }),
  );
  await push(records);
  await analysePending(server.db);
  const left = server.db.select({ id: inspections.id }).from(inspections).all();
  const unanalysed = server.db
    .select({ id: inspections.id, at: inspections.analysedAt })
    .from(inspections)
    .all()
    .filter((r) => r.at === null);
  expect(left.length).toBeGreaterThanOrEqual(12);
  expect(unanalysed).toEqual([]);
});

test('after a restart, inspections stored but never analysed are analysed without any new push', async () => {
  const dataDir = makeTempDir();
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, WEB_DIR: path.join(dataDir, 'none') });
  try {
    // First run: records are stored, then the process stops before its analysis queue ran.
    const first = openDb(dataDir);
    await seedDemoData(first.db, config);
    const ride = demoRide(first.db, 'Twin Comet');
    const user = findSessionUser(first.db, userIdOf(first.db, 'inspector@pivotwatch.test'));
    if (!user) throw new Error('no demo inspector');
    const records = [makeRecord(ride), makeRecord(ride, { readings: [speedReading(9)] })];
    // Signed as the phone signs, with a key registered to the inspector.
    const key = newPhoneKey();
    registerDeviceKey(first.db, user, { publicKey: key.publicKey }, new Date());
    ingestBatch(first.db, user, signedBatch(records, key));
    const pending = () =>
      first.db
        .select({ at: inspections.analysedAt })
        .from(inspections)
        .all()
        .filter((r) => r.at === null).length;
    expect(pending()).toBe(2);
    first.close();

    // Second run: only starting the app, nothing else.
    const second = openDb(dataDir);
    createApp({ db: second.db, config, logger: createLogger(config) });
    const deadline = Date.now() + 10_000;
    const analysed = () =>
      second.db
        .select({ id: inspections.id, at: inspections.analysedAt, peak: inspections.analysis })
        .from(inspections)
        .all();
    while (analysed().some((r) => r.at === null) && Date.now() < deadline)
      await new Promise((resolve) => setTimeout(resolve, 20));
    const rows = analysed();
    expect(rows).toHaveLength(2);
    for (const r of rows) {
      expect(r.at).not.toBeNull();
      expect(r.peak?.engineVersion).toBe(ENGINE_VERSION);
      expect(r.peak?.designVersionId).toBe(ride.designVersionId);
    }
    const stored = second.db.select().from(inspections).where(eq(inspections.id, records[1].id)).get();
    expect(stored?.analysis?.joints[0].peakForceN).toBe(
      analyseInspection(ride.design, records[1].readings).joints[0].peakForce.value,
    );
    second.close();
  } finally {
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
});
