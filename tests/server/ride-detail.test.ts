import fs from 'node:fs';

import { count } from 'drizzle-orm';
import request from 'supertest';

import { checklistTemplates, designVersions, inspectionSchedules } from '@/db/server/schema';
import { rideDetailResponseSchema } from '@/features/registry/schema';
import { rideListResponseSchema } from '@/features/rides/schema';
import { openDb } from '@/server/db';
import { demoRides, demoUsers, seedDemoData } from '@/server/seed/demo';
import { demoChecklists, demoDailyChecklists } from '@/server/seed/demo-checklists';
import { demoDesigns } from '@/server/seed/demo-design';
import { demoSchedules } from '@/server/seed/demo-schedules';

import { expectApiError, makeTempDir, makeTestServer, signInAs, type TestServer } from './helpers';

let server: TestServer;
const tokens: Record<string, string> = {};
beforeAll(async () => {
  server = await makeTestServer();
  for (const user of demoUsers) tokens[user.email] = await signInAs(server.app, user.email);
  // One password hash per demo account: slow on a busy machine.
}, 30_000);
afterAll(() => server.close());

const get = (path: string, email?: string) => {
  const req = request(server.app).get(path);
  return email ? req.set('Authorization', `Bearer ${tokens[email]}`) : req;
};

async function rideIds(email = 'admin@pivotwatch.test') {
  const res = await get('/api/rides', email);
  const parsed = rideListResponseSchema.parse(res.body);
  return new Map(parsed.rides.map((r) => [r.name, r]));
}

describe('GET /api/rides/:id', () => {
  test.each(['admin@pivotwatch.test', 'supervisor@pivotwatch.test', 'inspector@pivotwatch.test'])(
    '%s gets every demo ride with its list item and version 1 of its design data',
    async (email) => {
      const rides = await rideIds();
      for (const demo of demoRides) {
        const item = rides.get(demo.name);
        const res = await get(`/api/rides/${item?.id}`, email);
        expect(res.status).toBe(200);
        const body = rideDetailResponseSchema.parse(res.body);
        expect(body.ride).toEqual(item);
        expect(body.design).toMatchObject({
          version: 1,
          origin: 'seed',
          createdByName: 'Rowan Ashby',
          data: demoDesigns[demo.serial],
        });
        expect(body.design?.reason).toContain(demoDesigns[demo.serial].source.document);
        expect(Date.parse(body.design?.createdAt ?? '')).not.toBeNaN();
      }
    },
  );

  test('an operator gets its own company’s ride, without design data', async () => {
    const rides = await rideIds();
    const res = await get(`/api/rides/${rides.get('Skylark')?.id}`, 'operator@pivotwatch.test');
    expect(res.status).toBe(200);
    const body = rideDetailResponseSchema.parse(res.body);
    expect(body.ride.name).toBe('Skylark');
    expect(body.design).toBeNull();
  });

  test('another company’s ride is a 404 for an operator, the same as an unknown id', async () => {
    const rides = await rideIds();
    const other = expectApiError(
      await get(`/api/rides/${rides.get('Tidebreaker')?.id}`, 'operator@pivotwatch.test'),
      404,
      'not_found',
    );
    const unknown = expectApiError(
      await get('/api/rides/no-such-ride', 'operator@pivotwatch.test'),
      404,
      'not_found',
    );
    expect(other.message).toBe(unknown.message);
  });

  test('an unknown id is a 404 for staff too; no token is a 401', async () => {
    expectApiError(await get('/api/rides/no-such-ride', 'admin@pivotwatch.test'), 404, 'not_found');
    const rides = await rideIds();
    expectApiError(await get(`/api/rides/${rides.get('Skylark')?.id}`), 401, 'unauthorized');
  });
});

describe('demo design data in the seed', () => {
  test('a demo database from before design data, templates and schedules gets them on the next start, once', async () => {
    const dir = makeTempDir();
    const database = openDb(dir);
    try {
      await seedDemoData(database.db, { nodeEnv: 'development' });
      const versions = () => database.db.select({ n: count() }).from(designVersions).get()?.n;
      const templates = () => database.db.select({ n: count() }).from(checklistTemplates).get()?.n;
      const schedules = () => database.db.select({ n: count() }).from(inspectionSchedules).get()?.n;
      expect([versions(), templates(), schedules()]).toEqual([
        demoRides.length,
        demoChecklists.length + demoDailyChecklists.length,
        demoSchedules.length,
      ]);
      // An older demo database: the rides and users exist, the design data does not.
      database.db.delete(designVersions).run();
      database.db.delete(inspectionSchedules).run();
      expect([versions(), schedules()]).toEqual([0, 0]);
      expect(await seedDemoData(database.db, { nodeEnv: 'development' })).toBe('skipped_existing_users');
      expect([versions(), templates(), schedules()]).toEqual([
        demoRides.length,
        demoChecklists.length + demoDailyChecklists.length,
        demoSchedules.length,
      ]);
      await seedDemoData(database.db, { nodeEnv: 'development' });
      expect([versions(), templates(), schedules()]).toEqual([
        demoRides.length,
        demoChecklists.length + demoDailyChecklists.length,
        demoSchedules.length,
      ]);
    } finally {
      database.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
