/**
 * The server's side of the plausibility rule: a new record with a motion reading far from the design
 * motion (outside 0.5×–1.5× of the joint's design rate or amplitude; the product owner's rule, issue 11)
 * is refused unless the inspector confirmed it, and the analysis says when it used a confirmed one. The
 * case is the issue's: a period of 2.42 s tapped on Skylark, whose design swing takes 9.5 s (demo data).
 */
import { randomUUID } from 'node:crypto';

import { count, eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import type { Reading } from '@/features/records/schema';
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

const push = (records: unknown[]) => api.inspector.push(records);
const stored = (id: string) =>
  server.db.select({ n: count() }).from(inspections).where(eq(inspections.id, id)).get()?.n;

const period = (s: number, patch: Partial<Reading> = {}): Reading => ({
  id: randomUUID(),
  kind: 'period',
  joint: 0,
  label: 'Main arm: period (one full swing)',
  valueSI: s,
  unit: 's',
  method: 'tap_timer',
  spreadSI: 0.04,
  takenAt: '2026-05-04T08:10:00.000Z',
  ...patch,
});

test('Skylark is the case of the issue: a 9.5 s design swing', () => {
  const motion = skylark.design.motion.find((m) => m.joint === 0);
  expect(motion).toMatchObject({ kind: 'swing', periodS: 9.5 });
});

test('an unconfirmed period far from the design swing is refused, naming the reading, and nothing is kept', async () => {
  const record = makeRecord(skylark, { readings: [period(9.4), period(2.42)] }, { confirm: false });
  const res = await push([record]);
  expect(res.status).toBe(200);
  const result = res.body.results[0];
  expect(result).toMatchObject({ id: record.id, status: 'rejected' });
  expect(result.issues).toHaveLength(1);
  expect(result.issues[0].path).toBe('readings.1.valueSI');
  // 9.5 / 2.42 = 3.93: the words give the ratio and the design value it was compared with.
  expect(result.issues[0].message).toContain('3.93 × the design rate (design period 9.50 s)');
  expect(stored(record.id)).toBe(0);
});

test('the ride’s current design data is used when the phone sent no design version', async () => {
  const record = makeRecord(
    { ...skylark, designVersionId: null },
    { readings: [period(20)] },
    { confirm: false },
  );
  const result = (await push([record])).body.results[0];
  expect(result.status).toBe('rejected');
  expect(result.issues[0].path).toBe('readings.0.valueSI');
});

test('readings within 0.5×–1.5× need no confirmation; the bounds themselves are within', async () => {
  // Rate bounds for a 9.5 s swing: periods 19 s (0.5×) and 6.333 s (1.5×).
  const record = makeRecord(skylark, { readings: [period(19), period(9.5 / 1.5)] }, { confirm: false });
  expect((await push([record])).body.results[0].status).toBe('accepted');
});

test('a confirmed out-of-range reading is accepted, and the analysis records that it used it', async () => {
  const confirmation = {
    designSI: 9.5,
    ratio: 9.5 / 2.42,
    confirmedAt: '2026-05-04T08:11:00.000Z',
    note: 'Timed twice; the operator had the ride on its test programme',
  };
  const earlier = period(2.4, { plausibility: { ...confirmation, ratio: 9.5 / 2.4 } });
  const used = period(2.42, { plausibility: confirmation });
  const record = makeRecord(skylark, { readings: [earlier, used] }, { confirm: false });
  expect((await push([record])).body.results[0].status).toBe('accepted');
  // Re-sending the same record is answered as before: already had.
  expect((await push([record])).body.results[0].status).toBe('duplicate');

  await analysePending(server.db);
  const detail = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection;
  const listed = detail.analysis.confirmedOutOfRange;
  expect(listed).toHaveLength(2);
  expect(listed[1]).toEqual({
    readingId: used.id,
    label: used.label,
    kind: 'period',
    valueSI: 2.42,
    designSI: 9.5,
    ratio: 9.5 / 2.42,
    confirmedAt: confirmation.confirmedAt,
    note: confirmation.note,
    usedByLoadCheck: true,
  });
  // The earlier reading of the same quantity was replaced in the load check by the later one.
  expect(listed[0]).toMatchObject({ readingId: earlier.id, usedByLoadCheck: false });
});

test('an analysis with no confirmed out-of-range value does not carry the list', async () => {
  const record = makeRecord(skylark, { readings: [period(9.6)] });
  expect((await push([record])).body.results[0].status).toBe('accepted');
  await analysePending(server.db);
  const detail = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection;
  expect(detail.analysis).toBeTruthy();
  expect(detail.analysis.confirmedOutOfRange).toBeUndefined();
});

test('a correction may carry over a reading the original had accepted; a changed one must be confirmed', async () => {
  const confirmation = { designSI: 9.5, ratio: 9.5 / 2.42, confirmedAt: '2026-05-04T08:11:00.000Z' };
  const original = makeRecord(skylark, { readings: [period(2.42, { plausibility: confirmation })] });
  expect((await push([original])).body.results[0].status).toBe('accepted');
  // The copy an app made before the rule (or one that lost the confirmation) carries the reading bare.
  const { plausibility: _dropped, ...bare } = original.readings[0];
  expect(_dropped).toBeDefined();

  const changed = makeRecord(
    skylark,
    { amendsId: original.id, readings: [{ ...bare, valueSI: 2.5 }] },
    { confirm: false },
  );
  const refused = (await push([changed])).body.results[0];
  expect(refused).toMatchObject({ status: 'rejected', issues: [{ path: 'readings.0.valueSI' }] });

  const carried = makeRecord(skylark, { amendsId: original.id, readings: [bare] }, { confirm: false });
  expect((await push([carried])).body.results[0].status).toBe('accepted');
});
