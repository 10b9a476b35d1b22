/**
 * The operators' running log over HTTP: who may read and write which ride's log, validation with every
 * problem named, a day entered again replacing the old one (kept in the audit log), and a CSV import that
 * is all or nothing. CSV per RFC 4180 (quoted cells holding commas).
 */
import { and, eq } from 'drizzle-orm';
import request from 'supertest';

import { runningLog } from '@/db/server/life';
import { auditLog } from '@/db/server/schema';
import {
  runningLogImportResponseSchema,
  runningLogResponseSchema,
  runningLogSaveResponseSchema,
} from '@/features/pivot-life/running-log-schema';
import { rideListPageSchema } from '@/features/registry/schema';

import { expectApiError, signInAs, type TestServer } from './helpers';
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

// Tamsworth Pier Leisure (operator@) runs Twin Comet; Corvane Travelling Shows (operator2@) runs Tidebreaker.
const ownRide = () => rideIds.get('Twin Comet')!;
const otherRide = () => rideIds.get('Tidebreaker')!;
const logUrl = (id: string) => `/api/rides/${id}/running-log`;

const rowsOf = (rideId: string) =>
  server.db.select().from(runningLog).where(eq(runningLog.rideId, rideId)).all();

describe('roles and scope', () => {
  test('an operator logs a day on their own company’s ride and reads it back', async () => {
    const res = await api.operator.post(logUrl(ownRide()), {
      day: '2026-06-10',
      cycles: 140,
      note: 'Busy Saturday',
    });
    expect(res.status).toBe(201);
    const saved = runningLogSaveResponseSchema.parse(res.body);
    expect(saved.replaced).toBe(false);
    expect(saved.entry).toMatchObject({
      day: '2026-06-10',
      cycles: 140,
      note: 'Busy Saturday',
      source: 'typed',
    });
    expect(saved.entry.enteredByName).toBe('Priya Castellan');

    const list = runningLogResponseSchema.parse((await api.operator.get(logUrl(ownRide()))).body);
    expect(list.entries.map((e) => e.day)).toEqual(['2026-06-10']);
    expect(list.totals).toMatchObject({ days: 1, cycles: 140, hours: 0 });
  });

  test('another company’s operator gets 404 for the ride, reading or writing; nothing is saved', async () => {
    expectApiError(await api.operator2.get(logUrl(ownRide())), 404, 'not_found');
    expectApiError(
      await api.operator2.post(logUrl(ownRide()), { day: '2026-06-11', cycles: 5 }),
      404,
      'not_found',
    );
    expectApiError(await api.operator2.get(`/api/rides/${ownRide()}/life`), 404, 'not_found');
    expect(rowsOf(ownRide()).some((r) => r.day === '2026-06-11')).toBe(false);
  });

  test('staff read and write any ride’s log; without a sign-in it is 401', async () => {
    expect((await api.supervisor.post(logUrl(otherRide()), { day: '2026-06-01', hours: 6.5 })).status).toBe(
      201,
    );
    expect((await api.inspector.get(logUrl(otherRide()))).status).toBe(200);
    expect((await api.admin.get(`/api/rides/${otherRide()}/life`)).status).toBe(200);
    expectApiError(await api.anonymous.get(logUrl(otherRide())), 401, 'unauthorized');
    expectApiError(
      await api.anonymous.post(logUrl(otherRide()), { day: '2026-06-02', cycles: 1 }),
      401,
      'unauthorized',
    );
  });
});

describe('validation: 400 naming the field, nothing saved', () => {
  test.each([
    [{ day: '2026-06-12' }, 'cycles', 'Give the cycles or the hours run'],
    [{ day: '2026-06-12', cycles: 12.5 }, 'cycles', 'Must be a whole number'],
    [{ day: '2026-06-12', cycles: -1 }, 'cycles', 'Cannot be negative'],
    [{ day: '2026-06-12', hours: 25 }, 'hours', 'At most 24'],
    [{ day: '12/06/2026', cycles: 3 }, 'day', 'A date as YYYY-MM-DD'],
    [{ day: '2026-02-30', cycles: 3 }, 'day', 'Not a real date'],
    [{ day: '2026-07-01', cycles: 3 }, 'day', 'A day not yet run'],
  ])('%j → %s', async (body, path, message) => {
    const before = rowsOf(ownRide()).length;
    const error = expectApiError(await api.operator.post(logUrl(ownRide()), body), 400, 'validation_failed');
    expect(error.issues).toContainEqual({ path, message });
    expect(rowsOf(ownRide()).length).toBe(before);
  });

  test('tomorrow is accepted (an operator east of UTC is already there)', async () => {
    expect((await api.operator.post(logUrl(ownRide()), { day: '2026-06-16', cycles: 2 })).status).toBe(201);
  });
});

describe('a day entered again replaces it', () => {
  test('one row per ride and day; the audit log keeps what the day said before', async () => {
    const ride = ownRide();
    expect((await api.operator.post(logUrl(ride), { day: '2026-06-05', cycles: 80 })).status).toBe(201);
    const again = await api.supervisor.post(logUrl(ride), { day: '2026-06-05', hours: 4, note: 'corrected' });
    expect(again.status).toBe(200);
    const saved = runningLogSaveResponseSchema.parse(again.body);
    expect(saved.replaced).toBe(true);
    // The replacement is the whole day: the old cycle count does not linger beside the new hours.
    expect(saved.entry.cycles).toBeUndefined();
    expect(saved.entry).toMatchObject({ hours: 4, note: 'corrected', enteredByName: 'Mira Delacourt' });
    expect(rowsOf(ride).filter((r) => r.day === '2026-06-05')).toHaveLength(1);

    const trail = server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.rideId, ride), eq(auditLog.entity, 'ride')))
      .all()
      .filter((a) => a.summary.includes('running log 2026-06-05'));
    expect(trail.map((a) => a.action)).toEqual(['create', 'update']);
    expect(trail[1].before).toEqual({
      runningLog: { day: '2026-06-05', cycles: 80, hours: null, note: null, source: 'typed' },
    });
    expect(trail[1].after).toMatchObject({ runningLog: { hours: 4, cycles: null } });
  });
});

describe('CSV import (header day,cycles,hours,note; RFC 4180 quoting)', () => {
  const importCsv = (csv: string, who: Clients['operator'] = api.operator, ride = ownRide()) =>
    who.post(`${logUrl(ride)}/import`, { csv });

  test('a good file is saved whole, quoted notes with commas included; days already logged are replaced', async () => {
    const csv = [
      'day,cycles,hours,note',
      '2026-05-01,120,,',
      '2026-05-02,,7.5,"Rain, closed early"',
      '2026-06-05,90,,re-counted',
    ].join('\r\n');
    const res = await importCsv(csv);
    expect(res.status).toBe(200);
    expect(runningLogImportResponseSchema.parse(res.body)).toEqual({ saved: 3, replaced: 1 });
    const rows = rowsOf(ownRide());
    expect(rows.find((r) => r.day === '2026-05-02')).toMatchObject({
      hours: 7.5,
      cycles: null,
      note: 'Rain, closed early',
      source: 'csv',
    });
    expect(rows.find((r) => r.day === '2026-06-05')).toMatchObject({
      cycles: 90,
      hours: null,
      source: 'csv',
    });
  });

  test('the file as text/csv works the same; columns in any order', async () => {
    const res = await request(server.app)
      .post(`${logUrl(ownRide())}/import`)
      .set('Authorization', `Bearer ${await signInAs(server.app, 'operator@pivotwatch.test')}`)
      .set('Content-Type', 'text/csv')
      .send('hours,day\n3,2026-05-03\n');
    expect(res.status).toBe(200);
    expect(rowsOf(ownRide()).find((r) => r.day === '2026-05-03')).toMatchObject({ hours: 3 });
  });

  test('any bad row → 400 naming each row and field, and nothing of the file is saved', async () => {
    const before = rowsOf(ownRide());
    const csv = [
      'day,cycles,hours,note',
      '2026-04-01,50,,', // good, but must not be saved
      '2026-04-02,fifty,,',
      '2026-04-31,10,,',
      '2026-04-03,,,nothing run?',
      '2026-04-01,60,,',
    ].join('\n');
    const error = expectApiError(await importCsv(csv), 400, 'validation_failed');
    expect(error.message).toMatch(/nothing was saved/);
    expect(error.issues).toEqual([
      { path: 'rows.3.cycles', message: 'Row 3, cycles: Must be a whole number' },
      { path: 'rows.4.day', message: 'Row 4, day: Not a real date' },
      { path: 'rows.5.cycles', message: 'Row 5, cycles: Give the cycles or the hours run' },
      { path: 'rows.6.day', message: 'Row 6, day: The same day as row 2' },
    ]);
    expect(rowsOf(ownRide())).toEqual(before);
  });

  test('a missing or wrong header is refused', async () => {
    let error = expectApiError(await importCsv('2026-04-01,50,,\n'), 400, 'validation_failed');
    expect(error.issues?.[0].path).toMatch(/^rows\.1\./);
    error = expectApiError(await importCsv('day,note\n2026-04-01,x\n'), 400, 'validation_failed');
    expect(error.issues).toContainEqual({
      path: 'rows.1.cycles',
      message: 'Row 1, cycles: The header must name a cycles or an hours column',
    });
    error = expectApiError(await importCsv('day,cycles\n'), 400, 'validation_failed');
    expect(error.issues?.[0].message).toMatch(/No days/);
  });

  test('another company’s operator cannot import into the ride', async () => {
    expectApiError(await importCsv('day,cycles\n2026-04-01,1\n', api.operator2), 404, 'not_found');
    expect(rowsOf(ownRide()).some((r) => r.day === '2026-04-01')).toBe(false);
  });
});
