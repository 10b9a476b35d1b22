/**
 * The review queue's From/To filters mean days on each item's site clock: an inspection submitted at
 * 02:00 UTC on 3 Dec 2026 was submitted on 2 Dec at a site on the US Pacific coast (PST, UTC−8 in
 * December) and on 3 Dec at one in New Zealand (NZDT, UTC+13). Offsets from the IANA tz database.
 */

import { sql } from 'drizzle-orm';
import request from 'supertest';

import { queueResponseSchema } from '@/features/review/schema';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { dayInZoneSql } from '@/server/sql-functions';

import { makeTestServer, pushSigned, registerPhoneKey, signInAs, type TestServer } from './helpers';
import { demoRide, makeRecord } from './sync-fixtures';

describe('day_in_zone (server/sql-functions.ts)', () => {
  test('an instant is read on the zone’s clock (IANA tz database offsets)', () => {
    expect(dayInZoneSql('2026-12-03T02:00:00.000Z', 'America/Los_Angeles', null)).toBe('2026-12-02');
    expect(dayInZoneSql('2026-12-03T07:59:59.999Z', 'America/Los_Angeles', null)).toBe('2026-12-02');
    expect(dayInZoneSql('2026-12-03T08:00:00.000Z', 'America/Los_Angeles', null)).toBe('2026-12-03');
    expect(dayInZoneSql('2026-12-03T10:59:59.999Z', 'Pacific/Auckland', null)).toBe('2026-12-03');
    expect(dayInZoneSql('2026-12-03T11:00:00.000Z', 'Pacific/Auckland', null)).toBe('2026-12-04');
    // A local offset as a phone may send it.
    expect(dayInZoneSql('2026-12-02T18:00:00-08:00', 'Europe/London', null)).toBe('2026-12-03');
  });

  test('no zone, or one the platform does not know, takes the fallback, then UTC', () => {
    expect(dayInZoneSql('2026-12-03T02:00:00.000Z', null, 'America/Los_Angeles')).toBe('2026-12-02');
    expect(dayInZoneSql('2026-12-03T02:00:00.000Z', 'Mars/Olympus', 'America/Los_Angeles')).toBe(
      '2026-12-02',
    );
    expect(dayInZoneSql('2026-12-03T02:00:00.000Z', null, null)).toBe('2026-12-03');
  });

  test('a date is already a day; nothing readable gives null', () => {
    expect(dayInZoneSql('2026-11-30', 'Pacific/Auckland', null)).toBe('2026-11-30');
    expect(dayInZoneSql('not a date', 'UTC', null)).toBeNull();
    expect(dayInZoneSql(null, 'UTC', null)).toBeNull();
  });
});

describe('the queue’s From/To on the site’s clock', () => {
  let server: TestServer;
  let token: string;
  let item: { key: string; inspectionId: string; rideId: string; siteId: string };

  const submittedAt = '2026-12-03T02:00:00.000Z';

  beforeAll(async () => {
    server = await makeTestServer();
    token = await signInAs(server.app, 'supervisor@pivotwatch.test');
    // An inspection of a demo ride at a site, pushed as a phone does.
    const ride = demoRide(server.db, 'Tidebreaker');
    const record = makeRecord(ride, { submittedAt });
    const inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
    const pushed = await pushSigned(server.app, inspector, await registerPhoneKey(server.app, inspector), [
      record,
    ]);
    expect(pushed.body.results[0].status).toBe('accepted');
    const [site] = server.db.all<{ siteId: string }>(
      sql`SELECT site_id AS siteId FROM rides WHERE id = ${ride.id}`,
    );
    if (!site?.siteId) throw new Error('the demo ride has no site');
    item = { key: `i:${record.id}`, inspectionId: record.id, rideId: ride.id, siteId: site.siteId };
  });
  afterAll(() => server.close());

  function placeAt(zone: string) {
    server.db.run(sql`UPDATE sites SET time_zone = ${zone} WHERE id = ${item.siteId}`);
    server.db.transaction((tx) => refreshQueue(tx, queueDay(server.db), [item.rideId]));
  }

  async function keysBetween(from: string, to: string) {
    const res = await request(server.app)
      .get(`/api/review/queue?pageSize=100&from=${from}&to=${to}`)
      .set('Authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    return queueResponseSchema.parse(res.body).items;
  }

  test('on the US Pacific coast, 02:00 UTC on 3 Dec is 2 Dec', async () => {
    placeAt('America/Los_Angeles');
    const onSecond = await keysBetween('2026-12-02', '2026-12-02');
    const found = onSecond.find((i) => i.key === item.key);
    expect(found?.day).toBe('2026-12-02');
    expect(found?.at).toBe(submittedAt);
    expect((await keysBetween('2026-12-03', '2026-12-03')).map((i) => i.key)).not.toContain(item.key);
    // The desk's inspection page shows its times on the same clock.
    const detail = await request(server.app)
      .get(`/api/inspections/${item.inspectionId}`)
      .set('Authorization', `Bearer ${token}`);
    expect(detail.body.inspection.siteTimeZone).toBe('America/Los_Angeles');
  });

  test('in New Zealand the same instant is 3 Dec', async () => {
    placeAt('Pacific/Auckland');
    expect((await keysBetween('2026-12-02', '2026-12-02')).map((i) => i.key)).not.toContain(item.key);
    const onThird = await keysBetween('2026-12-03', '2026-12-03');
    expect(onThird.find((i) => i.key === item.key)?.day).toBe('2026-12-03');
    // A range that spans both days holds it whatever the zone.
    expect((await keysBetween('2026-12-01', '2026-12-04')).map((i) => i.key)).toContain(item.key);
  });
});
