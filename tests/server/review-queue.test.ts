/**
 * The supervisors' queue (GET /api/review/queue) and the read model behind it. The fixtures are invented:
 * one operator company with two sites and six rides, each put in the queue for a different reason.
 *
 * Where an urgency comes from the load check, the expected status is worked out beside the test from the
 * textbook result for a uniform slender rod turning at constant speed in a vertical plane about one end:
 * peak pin force m·g + m·ω²·L/2, at the bottom of the circle (standard rigid-body result, e.g. Meriam &
 * Kraige, Engineering Mechanics: Dynamics; from memory), against the pivot's 20 kN limit, with "near"
 * from 90 % of the limit (the engine's documented default margin).
 */
import fs from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';

import Database from 'better-sqlite3';
import { eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import { rides } from '@/db/server/schema';
import { DEFAULT_NEAR_MARGIN } from '@/features/loads/engine/envelope';
import {
  queueItemSchema,
  queueQuerySchema,
  queueResponseSchema,
  urgencies,
  type QueueItem,
} from '@/features/review/schema';
import type { InspectionRecord } from '@/features/records/schema';
import { createApp } from '@/server/app';
import { loadConfig } from '@/server/config';
import { databaseFileName, openDb } from '@/server/db';
import { createLogger } from '@/server/logger';
import { queuePageSql, readQueue } from '@/server/queue/queue';
import { refreshQueue, refreshQueueInspections } from '@/server/queue/queue-refresh';
import { seedDemoData } from '@/server/seed/demo';
import { analysePending } from '@/server/sync/analysis';
import { sqliteOf } from '@/server/sqlite-client';

import { expectApiError, makeTempDir, userIdOf, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { rodDesign } from '@/tests/support/rod-design';
import { makeRecord, rpmToRadS, speedReading } from './sync-fixtures';

const today = '2026-03-10';
let clock = new Date(`${today}T09:00:00Z`);
let server: TestServer;
let api: Clients;

/** Like makePinnedServer, with a clock the "new day" test can move. */
async function makeClockServer(): Promise<TestServer> {
  const dataDir = makeTempDir();
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, WEB_DIR: path.join(dataDir, 'none') });
  const database = openDb(config.dataDir);
  await seedDemoData(database.db, config, { now: clock });
  const app = createApp({
    db: database.db,
    config,
    logger: createLogger(config),
    signInLimit: { windowMs: 60_000, max: 10_000 },
    now: () => clock,
  });
  return {
    app,
    db: database.db,
    config,
    dataDir,
    close: () => {
      database.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

// ——— the rod and its load check ———

const ROD_MASS_KG = 1306;
const ROD_LENGTH_M = 6;
const LIMIT_N = 20_000; // rodDesign's maxForceN
const g = 9.80665;
const textbookPeakN = (rpm: number) => {
  const w = rpmToRadS(rpm);
  return ROD_MASS_KG * g + (ROD_MASS_KG * w * w * ROD_LENGTH_M) / 2;
};
const textbookStatus = (rpm: number) => {
  const ratio = textbookPeakN(rpm) / LIMIT_N;
  return ratio > 1 ? 'over' : ratio >= DEFAULT_NEAR_MARGIN ? 'near' : 'within';
};
// 6 rpm: 14.35 kN (72 %), 12 rpm: 18.99 kN (95 %), 15 rpm: 22.47 kN (112 %).
const WITHIN_RPM = 6;
const NEAR_RPM = 12;
const OVER_RPM = 15;

const allPass: InspectionRecord['checklist'] = [
  { itemId: 'item-a', area: 'Main pivot', text: 'Retaining plate bolts tight', result: 'pass' },
];
const oneFailed: InspectionRecord['checklist'] = [
  ...allPass,
  { itemId: 'item-b', area: 'Gondolas', text: 'Lap bars lock', result: 'fail', note: 'Seat 3 slow to lock' },
];

// ——— fixtures ———

type Ride = { id: string; name: string; designVersionId: string | null };
const ids = {
  company: '',
  quay: '', // site
  harrow: '', // site
  supervisor: '',
  inspector: '',
};
const r = {} as Record<'swinger' | 'flyer' | 'wheel' | 'chairs' | 'kite' | 'glider', Ride>;
const records: Record<string, InspectionRecord> = {};

async function createRide(body: Record<string, unknown>, withRod: boolean): Promise<Ride> {
  const res = await api.admin.post('/api/rides', { operatorCompanyId: ids.company, ...body });
  expect(res.status).toBe(201);
  const ride: Ride = { id: res.body.ride.id, name: res.body.ride.name, designVersionId: null };
  if (withRod) {
    const design = await api.admin.put(`/api/rides/${ride.id}/design`, {
      reason: 'Queue test rod',
      data: rodDesign(ROD_MASS_KG, ROD_LENGTH_M, 'Queue test rod'),
    });
    expect(design.status).toBe(201);
    ride.designVersionId = design.body.design.id;
  }
  return ride;
}

async function push(as: 'inspector' | 'supervisor', record: InspectionRecord) {
  const res = await api[as].push([record]);
  expect(res.body.results[0].status).toBe('accepted');
  records[record.id] = record;
  return record;
}

function rodRecord(ride: Ride, rpm: number, submittedAt: string, patch: Partial<InspectionRecord> = {}) {
  const design = rodDesign(ROD_MASS_KG, ROD_LENGTH_M, 'Queue test rod');
  return makeRecord(
    { id: ride.id, designVersionId: ride.designVersionId, design },
    { readings: [speedReading(rpm)], submittedAt, checklist: allPass, ...patch },
  );
}

beforeAll(async () => {
  server = await makeClockServer();
  api = await demoClients(server.app);
  ids.supervisor = userIdOf(server.db, 'supervisor@pivotwatch.test');
  ids.inspector = userIdOf(server.db, 'inspector@pivotwatch.test');

  ids.company = (await api.admin.post('/api/companies', { name: 'Brindlecombe Amusements' })).body.company.id;
  const site = async (name: string, kind: string) =>
    (await api.admin.post('/api/sites', { name, kind, operatorCompanyId: ids.company })).body.site
      .id as string;
  ids.quay = await site('Quay Front', 'park');
  ids.harrow = await site('Harrow Green fairground', 'fairground');

  r.swinger = await createRide({ name: 'Quay Swinger', rideClass: 'rotating_arm', siteId: ids.quay }, true);
  r.flyer = await createRide({ name: 'Harrow Flyer', rideClass: 'pendulum_swing', siteId: ids.harrow }, true);
  r.wheel = await createRide(
    {
      name: 'Quay Wheel',
      rideClass: 'wheel',
      siteId: ids.quay,
      serial: 'BQ-WH-0007',
      status: 'restricted',
      statusReason: 'Half load until the drive tyre is replaced',
    },
    true,
  );
  r.chairs = await createRide(
    { name: 'Harrow Chairs', rideClass: 'swing_carousel', siteId: ids.harrow },
    false,
  );
  r.kite = await createRide(
    { name: 'Quay Kite', rideClass: 'other', status: 'out_of_service', statusReason: 'In store' },
    true,
  );
  r.glider = await createRide({ name: 'Harrow Glider', rideClass: 'rotating_arm', siteId: ids.harrow }, true);

  // over: the load check puts the pivot force over its limit
  await push('inspector', rodRecord(r.swinger, OVER_RPM, '2026-03-09T08:00:00.000Z'));
  // failed: within limits, one checklist item failed; the phone sent its local time, which is the evening
  // before in UTC
  await push(
    'inspector',
    rodRecord(r.flyer, WITHIN_RPM, '2026-03-09T01:30:00+02:00', { checklist: oneFailed }),
  );
  // near: close to the limit, checklist passed
  await push('inspector', rodRecord(r.wheel, NEAR_RPM, '2026-03-05T10:00:00.000Z'));
  // overdue: a periodic inspection due on 1 March, never done
  expect(
    (
      await api.supervisor.post('/api/schedules', {
        rideId: r.chairs.id,
        inspectionType: 'periodic',
        dueOn: '2026-03-01',
      })
    ).status,
  ).toBe(201);
  // awaiting: nothing flagged, submitted by the supervisor (for the inspector filter)
  await push('supervisor', rodRecord(r.glider, WITHIN_RPM, '2026-03-07T12:00:00.000Z'));
  // past due: an approved inspection with a finding due on 3 March, still open. Decisions and findings have
  // their own API (tested with it); here they are written directly, with the refresh that API makes.
  const kiteRecord = await push('inspector', rodRecord(r.kite, WITHIN_RPM, '2026-02-20T09:00:00.000Z'));
  await analysePending(server.db);
  server.db
    .update(inspections)
    .set({ reviewState: 'approved', reviewedAt: '2026-02-21T10:00:00.000Z', reviewedBy: ids.supervisor })
    .where(eq(inspections.id, kiteRecord.id))
    .run();
  server.db
    .insert(findings)
    .values({
      inspectionId: kiteRecord.id,
      rideId: r.kite.id,
      number: 1,
      severity: 'fix_by_date',
      description: 'Gondola 2 lap bar latch worn',
      requiredAction: 'Replace the latch pawl',
      dueOn: '2026-03-03',
      createdAt: '2026-02-21T10:00:00.000Z',
      createdBy: ids.supervisor,
      updatedAt: '2026-02-21T10:00:00.000Z',
      updatedBy: ids.supervisor,
    })
    .run();
  refreshQueue(server.db, today, [r.kite.id]);
}, 60_000);
afterAll(() => server.close());

async function queue(query = '', as: Clients['supervisor'] = api.supervisor) {
  const res = await as.get(`/api/review/queue?operatorId=${ids.company}${query}`);
  expect(res.status).toBe(200);
  return queueResponseSchema.parse(res.body);
}
const names = (items: QueueItem[]) => items.map((i) => i.rideName);

describe('the load checks behind the fixtures (textbook rod)', () => {
  test('the server analysis agrees with m·g + m·ω²·L/2 and its status with the limit', async () => {
    expect([WITHIN_RPM, NEAR_RPM, OVER_RPM].map(textbookStatus)).toEqual(['within', 'near', 'over']);
    const { items } = await queue('&pageSize=100');
    const byRide = new Map(items.map((i) => [i.rideId, i]));
    expect(byRide.get(r.swinger.id)?.analysisStatus).toBe(textbookStatus(OVER_RPM));
    expect(byRide.get(r.wheel.id)?.analysisStatus).toBe(textbookStatus(NEAR_RPM));
    expect(byRide.get(r.glider.id)?.analysisStatus).toBe(textbookStatus(WITHIN_RPM));
    expect(byRide.get(r.flyer.id)?.analysisStatus).toBe(textbookStatus(WITHIN_RPM));
  });
});

describe('order and counts', () => {
  test('most urgent first across all six kinds, each item with what put it there', async () => {
    const page = await queue();
    expect(page.items.map((i) => [i.rideName, i.urgency, i.kind])).toEqual([
      ['Quay Swinger', 'over', 'inspection'],
      ['Harrow Flyer', 'failed', 'inspection'],
      ['Quay Wheel', 'near', 'inspection'],
      ['Harrow Chairs', 'overdue', 'ride'],
      ['Quay Kite', 'past_due', 'ride'],
      ['Harrow Glider', 'awaiting', 'inspection'],
    ]);
    expect(page.counts).toEqual({
      incident_serious: 0,
      incident: 0,
      over: 1,
      failed: 1,
      near: 1,
      overdue: 1,
      past_due: 1,
      awaiting: 1,
    });
    expect(page.total).toBe(6);

    const [over, failed, , overdue, pastDue, awaiting] = page.items;
    expect(over.key).toBe(`i:${over.inspectionId}`);
    expect(over.inspectorName).toBe('Tomas Reyne');
    expect(failed.failedItems).toBe(1);
    // 01:30 at UTC+2 is 23:30 UTC the day before
    expect(failed.at).toBe('2026-03-08T23:30:00.000Z');
    expect(overdue).toMatchObject({ key: `r:${r.chairs.id}`, at: '2026-03-01', overdueSince: '2026-03-01' });
    expect(overdue.inspectionId).toBeNull();
    expect(pastDue).toMatchObject({ at: '2026-03-03', findingsPastDue: 1, overdueSince: null });
    expect(awaiting).toMatchObject({ inspectorName: 'Mira Delacourt', siteName: 'Harrow Green fairground' });
    expect(awaiting.operatorName).toBe('Brindlecombe Amusements');
  });

  test('items have exactly the fields of the shared schema, the same as readQueue gives', async () => {
    const res = await api.supervisor.get(`/api/review/queue?operatorId=${ids.company}`);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    const fields = Object.keys(queueItemSchema.shape).sort();
    for (const item of res.body.items) expect(Object.keys(item).sort()).toEqual(fields);
    expect(res.body).toEqual(
      readQueue(server.db, queueQuerySchema.parse({ operatorId: ids.company }), today),
    );
  });

  test('within one urgency the longest waiting comes first; a ride with a submitted inspection has no row of its own', async () => {
    const glider = (await queue('&urgency=awaiting')).items[0];
    const earlier = await push('inspector', rodRecord(r.glider, WITHIN_RPM, '2026-03-06T07:00:00.000Z'));
    const chairs = await push(
      'inspector',
      makeRecord(
        { id: r.chairs.id, designVersionId: null },
        { submittedAt: '2026-02-27T08:00:00.000Z', checklist: allPass },
      ),
    );
    await analysePending(server.db);
    try {
      expect((await queue('&urgency=awaiting')).items.map((i) => i.key)).toEqual([
        `i:${earlier.id}`,
        glider.key,
      ]);
      // Harrow Chairs' overdue schedule now rides on its submitted inspection
      expect((await queue('&urgency=overdue')).items.map((i) => [i.key, i.at, i.overdueSince])).toEqual([
        [`i:${chairs.id}`, '2026-02-27T08:00:00.000Z', '2026-03-01'],
      ]);
    } finally {
      // Signed off (directly, as the decisions API would), which takes both out of the queue again.
      for (const id of [earlier.id, chairs.id])
        server.db.update(inspections).set({ reviewState: 'approved' }).where(eq(inspections.id, id)).run();
      refreshQueue(server.db, today, [r.glider.id, r.chairs.id]);
    }
    expect((await queue('&urgency=overdue,awaiting')).items.map((i) => i.key)).toEqual([
      `r:${r.chairs.id}`,
      glider.key,
    ]);
  });

  test('counts ignore the urgency filter; total and items follow it', async () => {
    const page = await queue('&urgency=over,awaiting');
    expect(names(page.items)).toEqual(['Quay Swinger', 'Harrow Glider']);
    expect(page.total).toBe(2);
    expect(page.counts).toEqual({
      incident_serious: 0,
      incident: 0,
      over: 1,
      failed: 1,
      near: 1,
      overdue: 1,
      past_due: 1,
      awaiting: 1,
    });
    const repeated = await queue('&urgency=near&urgency=near&urgency=failed');
    expect(names(repeated.items)).toEqual(['Harrow Flyer', 'Quay Wheel']);
  });

  test('counts narrow with the other filters', async () => {
    const page = await queue(`&siteId=${ids.quay}`);
    expect(page.counts).toEqual({
      incident_serious: 0,
      incident: 0,
      over: 1,
      failed: 0,
      near: 1,
      overdue: 0,
      past_due: 0,
      awaiting: 0,
    });
  });
});

describe('filters and search', () => {
  test.each([
    ['site (pier)', () => `&siteId=${ids.quay}`, ['Quay Swinger', 'Quay Wheel']],
    ['site (fairground)', () => `&siteId=${ids.harrow}`, ['Harrow Flyer', 'Harrow Chairs', 'Harrow Glider']],
    ['inspector (supervisor)', () => `&inspectorId=${ids.supervisor}`, ['Harrow Glider']],
    ['inspector', () => `&inspectorId=${ids.inspector}`, ['Quay Swinger', 'Harrow Flyer', 'Quay Wheel']],
    ['ride classes, comma-separated', () => '&rideClass=wheel,other', ['Quay Wheel', 'Quay Kite']],
    [
      'ride classes, repeated',
      () => '&rideClass=rotating_arm&rideClass=swing_carousel',
      ['Quay Swinger', 'Harrow Chairs', 'Harrow Glider'],
    ],
    ['ride status', () => '&rideStatus=restricted', ['Quay Wheel']],
    ['ride statuses', () => '&rideStatus=out_of_service,restricted', ['Quay Wheel', 'Quay Kite']],
    ['class and site together', () => `&rideClass=rotating_arm&siteId=${ids.harrow}`, ['Harrow Glider']],
    ['urgencies', () => '&urgency=overdue,past_due', ['Harrow Chairs', 'Quay Kite']],
  ])('%s', async (_label, query, expected) => {
    expect(names((await queue(query())).items)).toEqual(expected);
  });

  test('the operator filter', async () => {
    const all = await api.supervisor.get('/api/review/queue?pageSize=100');
    const mine = all.body.items.filter((i: QueueItem) => i.operatorId === ids.company);
    expect(mine).toHaveLength(6);
    expect((await queue()).items).toEqual(
      queueResponseSchema.parse(all.body).items.filter((i) => i.operatorId === ids.company),
    );
    const other = await api.supervisor.get(`/api/review/queue?operatorId=${randomUUID()}`);
    expect(other.body).toMatchObject({ items: [], total: 0 });
  });

  test.each([
    ['harrow', ['Harrow Flyer', 'Harrow Chairs', 'Harrow Glider']],
    ['HARROW green', ['Harrow Flyer', 'Harrow Chairs', 'Harrow Glider']],
    ['quay', ['Quay Swinger', 'Quay Wheel', 'Quay Kite']],
    ['bq-wh', ['Quay Wheel']], // serial
    ['delacourt', ['Harrow Glider']], // inspector
    [
      'brindlecombe',
      ['Quay Swinger', 'Harrow Flyer', 'Quay Wheel', 'Harrow Chairs', 'Quay Kite', 'Harrow Glider'],
    ],
    ['%', []], // taken literally, not as a pattern
    ['_', []],
  ])('search %p', async (q, expected) => {
    expect(names((await queue(`&q=${encodeURIComponent(q)}`)).items)).toEqual(expected);
  });

  test.each([
    ['&from=2026-03-08&to=2026-03-08', ['Harrow Flyer']], // 23:30 UTC on the 8th
    ['&from=2026-03-09', ['Quay Swinger']],
    ['&from=2026-03-01&to=2026-03-01', ['Harrow Chairs']], // a ride's due date, inclusive
    ['&from=2026-03-03&to=2026-03-07', ['Quay Wheel', 'Quay Kite', 'Harrow Glider']], // both ends inclusive
    ['&to=2026-03-02', ['Harrow Chairs']],
    ['&from=2026-03-11', []],
  ])('date range %p', async (query, expected) => {
    expect(names((await queue(query)).items)).toEqual(expected);
  });
});

describe('sorts and pages', () => {
  test.each([
    ['newest', ['Quay Swinger', 'Harrow Flyer', 'Harrow Glider', 'Quay Wheel', 'Quay Kite', 'Harrow Chairs']],
    ['oldest', ['Harrow Chairs', 'Quay Kite', 'Quay Wheel', 'Harrow Glider', 'Harrow Flyer', 'Quay Swinger']],
    ['ride', ['Harrow Chairs', 'Harrow Flyer', 'Harrow Glider', 'Quay Kite', 'Quay Swinger', 'Quay Wheel']],
    [
      'urgency',
      ['Quay Swinger', 'Harrow Flyer', 'Quay Wheel', 'Harrow Chairs', 'Quay Kite', 'Harrow Glider'],
    ],
  ])('sort=%s', async (sort, expected) => {
    expect(names((await queue(`&sort=${sort}`)).items)).toEqual(expected);
  });

  test('pages cover the list once, in order; a page past the end is empty', async () => {
    const full = (await queue('&sort=newest')).items.map((i) => i.key);
    const pages = await Promise.all([1, 2, 3].map((p) => queue(`&sort=newest&pageSize=4&page=${p}`)));
    expect(pages.map((p) => p.items.length)).toEqual([4, 2, 0]);
    expect(pages.flatMap((p) => p.items.map((i) => i.key))).toEqual(full);
    for (const [i, p] of pages.entries()) expect(p).toMatchObject({ total: 6, page: i + 1, pageSize: 4 });
  });

  test('defaults: urgency order, 25 per page, page 1', async () => {
    expect(await queue()).toMatchObject({ page: 1, pageSize: 25 });
  });
});

describe('input and access', () => {
  test.each([
    ['rideClass=bogus', 'query.rideClass'],
    ['rideStatus=closed', 'query.rideStatus'],
    ['urgency=panic', 'query.urgency'],
    ['sort=sideways', 'query.sort'],
    ['pageSize=500', 'query.pageSize'],
    ['page=0', 'query.page'],
    ['from=2026-02-30', 'query.from'],
    ['to=yesterday', 'query.to'],
    ['from=2026-03-09&to=2026-03-08', 'query.to'],
    [`q=${'x'.repeat(101)}`, 'query.q'],
  ])('%s → 400 naming %s', async (query, field) => {
    const res = await api.supervisor.get(`/api/review/queue?${query}`);
    const error = expectApiError(res, 400, 'validation_failed');
    expect(error.issues?.map((i) => i.path.split('.').slice(0, 2).join('.'))).toContain(field);
  });

  test('supervisors and admins read it; inspectors and operators may not; nobody unsigned', async () => {
    expect((await api.admin.get('/api/review/queue')).status).toBe(200);
    expectApiError(await api.inspector.get('/api/review/queue'), 403, 'forbidden');
    expectApiError(await api.operator.get('/api/review/queue'), 403, 'forbidden');
    expectApiError(await api.anonymous.get('/api/review/queue'), 401, 'unauthorized');
  });
});

/** Every row of the queue, in key order. */
const allRows = () =>
  sqliteOf(server.db).prepare('SELECT * FROM review_queue ORDER BY key').all() as Record<string, unknown>[];

describe('the queue follows what decides it', () => {
  // Whatever a write refreshed (some rides, some inspections), the queue must be what a full rebuild for
  // the same day makes of the same data.
  afterEach(() => {
    const kept = allRows();
    refreshQueue(server.db, today);
    expect(kept).toEqual(allRows());
  });

  test('a ride rename, in the item and the search', async () => {
    await api.admin.patch(`/api/rides/${r.swinger.id}`, { name: 'Quay Spinner' }).expect(200);
    expect(names((await queue('&urgency=over')).items)).toEqual(['Quay Spinner']);
    expect(names((await queue('&q=spinner')).items)).toEqual(['Quay Spinner']);
    expect((await queue('&q=swinger')).items).toEqual([]);
  });

  test('a site and an operator rename', async () => {
    await api.admin.patch(`/api/sites/${ids.harrow}`, { name: 'Harrow Common' }).expect(200);
    await api.admin.patch(`/api/companies/${ids.company}`, { name: 'Brindlecombe Leisure' }).expect(200);
    const { items } = await queue(`&siteId=${ids.harrow}`);
    expect(items.map((i) => [i.siteName, i.operatorName])).toEqual(
      Array(3).fill(['Harrow Common', 'Brindlecombe Leisure']),
    );
    expect(names((await queue('&q=harrow common')).items)).toHaveLength(3);
    expect((await queue('&q=fairground')).items).toEqual([]);
  });

  test('a status change', async () => {
    expect(names((await queue('&rideStatus=out_of_service')).items)).toEqual(['Quay Kite']);
    await api.supervisor
      .patch(`/api/rides/${r.glider.id}`, { status: 'out_of_service', statusReason: 'Arm bearing noise' })
      .expect(200);
    const page = await queue('&rideStatus=out_of_service');
    expect(names(page.items)).toEqual(['Quay Kite', 'Harrow Glider']);
    expect(page.counts.awaiting).toBe(1);
  });

  test('a schedule moved into the past, then out again', async () => {
    const created = await api.supervisor.post('/api/schedules', {
      rideId: r.glider.id,
      inspectionType: 'annual',
      dueOn: '2026-04-01',
    });
    expect(created.status).toBe(201);
    const glider = async () => (await queue()).items.find((i) => i.rideId === r.glider.id);
    expect(await glider()).toMatchObject({ urgency: 'awaiting', overdueSince: null });

    await api.supervisor
      .patch(`/api/schedules/${created.body.schedule.id}`, { dueOn: '2026-03-02' })
      .expect(200);
    // the submitted inspection stays the ride's one row, now marked overdue
    expect(await glider()).toMatchObject({
      kind: 'inspection',
      urgency: 'overdue',
      overdueSince: '2026-03-02',
    });
    expect((await queue()).counts).toMatchObject({ overdue: 2, awaiting: 0 });

    await api.supervisor.delete(`/api/schedules/${created.body.schedule.id}`).expect(204);
    expect(await glider()).toMatchObject({ urgency: 'awaiting', overdueSince: null });
  });

  test('a set-up moves a ride to another site, and its pull-down leaves it in store', async () => {
    const made = await api.supervisor.post('/api/setups', {
      rideId: r.glider.id,
      siteId: ids.quay,
      fromDate: today,
      toDate: today,
    });
    expect(made.status).toBe(201);
    const glider = async () => (await queue()).items.find((i) => i.rideId === r.glider.id);
    expect((await glider())?.siteName).toBe(made.body.setup.siteName);
    await api.supervisor
      .post(`/api/setups/${made.body.setup.id}/state`, { state: 'pulled_down' })
      .expect(200);
    expect((await glider())?.siteName ?? null).toBeNull();
  });

  test('a new day turns a schedule due today overdue', async () => {
    const drop = await createRide({ name: 'Quay Drop', rideClass: 'other', siteId: ids.quay }, false);
    await api.supervisor
      .post('/api/schedules', { rideId: drop.id, inspectionType: 'periodic', dueOn: today })
      .expect(201);
    expect((await queue()).items.some((i) => i.rideId === drop.id)).toBe(false);
    const before = clock;
    try {
      clock = new Date('2026-03-11T00:00:05Z');
      const { items, counts } = await queue('&urgency=overdue');
      expect(items.map((i) => [i.rideName, i.at])).toEqual([
        ['Harrow Chairs', '2026-03-01'],
        ['Quay Drop', today],
      ]);
      expect(counts.overdue).toBe(2);
    } finally {
      clock = before;
    }
    // back on the earlier day the queue is rebuilt for it
    expect((await queue()).items.some((i) => i.rideId === drop.id)).toBe(false);
  });

  test('an amendment supersedes its original', async () => {
    const original = Object.values(records).find((x) => x.rideId === r.flyer.id);
    if (!original) throw new Error('no Harrow Flyer record');
    const before = await queue();
    const amendment = await push(
      'inspector',
      rodRecord(r.flyer, WITHIN_RPM, '2026-03-09T09:00:00.000Z', { amendsId: original.id }),
    );
    const after = await queue('&pageSize=100');
    const keys = after.items.map((i) => i.key);
    expect(keys).not.toContain(`i:${original.id}`);
    // not analysed yet, checklist now passed: awaiting sign-off
    expect(after.items.find((i) => i.key === `i:${amendment.id}`)).toMatchObject({ urgency: 'awaiting' });
    expect(after.counts.failed).toBe(before.counts.failed - 1);
    expect(after.total).toBe(before.total);
    await analysePending(server.db);
    expect((await queue()).items.find((i) => i.key === `i:${amendment.id}`)).toMatchObject({
      analysisStatus: 'within',
      urgency: 'awaiting',
    });
  });

  test('a returned over-limit inspection keeps its ride flagged until a decision resolves it (an override)', async () => {
    const over = Object.values(records).find((x) => x.rideId === r.swinger.id);
    if (!over) throw new Error('no over-limit record');
    const before = await queue('&pageSize=100');
    expect(before.items.find((i) => i.key === `i:${over.id}`)).toMatchObject({ urgency: 'over' });
    await api.supervisor
      .post(`/api/inspections/${over.id}/decision`, { decision: 'return', note: 'Re-time the arm, please.' })
      .expect(200);
    const after = await queue('&pageSize=100');
    expect(after.items.some((i) => i.key === `i:${over.id}`)).toBe(false);
    // The ride keeps the alarm, pointing at the returned inspection; the over count does not drop.
    expect(after.items.find((i) => i.key === `r:${r.swinger.id}`)).toMatchObject({
      kind: 'ride',
      urgency: 'over',
      inspectionId: over.id,
      analysisStatus: 'over',
    });
    expect(after.counts.over).toBe(before.counts.over);
    // A stop alone does not resolve it: the ride still needs its follow-up or an override.
    await api.supervisor
      .post(`/api/rides/${r.swinger.id}/status`, { status: 'out_of_service', reason: 'Over its limit.' })
      .expect(200);
    expect((await queue('&urgency=over')).items.map((i) => i.key)).toContain(`r:${r.swinger.id}`);
    await api.supervisor
      .post(`/api/rides/${r.swinger.id}/status`, {
        status: 'in_service',
        reason: 'Speed governor re-set by the maker; arm timed at 6 rpm on site.',
      })
      .expect(200);
    expect((await queue('&urgency=over')).items.map((i) => i.key)).not.toContain(`r:${r.swinger.id}`);
  });

  test('a decision that stops the ride, and an approved follow-up that returns it', async () => {
    const twirl = await createRide({ name: 'Quay Twirl', rideClass: 'other', siteId: ids.quay }, true);
    const first = await push('inspector', rodRecord(twirl, WITHIN_RPM, '2026-03-09T10:00:00.000Z'));
    await analysePending(server.db);
    const decided = await api.supervisor
      .post(`/api/inspections/${first.id}/decision`, {
        decision: 'approve',
        rideStatus: { status: 'out_of_service', reason: 'Arm bearing to be replaced.' },
      })
      .expect(200);
    expect(decided.body.ride).toMatchObject({ status: 'out_of_service', changed: true });
    const followUp = await push(
      'inspector',
      rodRecord(twirl, WITHIN_RPM, '2026-03-10T08:00:00.000Z', { type: 'follow_up', checklist: allPass }),
    );
    await analysePending(server.db);
    expect((await queue()).items.find((i) => i.key === `i:${followUp.id}`)?.rideStatus).toBe(
      'out_of_service',
    );
    const back = await api.supervisor
      .post(`/api/inspections/${followUp.id}/decision`, { decision: 'approve' })
      .expect(200);
    expect(back.body.ride).toMatchObject({ status: 'in_service', changed: true });
    expect((await queue()).items.some((i) => i.rideId === twirl.id)).toBe(false);
  });

  test('counts kept in memory are dropped when another connection changes the queue', async () => {
    const before = await queue();
    const other = new Database(path.join(server.dataDir, databaseFileName));
    try {
      other.prepare('DELETE FROM review_queue WHERE ride_id = ?').run(r.kite.id);
    } finally {
      other.close();
    }
    const after = await queue();
    expect(after.counts.past_due).toBe(before.counts.past_due - 1);
    refreshQueue(server.db, today, [r.kite.id]);
    expect((await queue()).counts.past_due).toBe(before.counts.past_due);
  });
});

describe('refreshing', () => {
  test('without a connection to prepare on, drizzle runs the same statements to the same rows', () => {
    const before = allRows();
    const run: Pick<typeof server.db, 'run'> = { run: (query) => server.db.run(query) };
    server.db.transaction(() => {
      refreshQueue(run, today);
      expect(allRows()).toEqual(before);
      refreshQueue(run, today, [r.flyer.id, r.kite.id]);
      refreshQueueInspections(run, today, Object.keys(records));
    });
    expect(allRows()).toEqual(before);
    expect(before.length).toBeGreaterThanOrEqual(6);
  });

  test('a refresh that rolls back leaves the queue and its counts as they were', async () => {
    const before = await queue();
    expect(() =>
      server.db.transaction((tx) => {
        tx.update(rides).set({ name: 'Quay Renamed' }).where(eq(rides.id, r.wheel.id)).run();
        refreshQueue(tx, today, [r.wheel.id]);
        throw new Error('changed my mind');
      }),
    ).toThrow('changed my mind');
    expect(await queue()).toEqual(before);
  });
});

describe('query plans', () => {
  const plan = (input: Record<string, unknown>) => {
    const { sql, params } = queuePageSql(queueQuerySchema.parse(input));
    return (
      sqliteOf(server.db)
        .prepare(`EXPLAIN QUERY PLAN ${sql}`)
        .all(...params) as { detail: string }[]
    ).map((row) => row.detail);
  };

  test.each([
    [{}],
    [{ siteId: 'some-site' }],
    [{ operatorId: 'some-company', urgency: 'over,near' }],
    [{ inspectorId: 'someone' }],
    [{ rideClass: 'wheel', sort: 'urgency' }],
    [{ sort: 'newest', page: '3' }],
    [{ sort: 'ride' }],
    [{ q: 'quay' }],
  ])('%p reads review_queue through an index', (input) => {
    const details = plan(input);
    expect(details.some((d) => /review_queue USING (COVERING )?INDEX review_queue_/.test(d))).toBe(true);
    expect(details.filter((d) => /^SCAN review_queue$/.test(d))).toEqual([]);
  });

  test('every urgency has a count slot', () => {
    expect(Object.keys(queueResponseSchema.shape.counts.shape)).toEqual([...urgencies]);
  });
});
