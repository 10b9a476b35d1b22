/**
 * Travelling rides' set-ups and shared sites (issue #19): making a set-up books the set-up inspection and
 * stops the ride at the new site under the status rules; the approval of that inspection clears it; a
 * shared ground hosts rides of two operators and each operator sees only their own; bad input changes
 * nothing; a ride's set-ups never overlap. The rules checked are the product's own (README, "Travelling
 * rides"): a ride built up at a new site runs there only after its set-up inspection is approved, as
 * common practice for travelling rides has it (an assembly check before each opening at a new ground).
 */
import { and, count, eq } from 'drizzle-orm';

import { notices } from '@/db/server/notices';
import { rideStatusChanges } from '@/db/server/review';
import { auditLog, companies, inspectionSchedules, rides } from '@/db/server/schema';
import { setups } from '@/db/server/setups';
import { setupListResponseSchema, setupResponseSchema, type Setup } from '@/features/registry/schema';
import { setupsOfRide } from '@/server/setups/setups';

import { expectApiError, userIdOf, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { pushAccepted } from './review-desk-fixtures';
import { demoRide, makeRecord } from './sync-fixtures';

// A Monday; the shared ground below keeps London's clock, so its today is this day.
const now = new Date('2026-05-04T12:00:00.000Z');
jest.setTimeout(60_000);

let server: TestServer;
let api: Clients;
let groundId: string;
let eventId: string;
beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
  const corvane = server.db
    .select({ id: companies.id })
    .from(companies)
    .where(eq(companies.name, 'Corvane Travelling Shows'))
    .get();
  const site = await api.admin.post('/api/sites', {
    name: 'Brackenfold showground',
    kind: 'fairground',
    locality: 'Brackenfold',
    timeZone: 'Europe/London',
    operatorCompanyId: corvane?.id,
  });
  expect(site.status).toBe(201);
  groundId = site.body.site.id;
  const event = await api.supervisor.post('/api/site-events', {
    siteId: groundId,
    name: 'Brackenfold May fair',
    fromDate: '2026-05-01',
    toDate: '2026-05-31',
  });
  expect(event.status).toBe(201);
  eventId = event.body.event.id;
});
afterAll(() => server.close());

const rideRow = (id: string) => server.db.select().from(rides).where(eq(rides.id, id)).get();
const setupSchedule = (rideId: string) =>
  server.db
    .select()
    .from(inspectionSchedules)
    .where(
      and(
        eq(inspectionSchedules.rideId, rideId),
        eq(inspectionSchedules.inspectionType, 'setup_after_assembly'),
      ),
    )
    .get();
const rowCounts = () => ({
  setups: server.db.select({ n: count() }).from(setups).get()?.n,
  audit: server.db.select({ n: count() }).from(auditLog).get()?.n,
  schedules: server.db.select({ n: count() }).from(inspectionSchedules).get()?.n,
});

async function plan(body: object, client = api.supervisor): Promise<Setup> {
  const res = await client.post('/api/setups', body);
  expect(res.status).toBe(201);
  return setupResponseSchema.parse(res.body).setup;
}

describe('a set-up at a shared ground', () => {
  let kite: ReturnType<typeof demoRide>;
  let skylark: ReturnType<typeof demoRide>;
  let setup: Setup;

  test('making one books the set-up inspection, moves the ride there and stops it from running', async () => {
    kite = demoRide(server.db, 'Little Kite');
    expect(rideRow(kite.id)?.status).toBe('in_service');
    const noticesBefore = server.db.select({ n: count() }).from(notices).get()?.n ?? 0;
    setup = await plan({
      rideId: kite.id,
      siteId: groundId,
      eventId,
      fromDate: '2026-05-04',
      toDate: '2026-05-17',
      pitch: 'Pitch 9, by the east gate',
      assignedTo: userIdOf(server.db, 'inspector@pivotwatch.test'),
    });
    expect(setup).toMatchObject({
      siteName: 'Brackenfold showground',
      eventName: 'Brackenfold May fair',
      state: 'set_up',
      operatorName: 'Corvane Travelling Shows',
    });
    expect(setup.changes.map((c) => [c.fromState, c.toState, c.byName])).toEqual([
      [null, 'planned', 'Mira Delacourt'],
      ['planned', 'set_up', 'Mira Delacourt'],
    ]);
    const ride = rideRow(kite.id);
    expect(ride).toMatchObject({ status: 'out_of_service', siteId: groundId });
    expect(ride?.statusReason).toBe(
      'Set up at Brackenfold showground: it may not run there until its set-up inspection is approved.',
    );
    expect(setupSchedule(kite.id)).toMatchObject({
      dueOn: '2026-05-04',
      assignedTo: userIdOf(server.db, 'inspector@pivotwatch.test'),
    });
    const change = server.db
      .select()
      .from(rideStatusChanges)
      .where(eq(rideStatusChanges.rideId, kite.id))
      .all()
      .at(-1);
    expect(change).toMatchObject({
      event: 'setup_started',
      fromStatus: 'in_service',
      toStatus: 'out_of_service',
    });
    // Every change of status reaches the operator as a notice.
    expect(server.db.select({ n: count() }).from(notices).get()?.n).toBe(noticesBefore + 1);
    // The ride's own page shows where it is now.
    const page = await api.operator2.get(`/api/rides/${kite.id}`);
    expect(page.body.ride).toMatchObject({ siteName: 'Brackenfold showground', status: 'out_of_service' });
  });

  test('another operator’s ride at the same ground: each operator sees only their own', async () => {
    skylark = demoRide(server.db, 'Skylark');
    await plan({
      rideId: skylark.id,
      siteId: groundId,
      eventId,
      fromDate: '2026-05-11',
      toDate: '2026-05-24',
    });
    // Planned for next week: the ride keeps running where it is.
    expect(rideRow(skylark.id)?.status).toBe('in_service');
    expect(setupSchedule(skylark.id)?.dueOn).toBe('2026-05-11');

    const names = async (client: Clients['operator']) => {
      const res = await client.get(`/api/setups?siteId=${groundId}`);
      expect(res.status).toBe(200);
      return setupListResponseSchema.parse(res.body).setups.map((s) => s.rideName);
    };
    expect(await names(api.supervisor)).toEqual(['Little Kite', 'Skylark']);
    expect(await names(api.operator)).toEqual(['Skylark']);
    expect(await names(api.operator2)).toEqual(['Little Kite']);
    expectApiError(await api.operator.get(`/api/rides/${kite.id}/setups`), 404, 'not_found');
    expect((await api.operator2.get(`/api/rides/${kite.id}/setups`)).body.setups).toHaveLength(1);
  });

  test('the approved set-up inspection clears the set-up and returns the ride to service', async () => {
    const record = makeRecord(kite, { type: 'setup_after_assembly' });
    await pushAccepted(server.db, api.inspector, [record]);
    const res = await api.supervisor.post(`/api/inspections/${record.id}/decision`, { decision: 'approve' });
    expect(res.status).toBe(200);
    expect(res.body.ride).toMatchObject({ status: 'in_service', changed: true });
    const [after] = setupsOfRide(server.db, kite.id);
    expect(after.state).toBe('cleared');
    expect(after.changes.at(-1)).toMatchObject({ fromState: 'set_up', toState: 'cleared' });
    // The booking is met: nothing more is due until the next set-up.
    expect(setupSchedule(kite.id)?.dueOn).toBeNull();
    // No follow-up was booked for a stop that only the set-up made.
    const followUp = server.db
      .select()
      .from(inspectionSchedules)
      .where(
        and(eq(inspectionSchedules.rideId, kite.id), eq(inspectionSchedules.inspectionType, 'follow_up')),
      )
      .get();
    expect(followUp?.dueOn ?? null).not.toBe('2026-05-04');
  });

  test('pulling down leaves the ride in store; its logbook lists every change with who made it', async () => {
    const res = await api.supervisor.post(`/api/setups/${setup.id}/state`, { state: 'pulled_down' });
    expect(res.status).toBe(200);
    expect(rideRow(kite.id)?.siteId).toBeNull();
    expect(setupsOfRide(server.db, kite.id)[0].changes.map((c) => c.toState)).toEqual([
      'planned',
      'set_up',
      'cleared',
      'pulled_down',
    ]);
    expectApiError(
      await api.supervisor.post(`/api/setups/${setup.id}/state`, { state: 'pulled_down' }),
      409,
      'setup_state',
    );
  });
});

describe('the demo', () => {
  test('its shared ground hosts rides of both operators, each operator seeing only their own', async () => {
    const ground = (await api.supervisor.get('/api/sites?q=Brackley')).body.sites[0].id;
    const at = async (client: Clients['operator']) =>
      setupListResponseSchema
        .parse((await client.get(`/api/setups?siteId=${ground}`)).body)
        .setups.map((s) => [s.rideName, s.operatorName, s.eventName]);
    expect(await at(api.supervisor)).toEqual([
      ['Twin Comet', 'Tamsworth Pier Leisure', 'Brackley Meadow spring fair'],
      ['Whirligig Chairs', 'Corvane Travelling Shows', 'Brackley Meadow spring fair'],
    ]);
    expect(await at(api.operator)).toEqual([
      ['Twin Comet', 'Tamsworth Pier Leisure', 'Brackley Meadow spring fair'],
    ]);
    expect(await at(api.operator2)).toEqual([
      ['Whirligig Chairs', 'Corvane Travelling Shows', 'Brackley Meadow spring fair'],
    ]);
    // The travelling ride's series: two fairgrounds, in order of build-up.
    const tidebreaker = setupsOfRide(server.db, demoRide(server.db, 'Tidebreaker').id);
    expect(tidebreaker.map((s) => [s.siteName, s.state])).toEqual([
      ['Marrowby Wharf winter fair', 'pulled_down'],
      ['Lowfield Common fairground', 'cleared'],
      ['Marrowby Wharf winter fair', 'planned'],
    ]);
  });
});

describe('a ride stopped for another cause', () => {
  test('stays stopped: its set-up inspection does not return it to service', async () => {
    const wheel = demoRide(server.db, 'Lantern Wheel');
    const stop = await api.supervisor.post(`/api/rides/${wheel.id}/status`, {
      status: 'out_of_service',
      reason: 'Cracked gondola hanger found by the operator',
    });
    expect(stop.status).toBe(200);
    await plan({ rideId: wheel.id, siteId: groundId, fromDate: '2026-05-04', toDate: '2026-05-10' });
    expect(rideRow(wheel.id)?.statusReason).toBe('Cracked gondola hanger found by the operator');
    const record = makeRecord(wheel, { type: 'setup_after_assembly' });
    await pushAccepted(server.db, api.inspector, [record]);
    const res = await api.supervisor.post(`/api/inspections/${record.id}/decision`, { decision: 'approve' });
    expect(res.status).toBe(200);
    expect(rideRow(wheel.id)?.status).toBe('out_of_service');
  });
});

describe('refusals change nothing', () => {
  test('bad dates, unknown site, event elsewhere, operators and overlaps', async () => {
    const tidebreaker = demoRide(server.db, 'Tidebreaker');
    const before = rowCounts();
    const bad = expectApiError(
      await api.supervisor.post('/api/setups', {
        rideId: tidebreaker.id,
        siteId: groundId,
        fromDate: '2026-05-20',
        toDate: '2026-05-12',
      }),
      400,
      'validation_failed',
    );
    expect(bad.issues).toEqual([{ path: 'toDate', message: 'The pull-down day is before the build-up day' }]);
    expectApiError(
      await api.supervisor.post('/api/setups', {
        rideId: tidebreaker.id,
        siteId: groundId,
        fromDate: '2026-02-30',
        toDate: '2026-03-02',
      }),
      400,
      'validation_failed',
    );
    expectApiError(
      await api.supervisor.post('/api/setups', {
        rideId: tidebreaker.id,
        siteId: 'no-such-site',
        fromDate: '2026-05-12',
        toDate: '2026-05-14',
      }),
      400,
      'validation_failed',
    );
    const outside = expectApiError(
      await api.supervisor.post('/api/setups', {
        rideId: tidebreaker.id,
        siteId: groundId,
        eventId,
        fromDate: '2026-05-30',
        toDate: '2026-06-03',
      }),
      400,
      'validation_failed',
    );
    expect(outside.issues?.[0]).toEqual({
      path: 'fromDate',
      message: 'The event runs from 2026-05-01 to 2026-05-31',
    });
    const body = { rideId: tidebreaker.id, siteId: groundId, fromDate: '2026-07-10', toDate: '2026-07-20' };
    expectApiError(await api.operator2.post('/api/setups', body), 403, 'forbidden');
    expectApiError(await api.inspector.post('/api/setups', body), 403, 'forbidden');
    expectApiError(
      await api.supervisor.post('/api/setups', {
        ...body,
        assignedTo: userIdOf(server.db, 'operator@pivotwatch.test'),
      }),
      400,
      'validation_failed',
    );
    expect(rowCounts()).toEqual(before);

    await plan(body);
    const after = rowCounts();
    const clash = expectApiError(
      await api.supervisor.post('/api/setups', { ...body, fromDate: '2026-07-18', toDate: '2026-07-25' }),
      409,
      'setup_overlaps',
    );
    expect(clash.message).toContain('2026-07-10 to 2026-07-20');
    expect(rowCounts()).toEqual(after);
    // The ground's and the ride's history stay: neither can be deleted while set-ups name them.
    expectApiError(await api.admin.delete(`/api/sites/${groundId}`), 409, 'in_use');
    expect(rowCounts()).toEqual(after);
  });
});
