/**
 * NDT records and due dates through the API: who may read and write, what is refused (400 naming the
 * field, 415 for a file that is not a PDF, 413 above 20 MB), due states against dates worked by hand
 * (Gregorian calendar, checked with Python's datetime.date), and the review queue's urgency. The PDF is a
 * real one written by pdfkit (whose files begin with the ISO 32000 header "%PDF-"). Fixtures are invented.
 */
import { and, eq } from 'drizzle-orm';
import request from 'supertest';

import { designVersions, users } from '@/db/server/schema';
import type { DesignData } from '@/features/loads/design-schema';
import { rideNdtSchema, ndtRecordCreatedSchema } from '@/features/pivot-life/ndt-schema';
import { queueResponseSchema } from '@/features/review/schema';
import { backfillRideLifeFlags } from '@/server/pivot-life/flags';
import { refreshQueue } from '@/server/queue/queue-refresh';
import { rideLifeFlags } from '@/db/server/ndt';
import { reviewQueue } from '@/db/server/review';

import { expectApiError, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { asBytes, pdfBytes, sha256Hex } from '@/tests/support/pdf-files';
import { rodDesign } from '@/tests/support/rod-design';

const today = '2026-12-03';
let server: TestServer;
let api: Clients;
let rideId = '';
let companyId = '';

function design(extra: { VT?: boolean } = {}): DesignData {
  const d = rodDesign(1306, 6, 'NDT test rod');
  d.pivots[0].ndt = [
    { method: 'MT', intervalDays: 365, note: 'Lug bores, both cheeks' },
    { method: 'UT', intervalDays: 730 },
    ...(extra.VT ? [{ method: 'VT' as const, intervalDays: 30 }] : []),
  ];
  return d;
}

/** Pins a design version's creation time, which decides when its NDT plans took effect. */
function pinVersion(version: number, at: string) {
  server.db
    .update(designVersions)
    .set({ createdAt: at })
    .where(and(eq(designVersions.rideId, rideId), eq(designVersions.version, version)))
    .run();
}

const sha = sha256Hex;

const record = (patch: Record<string, unknown> = {}) => ({
  joint: 0,
  testedOn: '2026-03-15',
  method: 'MT',
  technician: 'Ines Harrowgate',
  level: 2,
  result: 'no_indications',
  ...patch,
});

async function ndt(as: Clients['supervisor'] = api.supervisor) {
  const res = await as.get(`/api/rides/${rideId}/ndt`);
  expect(res.status).toBe(200);
  return rideNdtSchema.parse(res.body);
}

async function queueRow() {
  const res = await api.supervisor.get(`/api/review/queue?operatorId=${companyId}&pageSize=100`);
  expect(res.status).toBe(200);
  return queueResponseSchema.parse(res.body).items.find((i) => i.rideId === rideId);
}

/** Whatever a write refreshed, the queue must be what a full rebuild makes of the same data. */
function expectQueueAsRebuilt() {
  const rows = () => server.db.select().from(reviewQueue).orderBy(reviewQueue.key).all();
  const kept = rows();
  refreshQueue(server.db, today);
  expect(rows()).toEqual(kept);
}

beforeAll(async () => {
  server = await makePinnedServer(new Date(`${today}T09:00:00Z`));
  api = await demoClients(server.app);
  const operator = server.db
    .select({ companyId: users.companyId })
    .from(users)
    .where(eq(users.email, 'operator@pivotwatch.test'))
    .get();
  companyId = operator?.companyId ?? '';
  const ride = await api.admin.post('/api/rides', {
    operatorCompanyId: companyId,
    name: 'Lantern Test Swing',
    rideClass: 'other',
  });
  expect(ride.status).toBe(201);
  rideId = ride.body.ride.id;
  await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'NDT test', data: design() }).expect(201);
  pinVersion(1, '2025-01-10T08:00:00.000Z');
  // The first read rebuilds the queue for the pinned day, as the desk's first visit of a day does.
  await queueRow();
}, 60_000);
afterAll(() => server.close());

describe('due dates and the queue', () => {
  afterEach(expectQueueAsRebuilt);

  it('never tested: each plan is due from the day its design version came into force', async () => {
    const body = await ndt();
    expect(body.asOf).toBe(today);
    expect(body.pivots).toHaveLength(1);
    const [pivot] = body.pivots;
    expect(pivot.plans).toEqual([
      { method: 'MT', intervalDays: 365, note: 'Lug bores, both cheeks' },
      { method: 'UT', intervalDays: 730, note: null },
    ]);
    expect(pivot.due.map((d) => [d.method, d.dueOn, d.state])).toEqual([
      ['MT', '2025-01-10', 'never_tested'],
      ['UT', '2025-01-10', 'never_tested'],
    ]);
    expect(pivot.records).toEqual([]);
  });

  it('a record moves its method’s due date; an untested method keeps the ride overdue in the queue', async () => {
    const res = await api.inspector.post(`/api/rides/${rideId}/ndt-records`, record());
    expect(res.status).toBe(201);
    const created = ndtRecordCreatedSchema.parse(res.body);
    expect(created).toMatchObject({ notInPlan: false, message: null });
    expect(created.record).toMatchObject({ joint: 0, method: 'MT', level: 2, createdByName: 'Tomas Reyne' });

    const [pivot] = (await ndt()).pivots;
    // 2026-03-15 + 365 d = 2027-03-15; 103 days after today, beyond the 30-day window.
    expect(pivot.due[0]).toMatchObject({ lastOn: '2026-03-15', dueOn: '2027-03-15', state: 'upcoming' });
    expect(pivot.due[1]).toMatchObject({ dueOn: '2025-01-10', state: 'never_tested' });
    // The never-tested UT has been due since 2025-01-10: overdue, like a missed inspection.
    expect(await queueRow()).toMatchObject({
      kind: 'ride',
      urgency: 'overdue',
      overdueSince: null,
      ndtDueOn: '2025-01-10',
      at: '2025-01-10',
    });
  });

  it('an old UT test: due 2024-11-01 + 730 d = 2026-11-01, still overdue', async () => {
    await api.supervisor
      .post(`/api/rides/${rideId}/ndt-records`, record({ method: 'UT', testedOn: '2024-11-01' }))
      .expect(201);
    const [pivot] = (await ndt()).pivots;
    expect(pivot.due[1]).toMatchObject({ lastOn: '2024-11-01', dueOn: '2026-11-01', state: 'overdue' });
    expect(await queueRow()).toMatchObject({ urgency: 'overdue', ndtDueOn: '2026-11-01' });
  });

  it('a recent UT test clears the flag: the ride leaves the queue', async () => {
    await api.admin
      .post(
        `/api/rides/${rideId}/ndt-records`,
        record({ method: 'UT', testedOn: '2025-12-20', result: 'acceptable_indications', level: 3 }),
      )
      .expect(201);
    const [pivot] = (await ndt()).pivots;
    // 2025-12-20 + 730 d = 2027-12-20 (2026 and 2027 are common years).
    expect(pivot.due[1]).toMatchObject({
      lastOn: '2025-12-20',
      lastResult: 'acceptable_indications',
      dueOn: '2027-12-20',
      state: 'upcoming',
    });
    // Newest test first.
    expect(pivot.records.map((r) => r.testedOn)).toEqual(['2026-03-15', '2025-12-20', '2024-11-01']);
    expect(await queueRow()).toBeUndefined();
  });

  it('a plan added by a later version is due from that version; earlier plans keep their day', async () => {
    await api.admin
      .put(`/api/rides/${rideId}/design`, {
        reason: 'Monthly visual check added',
        data: design({ VT: true }),
      })
      .expect(201);
    pinVersion(2, '2026-11-20T10:00:00.000Z');
    // The flags follow design data at once; re-read them after pinning the version's day.
    await api.supervisor
      .post(`/api/rides/${rideId}/ndt-records`, record({ method: 'MT', testedOn: '2026-03-15' }))
      .expect(201);
    const [pivot] = (await ndt()).pivots;
    expect(pivot.due.map((d) => [d.method, d.dueOn, d.state])).toEqual([
      ['MT', '2027-03-15', 'upcoming'],
      ['UT', '2027-12-20', 'upcoming'],
      ['VT', '2026-11-20', 'never_tested'],
    ]);
    expect(await queueRow()).toMatchObject({ urgency: 'overdue', ndtDueOn: '2026-11-20' });
  });

  it('a method outside the plan is kept and said so', async () => {
    const res = await api.inspector.post(`/api/rides/${rideId}/ndt-records`, record({ method: 'ET' }));
    expect(res.status).toBe(201);
    expect(res.body.notInPlan).toBe(true);
    expect(res.body.message).toMatch(/ET is not in Main pivot’s NDT plan \(MT, UT, VT\)/);
  });
});

describe('data stored before the flags existed', () => {
  it('gets its flags once at start, and the queue follows', async () => {
    server.db.delete(rideLifeFlags).where(eq(rideLifeFlags.rideId, rideId)).run();
    refreshQueue(server.db, today, [rideId]);
    expect(await queueRow()).toBeUndefined();
    // This ride and the demo rides no write has touched yet.
    expect(backfillRideLifeFlags(server.db, today)).toBeGreaterThanOrEqual(1);
    // The VT plan added by version 2 (2026-11-20) is still never tested: overdue.
    expect(await queueRow()).toMatchObject({ urgency: 'overdue', ndtDueOn: '2026-11-20' });
    expect(backfillRideLifeFlags(server.db, today)).toBe(0);
    expectQueueAsRebuilt();
  });
});

describe('who may', () => {
  it('the ride’s operator reads; another operator gets 404; operators may not add', async () => {
    expect((await ndt(api.operator)).pivots[0].records.length).toBeGreaterThan(0);
    expectApiError(await api.operator2.get(`/api/rides/${rideId}/ndt`), 404, 'not_found');
    expectApiError(await api.operator.post(`/api/rides/${rideId}/ndt-records`, record()), 403, 'forbidden');
    expectApiError(await api.anonymous.get(`/api/rides/${rideId}/ndt`), 401, 'unauthorized');
  });
});

describe('bad input changes nothing', () => {
  const cases: [string, string, Record<string, unknown>][] = [
    ['no technician', 'technician', { technician: '' }],
    ['an unknown method', 'method', { method: 'RT' }],
    ['a level ISO 9712 does not have', 'level', { level: 4 }],
    ['an unknown result', 'result', { result: 'fine' }],
    ['a malformed date', 'testedOn', { testedOn: '15/03/2026' }],
    ['a date after today', 'testedOn', { testedOn: '2026-12-04' }],
    ['a pivot the design lacks', 'joint', { joint: 3 }],
    ['a report never uploaded', 'reportSha256', { reportSha256: 'a'.repeat(64) }],
  ];
  it.each(cases)('%s → 400 naming %s', async (_name, field, patch) => {
    const before = (await ndt()).pivots[0].records.length;
    const error = expectApiError(
      await api.inspector.post(`/api/rides/${rideId}/ndt-records`, record(patch)),
      400,
      'validation_failed',
    );
    expect(error.issues?.map((i) => i.path)).toContain(field);
    expect((await ndt()).pivots[0].records).toHaveLength(before);
  });
});

describe('report PDFs', () => {
  const put = (as: string | null, hash: string, body: Buffer, type = 'application/pdf') => {
    const token = as;
    const req = request(server.app).put(`/api/ndt-reports/${hash}`).set('Content-Type', type);
    return token ? req.set('Authorization', `Bearer ${token}`) : req;
  };
  let inspectorToken = '';
  beforeAll(async () => {
    const { signInAs } = await import('./helpers');
    inspectorToken = await signInAs(server.app, 'inspector@pivotwatch.test');
  });

  it('stores a PDF once, by its SHA-256, and attaches it to a record the operator may then read', async () => {
    const pdf = await pdfBytes('MT report 2026-11-30: no indications at the main pivot lugs.');
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const hash = sha(pdf);
    expect((await put(inspectorToken, hash, pdf).send(pdf)).status).toBe(201);
    expect((await put(inspectorToken, hash, pdf).send(pdf)).body).toEqual({ stored: false, sha256: hash });

    // Before it is on a record of their ride, the operator may not read it.
    expectApiError(await api.operator.get(`/api/ndt-reports/${hash}`), 403, 'forbidden');
    const res = await api.inspector.post(
      `/api/rides/${rideId}/ndt-records`,
      record({ testedOn: '2026-11-30', reportSha256: hash, note: 'Report attached' }),
    );
    expect(res.status).toBe(201);
    expect(res.body.record.reportSha256).toBe(hash);

    for (const as of [api.supervisor, api.operator]) {
      const got = await asBytes(as.get(`/api/ndt-reports/${hash}`));
      expect(got.status).toBe(200);
      expect(got.headers['content-type']).toBe('application/pdf');
      expect(sha(got.body as Buffer)).toBe(hash);
    }
    expectApiError(await api.operator2.get(`/api/ndt-reports/${hash}`), 403, 'forbidden');
    expectApiError(await api.supervisor.get(`/api/ndt-reports/${'b'.repeat(64)}`), 404, 'not_found');
  });

  it('refuses what is not a PDF, whatever the Content-Type says', async () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0]);
    expectApiError(await put(inspectorToken, sha(png), png).send(png), 415, 'not_a_pdf');
    const text = Buffer.from('not a report');
    expectApiError(
      await put(inspectorToken, sha(text), text, 'text/plain').send(text),
      415,
      'unsupported_media_type',
    );
    expectApiError(
      await put(inspectorToken, sha(Buffer.alloc(0)), Buffer.alloc(0)).send(Buffer.alloc(0)),
      415,
      'not_a_pdf',
    );
  });

  it('refuses bytes that do not hash to the address, and anything above 20 MB', async () => {
    const pdf = await pdfBytes('Another report');
    const error = expectApiError(
      await put(inspectorToken, 'c'.repeat(64), pdf).send(pdf),
      400,
      'hash_mismatch',
    );
    expect(error.issues?.[0].path).toBe('params.sha256');
    const big = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(20 * 1024 * 1024)]);
    const res = expectApiError(await put(inspectorToken, sha(big), big).send(big), 413, 'payload_too_large');
    expect(res.message).toMatch(/20\.0 MB/);
  });

  it('operators may not upload', async () => {
    const pdf = await pdfBytes('Operator upload');
    const operatorToken = await (await import('./helpers')).signInAs(server.app, 'operator@pivotwatch.test');
    expectApiError(await put(operatorToken, sha(pdf), pdf).send(pdf), 403, 'forbidden');
  });
});
