/**
 * Fatigue and component ranges in the server's stored analysis of a pushed inspection, and analyses stored
 * before them still read and print.
 *
 * Sources:
 * - A uniform rod turning at constant ω about one end in a vertical plane (fixed-axis rotation, e.g.
 *   Meriam & Kraige, Engineering Mechanics: Dynamics; from memory): the pin force across the rod is
 *   m·g·cos θ and along it −m·ω²·L/2 + m·g·sin θ, so each ranges over 2·m·g per turn.
 * - EN 1993-1-9:2005 §7.1: N_R = 2×10⁶·(Δσ_C/Δσ)³ above Δσ_D = 0.737·Δσ_C; Palmgren–Miner D = Σ n/N.
 * - ASTM E1049-85 (2017) §5.4.4: one closed cycle per turn of the repeating history.
 */
import { execFileSync } from 'node:child_process';
import path from 'node:path';

import { eq } from 'drizzle-orm';
import request from 'supertest';

import { inspections, type StoredAnalysis } from '@/db/server/inspections';
import type { DesignData } from '@/features/loads/design-schema';
import { ENGINE_VERSION } from '@/features/loads/engine';
import { inspectionResponseSchema } from '@/features/review/inspection-schema';
import { analysePending } from '@/server/sync/analysis';
import { rodDesign } from '@/tests/support/rod-design';

import { makeTestServer, signInAs, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord, rpmToRadS, speedReading } from './sync-fixtures';

jest.setTimeout(60_000);

const g = 9.80665;
const m = 300;
const L = 6;
const RPM = 12;
const RIDE_CYCLE_S = 150;

const design: DesignData = {
  ...rodDesign(m, L, 'Test rod for the fatigue tests'),
  motion: [{ joint: 0, kind: 'constant', rpm: 6, maxRateRadS: 2, serviceDecelRadS2: 0.3 }],
  fatigue: {
    rideCycleS: RIDE_CYCLE_S,
    stopsPerRideCycle: 1,
    details: [
      {
        joint: 0,
        name: 'Lug net section',
        kind: 'lug_net_section',
        member: 'body',
        component: 'across',
        stressPerKnMPa: 20,
        categoryMPa: 90,
      },
      {
        joint: 0,
        name: 'Pin in shear',
        kind: 'pin_shear',
        member: 'parent',
        component: 'along',
        sectionAreaMm2: 2500,
        shearPlanes: 2,
        categoryMPa: 100,
        shear: true,
      },
    ],
  },
};

let server: TestServer;
let api: Clients;
let rideId: string;
let designVersionId: string;

beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  const comet = demoRide(server.db, 'Twin Comet');
  const operatorCompanyId: string = (await api.admin.get(`/api/rides/${comet.id}`)).body.ride
    .operatorCompanyId;
  const created = await api.admin.post('/api/rides', {
    name: 'Fatigue test rod',
    rideClass: 'other',
    operatorCompanyId,
  });
  expect(created.status).toBe(201);
  rideId = created.body.ride.id;
  const put = await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'Test rod', data: design });
  expect(put.status).toBe(201);
  designVersionId = put.body.design.id;
});
afterAll(() => server.close());

const push = (records: unknown[]) => api.inspector.push(records);
const detail = async (id: string) => (await api.supervisor.get(`/api/inspections/${id}`)).body.inspection;

async function analysed() {
  const record = makeRecord({ id: rideId, designVersionId, design }, { readings: [speedReading(RPM)] });
  expect((await push([record])).body.results[0].status).toBe('accepted');
  await analysePending(server.db);
  return record.id;
}

test('a synced inspection’s analysis stores ranges in the rod’s frame (2·m·g each, textbook) and no size range', async () => {
  const got = await detail(await analysed());
  const a = got.analysis;
  expect(a.engineVersion).toBe(ENGINE_VERSION);
  expect(ENGINE_VERSION).toBe('1.2.0');
  const j = a.joints[0];
  expect(j.forceRangeN).toBeUndefined();
  expect(j.ranges.frame).toBe('Rod');
  // 360 instants per turn (both ends included) can miss an extreme by half a step: 1 − cos 0.5° = 4×10⁻⁵.
  expect(j.ranges.acrossN / (2 * m * g)).toBeCloseTo(1, 4);
  expect(j.ranges.alongN / (2 * m * g)).toBeCloseTo(1, 4);
  // The drive torque m·g·L/2·cos θ ranges over 2·m·g·L/2.
  expect(j.ranges.torqueNm / (m * g * L)).toBeCloseTo(1, 4);
  expect(() => inspectionResponseSchema.parse({ inspection: got })).not.toThrow();
});

test('… and each fatigue detail’s damage per case and per ride cycle, hand-worked (EN 1993-1-9, ASTM E1049)', async () => {
  const a = (await detail(await analysed())).analysis;
  expect(a.fatigue).toHaveLength(2);
  const [lug, pin] = a.fatigue;
  expect(lug.cases.map((c: { kind: string }) => c.kind)).toEqual(['operating', 'service_stop']);

  // Lug: Δσ = 20 MPa/kN × 2·m·g = 117.7 MPa > Δσ_D = 0.737 × 90 = 66.3 MPa → N = 2×10⁶ × (90/117.7)³.
  const rangeMPa = (20 * 2 * m * g) / 1000;
  expect(lug.cases[0].maxRangeMPa / rangeMPa).toBeCloseTo(1, 4);
  // The hand sum on the range as sampled (one closed cycle per turn), and within 10⁻³ of the textbook's.
  const perTurn = (lug.cases[0].maxRangeMPa / 90) ** 3 / 2e6;
  expect(lug.cases[0].damage / perTurn).toBeCloseTo(1, 9);
  expect(perTurn / ((rangeMPa / 90) ** 3 / 2e6)).toBeCloseTo(1, 3);
  // A turn at 12 rpm is 5 s: a 150 s ride cycle holds 30 of them, plus one service stop.
  const T = 60 / RPM;
  expect(lug.damagePerRideCycle).toBeCloseTo(perTurn * (RIDE_CYCLE_S / T) + lug.cases[1].damage, 15);
  expect(lug.cases[1].damage).toBeGreaterThan(0);
  expect(lug.stressPerKnMPa).toBe(20);
  expect(lug.damageLimit).toBe(1);

  // Pin: the ground-frame reaction along global x ranges 2·m·ω²·L/2; 1000/(2500 × 2) = 0.2 MPa per kN.
  const w = rpmToRadS(RPM);
  expect(pin.stressPerKnMPa).toBeCloseTo(0.2, 12);
  expect(pin.shear).toBe(true);
  expect(pin.cases[0].maxRangeMPa / ((0.2 * 2 * m * w * w * (L / 2)) / 1000)).toBeCloseTo(1, 4);
  // 0.2 × 8.5 kN = 1.7 MPa is far below Δτ_L = 0.457 × 100 MPa: no damage.
  expect(pin.cases[0].damage).toBe(0);
});

test('an analysis stored before engine 1.2.0 still reads (magnitude range kept, no ranges or fatigue) and prints', async () => {
  const id = await analysed();
  const stored = server.db.select().from(inspections).where(eq(inspections.id, id)).get();
  const now = stored?.analysis as StoredAnalysis;
  const old: StoredAnalysis = {
    ...now,
    engineVersion: '1.1.0',
    joints: now.joints.map(({ ranges: _r, ...j }) => ({ ...j, forceRangeN: 1234 })),
  };
  delete old.fatigue;
  server.db.update(inspections).set({ analysis: old }).where(eq(inspections.id, id)).run();

  const got = await detail(id);
  const parsed = inspectionResponseSchema.parse({ inspection: got });
  expect(parsed.inspection.analysis?.joints[0].ranges).toBeUndefined();
  expect(parsed.inspection.analysis?.joints[0].forceRangeN).toBe(1234);
  expect(parsed.inspection.analysis?.fatigue).toBeUndefined();

  // The inspector's PDF says the ranges were not recorded rather than printing the size's range.
  const token = await signInAs(server.app, 'inspector@pivotwatch.test');
  const pdf = await request(server.app)
    .get(`/api/inspections/${id}/report.pdf`)
    .set('Authorization', `Bearer ${token}`)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
  expect(pdf.status).toBe(200);
  const text = readPdf(pdf.body as Buffer);
  expect(text).toContain('Not recorded (engine 1.1.0)');
  expect(text).not.toContain('1.234 kN');
});

test('a new analysis prints its ranges in the rod’s frame and the fatigue table with the standards named', async () => {
  const id = await analysed();
  const token = await signInAs(server.app, 'inspector@pivotwatch.test');
  const pdf = await request(server.app)
    .get(`/api/inspections/${id}/report.pdf`)
    .set('Authorization', `Bearer ${token}`)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
  expect(pdf.status).toBe(200);
  const text = readPdf(pdf.body as Buffer);
  expect(text).toContain('(Rod frame)');
  expect(text).toContain('Fatigue of the pivots’ details');
  expect(text).toContain('P1 · Rod · Lug net section');
  expect(text).toContain('ASTM E1049-85');
  expect(text).toContain('EN 1993-1-9 §7');
});

/** The PDF's text as pdf-parse reads it (in a child process: see support/read-pdf.cjs). */
function readPdf(pdf: Buffer): string {
  const out = execFileSync(process.execPath, [path.join(__dirname, 'support', 'read-pdf.cjs')], {
    input: pdf,
    maxBuffer: 64 * 1024 * 1024,
  });
  return (JSON.parse(out.toString('utf8')) as { text: string }).text.replace(/\s+/g, ' ');
}
