/**
 * The typed text of a value must say the stored value: a record whose `entered` does not convert to its
 * `valueSI` is refused, naming the field, and nothing is kept; one that agrees is stored and the review
 * desk serves the text with the reading. 1 in = 25.4 mm exactly (NIST SP 811, Appendix B). Demo ride.
 */
import { randomUUID } from 'node:crypto';

import { count, eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import type { Reading } from '@/features/records/schema';

import { makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let ride: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  ride = demoRide(server.db, 'Little Kite');
});
afterAll(() => server.close());

const push = (records: unknown[]) => api.inspector.push(records);
const stored = (id: string) =>
  server.db.select({ n: count() }).from(inspections).where(eq(inspections.id, id)).get()?.n;

const clearance = (patch: Partial<Reading>): Reading => ({
  id: randomUUID(),
  kind: 'clearance',
  joint: 0,
  label: 'Arm and gondola: bushing clearance',
  valueSI: 0.0004,
  unit: 'mm',
  entered: '0.40',
  method: 'gauge',
  instrument: null,
  spreadSI: null,
  takenAt: '2026-05-04T08:10:00.000Z',
  ...patch,
});

test('a typed text that says another value is refused, naming it, and nothing is kept', async () => {
  const record = makeRecord(ride, { readings: [clearance({ entered: '0.50' })] });
  const res = await push([record]);
  expect(res.status).toBe(200);
  expect(res.body.results[0]).toMatchObject({ id: record.id, status: 'rejected' });
  expect(res.body.results[0].issues[0].path).toBe('readings.0.entered');
  expect(stored(record.id)).toBe(0);
});

test('a typed text that is not a plain decimal is refused by the schema', async () => {
  const record = makeRecord(ride, { readings: [clearance({ entered: '4e-1' })] });
  const res = await push([record]);
  expect(res.body.results[0]).toMatchObject({ status: 'rejected' });
  expect(res.body.results[0].issues[0].path).toBe('readings.0.entered');
});

test('typed texts that agree (in mm and in inches) are kept, and the desk serves them as typed', async () => {
  const inches = clearance({ unit: 'in', entered: '0.0157', valueSI: 0.0157 * 0.0254 });
  const record = makeRecord(ride, { readings: [clearance({}), inches] });
  const res = await push([record]);
  expect(res.body.results[0]).toMatchObject({ status: 'accepted' });
  const detail = await api.supervisor.get(`/api/inspections/${record.id}`);
  expect(detail.status).toBe(200);
  const entered = (detail.body.inspection.readings as { entered?: string }[]).map((r) => r.entered).sort();
  expect(entered).toEqual(['0.0157', '0.40']);
});
