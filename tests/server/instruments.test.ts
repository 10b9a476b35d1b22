/**
 * The instrument register and the declaration: admin-only changes with audit entries, clear 400s that
 * change nothing, the push refusing readings taken with an instrument past its calibration due date and
 * records without a declaration, and the pull carrying both to the phone.
 *
 * The calibration rule is our own (README): an instrument may be used up to and including its due date.
 * That a measuring instrument past its calibration due date must not be used for acceptance measurements
 * is common practice in calibration control (from memory of ISO 9001 §7.1.5 / ISO 10012 practice).
 */
import { randomUUID } from 'node:crypto';

import { count, eq } from 'drizzle-orm';

import { instruments } from '@/db/server/instruments';
import { auditLog } from '@/db/server/schema';
import { DEFAULT_DECLARATION_TEXT, instrumentSchema } from '@/features/instruments/schema';
import type { Reading } from '@/features/records/schema';
import { pullResponseSchema } from '@/features/sync/pull-schema';
import { demoInstruments } from '@/server/seed/demo-instruments';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let comet: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  comet = demoRide(server.db, 'Twin Comet');
});
afterAll(() => server.close());

const micrometer = {
  name: 'Outside micrometer 125–150 mm',
  serial: 'T-MIC-0001',
  method: 'micrometer',
  kinds: ['pin_diameter'],
  calibratedOn: '2025-06-01',
  calibrationDueOn: '2026-06-01',
};
const instrumentCount = () => server.db.select({ n: count() }).from(instruments).get()?.n ?? 0;
const auditOf = (id: string) => server.db.select().from(auditLog).where(eq(auditLog.entityId, id)).all();

describe('/api/instruments', () => {
  test('admins add, change, retire and remove instruments; each change is audited with its dates in words', async () => {
    const created = await api.admin.post('/api/instruments', micrometer);
    expect(created.status).toBe(201);
    const instrument = instrumentSchema.parse(created.body.instrument);
    expect(instrument).toMatchObject({ ...micrometer, retiredAt: null, notes: null });

    const changed = await api.admin.patch(`/api/instruments/${instrument.id}`, {
      calibratedOn: '2026-05-28',
      calibrationDueOn: '2027-05-28',
    });
    expect(changed.status).toBe(200);
    expect(changed.body.instrument.calibrationDueOn).toBe('2027-05-28');

    const retired = await api.admin.patch(`/api/instruments/${instrument.id}`, { retired: true });
    expect(retired.body.instrument.retiredAt).toEqual(expect.any(String));
    // Retired instruments stay listed (old readings name them); the phone hides them.
    const list = await api.inspector.get('/api/instruments');
    expect(list.status).toBe(200);
    expect(list.body.instruments.map((i: { id: string }) => i.id)).toContain(instrument.id);

    const trail = auditOf(instrument.id);
    expect(trail.map((a) => [a.entity, a.action])).toEqual([
      ['instrument', 'create'],
      ['instrument', 'update'],
      ['instrument', 'update'],
    ]);
    expect(trail[1].summary).toContain('calibration due 2026-06-01 → 2027-05-28');
    expect(trail[2].summary).toContain('retired');

    expect((await api.admin.delete(`/api/instruments/${instrument.id}`)).status).toBe(204);
    expect((await api.admin.get(`/api/instruments/${instrument.id}`)).status).toBe(404);
    expect(auditOf(instrument.id).at(-1)).toMatchObject({ action: 'delete' });
  });

  test('only admins change the register; staff read it; operators and strangers get nothing', async () => {
    const before = instrumentCount();
    for (const who of [api.supervisor, api.inspector, api.operator])
      expectApiError(await who.post('/api/instruments', micrometer), 403, 'forbidden');
    const anyId = server.db.select({ id: instruments.id }).from(instruments).get()!.id;
    expectApiError(await api.supervisor.patch(`/api/instruments/${anyId}`, { name: 'X' }), 403, 'forbidden');
    expectApiError(await api.inspector.delete(`/api/instruments/${anyId}`), 403, 'forbidden');
    expectApiError(await api.operator.get('/api/instruments'), 403, 'forbidden');
    expectApiError(await api.anonymous.get('/api/instruments'), 401, 'unauthorized');
    expect((await api.supervisor.get(`/api/instruments/${anyId}`)).status).toBe(200);
    expect(instrumentCount()).toBe(before);
  });

  test('bad input is a 400 naming each field, and changes nothing', async () => {
    const before = instrumentCount();
    const missing = expectApiError(await api.admin.post('/api/instruments', {}), 400, 'validation_failed');
    expect(missing.issues?.map((i) => i.path).sort()).toEqual(
      ['calibrationDueOn', 'kinds', 'method', 'name', 'serial'].sort(),
    );
    const wrong = expectApiError(
      await api.admin.post('/api/instruments', {
        ...micrometer,
        method: 'tap_timer',
        kinds: [],
        calibrationDueOn: '2025-01-01',
      }),
      400,
      'validation_failed',
    );
    expect(wrong.issues?.map((i) => i.path)).toEqual(expect.arrayContaining(['method', 'kinds']));
    const order = expectApiError(
      await api.admin.post('/api/instruments', { ...micrometer, calibrationDueOn: '2025-01-01' }),
      400,
      'validation_failed',
    );
    expect(order.issues).toEqual([
      { path: 'calibrationDueOn', message: 'Must not be before the calibration date' },
    ]);
    expectApiError(
      await api.admin.post('/api/instruments', { ...micrometer, calibrationDueOn: '1 June' }),
      400,
      'validation_failed',
    );
    // A patch that is fine alone but leaves the stored dates out of order.
    const id = (await api.admin.post('/api/instruments', micrometer)).body.instrument.id as string;
    const patched = expectApiError(
      await api.admin.patch(`/api/instruments/${id}`, { calibratedOn: '2026-07-01' }),
      400,
      'validation_failed',
    );
    expect(patched.issues?.[0].path).toBe('calibrationDueOn');
    expect((await api.admin.get(`/api/instruments/${id}`)).body.instrument.calibratedOn).toBe('2025-06-01');
    expect(instrumentCount()).toBe(before + 1);
    expect(auditOf(id)).toHaveLength(1);
  });
});

describe('/api/settings/declaration', () => {
  test('starts with the standard text; an admin sets the body’s own, audited; others cannot', async () => {
    const first = await api.inspector.get('/api/settings/declaration');
    expect(first.body.declaration).toEqual({
      text: DEFAULT_DECLARATION_TEXT,
      updatedAt: null,
      updatedByName: null,
    });
    expectApiError(await api.supervisor.put('/api/settings/declaration', { text: 'Mine' }), 403, 'forbidden');
    const empty = expectApiError(
      await api.admin.put('/api/settings/declaration', { text: '   ' }),
      400,
      'validation_failed',
    );
    expect(empty.issues?.[0].path).toBe('text');
    const text = 'I inspected this ride in person and the record states only what I found.';
    const set = await api.admin.put('/api/settings/declaration', { text });
    expect(set.status).toBe(200);
    expect(set.body.declaration).toMatchObject({ text, updatedByName: expect.any(String) });
    expect(auditOf('declaration').map((a) => a.summary)).toEqual(['Declaration text changed']);

    // The phone gets it, with the register, on every pull.
    const pull = pullResponseSchema.parse((await api.inspector.get('/api/sync/pull')).body);
    expect(pull.declaration?.text).toBe(text);
    expect(pull.instruments?.map((i) => i.serial)).toEqual(
      expect.arrayContaining(demoInstruments.map((d) => d.serial)),
    );
    const next = pullResponseSchema.parse(
      (await api.inspector.get(`/api/sync/pull?cursor=${pull.cursor}`)).body,
    );
    expect(next.instruments?.length).toBe(pull.instruments?.length);
    expect(next.declaration?.text).toBe(text);
  });
});

describe('the push keeps records truthful', () => {
  const push = (records: unknown[]) => api.inspector.push(records);

  async function instrument(patch: Partial<typeof micrometer> & { retired?: boolean } = {}) {
    const res = await api.admin.post('/api/instruments', {
      ...micrometer,
      serial: randomUUID().slice(0, 8),
      ...patch,
    });
    return instrumentSchema.parse(res.body.instrument);
  }
  const pin = (takenAt: string, instrument: Reading['instrument']): Reading => ({
    id: randomUUID(),
    kind: 'pin_diameter',
    joint: 0,
    label: 'Pin diameter',
    valueSI: 0.1399,
    unit: 'mm',
    method: 'micrometer',
    instrument,
    spreadSI: null,
    takenAt,
  });
  const snap = (i: { id: string; name: string; serial: string }, calibrationDueOn: string | null) => ({
    id: i.id,
    name: i.name,
    serial: i.serial,
    calibrationDueOn,
  });

  test('a record without a declaration is refused, naming the field', async () => {
    const { declaration: _omitted, ...record } = makeRecord(comet);
    const res = await push([record]);
    expect(res.body.results[0]).toEqual({
      id: record.id,
      status: 'rejected',
      issues: [{ path: 'declaration', message: expect.stringMatching(/declaration/) }],
    });
  });

  test('a reading taken after its instrument fell due is refused; on the due date itself it is accepted', async () => {
    const i = await instrument({ calibrationDueOn: '2026-05-04' });
    const onDueDate = makeRecord(comet, {
      readings: [pin('2026-05-04T23:30:00.000Z', snap(i, '2026-05-04'))],
    });
    const dayAfter = makeRecord(comet, {
      readings: [pin('2026-05-05T00:10:00.000Z', snap(i, '2026-05-04'))],
    });
    const res = await push([onDueDate, dayAfter]);
    expect(res.body.results[0].status).toBe('accepted');
    expect(res.body.results[1]).toMatchObject({
      status: 'rejected',
      issues: [{ path: 'readings.0.instrument', message: expect.stringContaining('2026-05-04') }],
    });
  });

  test('the register and the snapshot are both checked: neither a stale phone nor a later renewal hides a lapse', async () => {
    // The phone's copy still shows an old, later due date, but the register has it past due.
    const lapsed = await instrument({ calibratedOn: '2025-04-01', calibrationDueOn: '2026-04-30' });
    const stale = makeRecord(comet, {
      readings: [pin('2026-05-04T08:00:00.000Z', snap(lapsed, '2026-12-31'))],
    });
    // Renewed in the register since, but the reading was taken while it was past due (per the snapshot).
    const renewed = await instrument({ calibratedOn: '2026-06-01', calibrationDueOn: '2027-06-01' });
    const before = makeRecord(comet, {
      readings: [pin('2026-05-04T08:00:00.000Z', snap(renewed, '2026-04-30'))],
    });
    const res = await push([stale, before]);
    expect(res.body.results.map((r: { status: string }) => r.status)).toEqual(['rejected', 'rejected']);
  });

  test('a retired instrument is refused after its retirement; one unknown to the register is judged by its snapshot', async () => {
    const gone = await instrument({ calibrationDueOn: '2027-01-01', retired: true });
    const afterRetired = makeRecord(comet, {
      readings: [pin(new Date().toISOString(), snap(gone, '2027-01-01'))],
    });
    const unknown = makeRecord(comet, {
      readings: [
        pin('2026-05-04T08:00:00.000Z', {
          id: 'not-registered',
          name: 'Borrowed micrometer',
          serial: 'B-1',
          calibrationDueOn: '2026-09-01',
        }),
      ],
    });
    const none = makeRecord(comet, { readings: [pin('2026-05-04T08:00:00.000Z', null)] });
    const res = await push([afterRetired, unknown, none]);
    expect(res.body.results.map((r: { status: string }) => r.status)).toEqual([
      'rejected',
      'accepted',
      'accepted',
    ]);
    expect(res.body.results[0].issues[0].message).toMatch(/retired/);
  });
});

describe('demo register', () => {
  test('has one instrument due within the fortnight and one past due, relative to the seed day', () => {
    const today = new Date().toISOString().slice(0, 10);
    const rows = server.db.select().from(instruments).all();
    const demo = rows.filter((r) => demoInstruments.some((d) => d.serial === r.serial));
    expect(demo).toHaveLength(demoInstruments.length);
    expect(demo.filter((r) => r.calibrationDueOn! < today).map((r) => r.serial)).toEqual(['HR-FG-0107']);
    expect(
      demo
        .filter(
          (r) =>
            r.calibrationDueOn! >= today &&
            Date.parse(r.calibrationDueOn!) - Date.parse(today) <= 14 * 86_400_000,
        )
        .map((r) => r.serial),
    ).toEqual(['HR-DIA-0219']);
  });
});
