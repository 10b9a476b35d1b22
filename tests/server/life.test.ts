/**
 * A ride's pivot life (`GET /api/rides/:id/life`): damage accumulated per fatigue detail from the running
 * log and the latest analysis's damage per ride cycle, and the projected date of the damage limit. The
 * expected values are worked by hand below (Palmgren–Miner's linear sum, EN 1993-1-9 §A.5: damage = n × D
 * per cycle; limit reached when the sum reaches the design's limit, 1.0 unless stated).
 */
import { randomUUID } from 'node:crypto';

import { and, eq } from 'drizzle-orm';

import { runningLog } from '@/db/server/life';
import { inspections, type StoredAnalysis } from '@/db/server/inspections';
import { designVersions, users } from '@/db/server/schema';
import { accumulateDetail, rideCyclesOfDay, summariseLog } from '@/features/pivot-life/life-math';
import { rideLifeSchema, type RideLife } from '@/features/pivot-life/schema';
import { rideListPageSchema } from '@/features/registry/schema';
import { rideLife } from '@/server/pivot-life/life';

import type { TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';

const today = '2026-06-15';
const now = new Date(`${today}T10:00:00Z`);
let server: TestServer;
let api: Clients;
let rideIds: Map<string, string>;

beforeAll(async () => {
  server = await makePinnedServer(now);
  // The demo seeds a running log; these checks start from an empty one so their sums are worked by hand.
  server.db.delete(runningLog).run();
  api = await demoClients(server.app);
  const rides = rideListPageSchema.parse((await api.admin.get('/api/rides?pageSize=50')).body).rides;
  rideIds = new Map(rides.map((r) => [r.name, r.id]));
}, 60_000);
afterAll(() => server.close());

function designOf(rideId: string) {
  return server.db
    .select()
    .from(designVersions)
    .where(and(eq(designVersions.rideId, rideId), eq(designVersions.version, 1)))
    .get()!;
}

/** An analysed inspection as the server stores it; only the parts the life reads are filled in. */
function insertAnalysed(
  rideId: string,
  submittedAt: string,
  extra: Partial<StoredAnalysis>,
  amendsId: string | null = null,
): string {
  const design = designOf(rideId);
  const inspector = server.db.select().from(users).where(eq(users.role, 'inspector')).get()!;
  const id = randomUUID();
  const analysis = {
    engineVersion: '1.2.0',
    designVersionId: design.id,
    designVersion: design.version,
    status: 'within',
    durationS: 10,
    samples: 360,
    joints: [],
    seats: [],
    envelope: [],
    server: {},
    device: null,
    differences: [],
    ...extra,
  } as unknown as StoredAnalysis;
  server.db
    .insert(inspections)
    .values({
      id,
      rideId,
      inspectorId: inspector.id,
      type: 'periodic',
      startedAt: submittedAt,
      submittedAt,
      receivedAt: submittedAt,
      batchId: randomUUID(),
      designVersionId: design.id,
      amendsId,
      record: {} as never,
      contentSha256: randomUUID(),
      analysis,
      analysisStatus: 'within',
      analysedAt: submittedAt,
    })
    .run();
  return id;
}

async function lifeOf(rideId: string, who: Clients['supervisor'] = api.supervisor): Promise<RideLife> {
  const res = await who.get(`/api/rides/${rideId}/life`);
  expect(res.status).toBe(200);
  return rideLifeSchema.parse(res.body);
}

/*
 * Twin Comet's design data: ride cycle 150 s, one service stop per ride cycle (server/seed/demo-design.ts).
 * The stored analysis below: one operating cycle of 10 s does D = 6e-5 at detail 0, one service stop 1e-4,
 * so one ride cycle = 6e-5 × 150/10 + 1 × 1e-4 = 9e-4 + 1e-4 = 1e-3 (the operating cycle governs).
 * Detail 1 takes no damage (its ranges lie below the cut-off).
 */
const fatigue = [
  {
    detail: 0,
    joint: 0,
    name: 'Axle in double shear',
    categoryMPa: 100,
    shear: true,
    stressPerKnMPa: 0.05,
    cases: [
      { kind: 'operating' as const, maxRangeMPa: 60, damage: 6e-5 },
      { kind: 'service_stop' as const, maxRangeMPa: 70, damage: 1e-4 },
    ],
    damagePerRideCycle: 1e-3,
    damageLimit: 1,
  },
  {
    detail: 1,
    joint: 0,
    name: 'Arm lug net section',
    categoryMPa: 90,
    shear: false,
    stressPerKnMPa: 0.01,
    cases: [{ kind: 'operating' as const, maxRangeMPa: 10, damage: 0 }],
    damagePerRideCycle: 0,
    damageLimit: 0.5,
  },
];
const pinChecks = [
  {
    joint: 0,
    name: 'Main axle',
    forceN: 120_000,
    diameterM: 0.09,
    shear: 0.31,
    bearing: 0.22,
    bending: 0.48,
    combined: 0.33,
    bearingService: null,
    bendingService: null,
  },
];

describe('Twin Comet: from the latest analysis and the running log', () => {
  let inspectionId: string;
  beforeAll(() => {
    inspectionId = insertAnalysed(rideIds.get('Twin Comet')!, '2026-05-20T09:00:00.000Z', {
      fatigue,
      pinChecks,
      loadCases: [{ kind: 'operating', durationS: 10 } as never],
    });
  });

  test('no log: nothing logged, no rate, no projected date', async () => {
    const life = await lifeOf(rideIds.get('Twin Comet')!);
    expect(life.basis).toMatchObject({
      source: 'inspection',
      inspectionId,
      designVersion: 1,
      rideCycleS: 150,
    });
    expect(life.log).toEqual({
      entries: 0,
      firstDay: null,
      lastDay: null,
      cyclesLogged: 0,
      cyclesPerDay: null,
    });
    const axle = life.pivots.find((p) => p.joint === 0)!;
    expect(axle.details[0]).toMatchObject({
      damage: 0,
      lifeUsed: 0,
      projectedLimitOn: null,
      governingCase: 'operating',
    });
    // The stored pin check, without the joint and name the pivot already carries.
    const { joint: _joint, name: _name, ...pin } = pinChecks[0];
    expect(axle.pin).toEqual(pin);
  });

  test('accumulation and projected date, worked by hand', async () => {
    const ride = rideIds.get('Twin Comet')!;
    for (const day of [
      { day: '2026-01-10', cycles: 100 }, // outside the 90-day window
      { day: '2026-06-01', hours: 4 }, // 4 h × 3600 s/h ÷ 150 s = 96 ride cycles
      { day: '2026-06-14', cycles: 123, hours: 9 }, // cycles counted win over hours
    ])
      expect((await api.operator.post(`/api/rides/${ride}/running-log`, day)).status).toBe(201);

    const life = await lifeOf(ride, api.operator);
    // Logged: 100 + 96 + 123 = 319 ride cycles. Window: the 90 days 2026-03-17 … 2026-06-14 (the log's last
    // day), holding 96 + 123 = 219 → 219 / 90 = 2.4333 ride cycles per day.
    expect(life.log).toMatchObject({ entries: 3, firstDay: '2026-01-10', lastDay: '2026-06-14' });
    expect(life.log.cyclesLogged).toBeCloseTo(319, 9);
    expect(life.log.cyclesPerDay).toBeCloseTo(219 / 90, 12);

    const [axle, lug] = life.pivots.find((p) => p.joint === 0)!.details;
    // Damage = 319 × 1e-3 = 0.319 of a limit of 1 → 31.9 % used. Days left = (1 − 0.319) / (2.4333 × 1e-3)
    // = 279.86 → 279 (rounded down, the earlier day); 2026-06-15 + 279 days = 2027-03-21.
    expect(axle.cyclesLogged).toBeCloseTo(319, 9);
    expect(axle.damage).toBeCloseTo(0.319, 12);
    expect(axle.lifeUsed).toBeCloseTo(0.319, 12);
    expect(axle.projectedLimitOn).toBe('2027-03-21');
    // No damage per ride cycle: nothing used and no date, whatever the log.
    expect(lug).toMatchObject({ damage: 0, lifeUsed: 0, damageLimit: 0.5, projectedLimitOn: null });
  });

  test('an amended analysis no longer counts: its correction (stored without fatigue) leaves the design basis', async () => {
    const ride = rideIds.get('Twin Comet')!;
    insertAnalysed(ride, '2026-05-21T09:00:00.000Z', {}, inspectionId);
    const life = await lifeOf(ride);
    expect(life.basis.source).toBe('design');
    expect(life.basis.inspectionId).toBeNull();
    // The amended analysis's pin utilisations no longer count either: they come from the design motion's
    // load cases now, at the design's own peak force, not the 120 kN the amended analysis stored.
    const pin = life.pivots.find((p) => p.joint === 0)!.pin;
    expect(pin).not.toBeNull();
    expect(pin!.forceN).not.toBe(120_000);
    expect(pin!.forceN).toBeGreaterThan(0);
    expect(pin!.shear).toBeGreaterThan(0);
  });
});

describe('analyses made before fatigue was stored', () => {
  test('the design motion is the basis, and the log accumulates on it the same way', async () => {
    const ride = rideIds.get('Skylark')!;
    insertAnalysed(ride, '2026-06-01T08:00:00.000Z', { engineVersion: '1.1.0' });
    await api.supervisor.post(`/api/rides/${ride}/running-log`, { day: '2026-06-10', cycles: 50 });
    const life = await lifeOf(ride);
    const design = designOf(ride).data;
    expect(life.basis).toMatchObject({ source: 'design', inspectionId: null, designVersion: 1 });
    expect(life.basis.rideCycleS).toBe(design.fatigue?.rideCycleS ?? null);
    const details = life.pivots.flatMap((p) => p.details);
    expect(details.map((d) => d.name)).toEqual(design.fatigue?.details.map((d) => d.name) ?? []);
    for (const d of details) {
      expect(d.cyclesLogged).toBe(50);
      expect(d.damage).toBeCloseTo(50 * d.damagePerRideCycle, 15);
    }
  });

  test('the server’s function answers the same as the route (the notices and the queue call it)', async () => {
    const ride = rideIds.get('Skylark')!;
    expect(rideLife(server.db, ride, today)).toEqual(await lifeOf(ride));
  });
});

describe('the arithmetic on its own (hand-worked)', () => {
  test('hours → ride cycles at 3600 / rideCycleS per hour; none without a ride cycle time', () => {
    expect(rideCyclesOfDay({ day: today, cycles: null, hours: 7.5 }, 180)).toBe(150); // 7.5 × 20
    expect(rideCyclesOfDay({ day: today, cycles: 12, hours: 7.5 }, 180)).toBe(12);
    expect(rideCyclesOfDay({ day: today, cycles: null, hours: 2 }, null)).toBeNull();
  });

  test('a young log’s rate is over its own days; unlogged days in the window count as days not run', () => {
    // 2026-06-01 … 2026-06-10 is 10 days; 30 + 50 cycles → 8 per day.
    const s = summariseLog(
      [
        { day: '2026-06-01', cycles: 30, hours: null },
        { day: '2026-06-10', cycles: 50, hours: null },
      ],
      120,
    );
    expect(s).toMatchObject({ cyclesLogged: 80, rateFrom: '2026-06-01', rateDays: 10, cyclesPerDay: 8 });
  });

  test('a limit already passed is projected on today; a far date beyond 100 years is left out', () => {
    expect(accumulateDetail(0.01, 1, 150, 2, today)).toMatchObject({
      damage: 1.5,
      lifeUsed: 1.5,
      projectedLimitOn: today,
    });
    expect(accumulateDetail(1e-9, 1, 10, 1, today).projectedLimitOn).toBeNull();
    // (0.5 − 0.2) / (4 × 0.001) = 75 days → 2026-08-29.
    expect(accumulateDetail(0.001, 0.5, 200, 4, today)).toMatchObject({
      lifeUsed: 0.4,
      projectedLimitOn: '2026-08-29',
    });
  });
});
