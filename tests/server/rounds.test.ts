/**
 * The planner's week (issue #19): every inspection due in the week or overdue, grouped by day and site;
 * an inspection's day and inspector and a day's travel order are saved and audited; the inspector's phone
 * gets the plan in its sync pull; only planners use it. Weeks are ISO 8601 weeks (Monday first), checked
 * against date-fns' `startOfISOWeek`, a reference outside the project.
 */
import { addDays as dfAddDays } from 'date-fns/addDays';
import { format } from 'date-fns/format';
import { startOfISOWeek } from 'date-fns/startOfISOWeek';
import { and, count, eq } from 'drizzle-orm';

import { roundPlans, roundSiteOrder } from '@/db/server/setups';
import { auditLog, inspectionSchedules, sites } from '@/db/server/schema';
import { roundWeekSchema, weekStartOf, type RoundWeek } from '@/features/registry/schema';
import { pullResponseSchema } from '@/features/sync/pull-schema';

import { expectApiError, userIdOf, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { demoRide } from './sync-fixtures';

// A Tuesday: its week runs Monday 4 May to Sunday 10 May 2026. The demo is seeded on this day.
const now = new Date('2026-05-05T12:00:00.000Z');
jest.setTimeout(60_000);

let server: TestServer;
let api: Clients;
beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
});
afterAll(() => server.close());

const iso = (d: Date) => format(d, 'yyyy-MM-dd');

async function week(day?: string): Promise<RoundWeek> {
  const res = await api.supervisor.get(`/api/rounds${day ? `?week=${day}` : ''}`);
  expect(res.status).toBe(200);
  return roundWeekSchema.parse(res.body);
}
const itemsOf = (w: RoundWeek) => w.days.flatMap((d) => d.sites.flatMap((s) => s.items));
const siteId = (name: string) =>
  server.db.select({ id: sites.id }).from(sites).where(eq(sites.name, name)).get()!.id;
const scheduleOf = (ride: string, type: 'periodic' | 'follow_up') =>
  server.db
    .select()
    .from(inspectionSchedules)
    .where(
      and(
        eq(inspectionSchedules.rideId, demoRide(server.db, ride).id),
        eq(inspectionSchedules.inspectionType, type),
      ),
    )
    .get()!;
const planCount = () => server.db.select({ n: count() }).from(roundPlans).get()?.n;
const auditCount = () => server.db.select({ n: count() }).from(auditLog).get()?.n;

describe('the week', () => {
  test('is the ISO week of the day asked, Monday to Sunday', async () => {
    for (const day of ['2026-05-04', '2026-05-07', '2026-05-10', '2026-03-01', '2024-02-29', '2027-01-01']) {
      const monday = startOfISOWeek(new Date(`${day}T12:00:00`));
      expect(weekStartOf(day)).toBe(iso(monday));
      const w = await week(day);
      expect(w.days.map((d) => d.day)).toEqual(
        Array.from({ length: 7 }, (_, i) => iso(dfAddDays(monday, i))),
      );
    }
    expect((await week()).week).toBe('2026-05-04');
  });

  test('holds what is due that week on its day and what is overdue on the Monday, grouped by site', async () => {
    const w = await week('2026-05-06');
    const items = itemsOf(w);
    // The demo books Tidebreaker's follow-up 3 days before the seed day (Saturday 2 May): overdue, so
    // carried onto this week's Monday.
    const followUp = items.find((i) => i.rideName === 'Tidebreaker' && i.inspectionType === 'follow_up');
    expect(followUp).toMatchObject({ dueStatus: 'overdue', day: '2026-05-04', planned: false });
    for (const i of items) {
      expect(i.day >= '2026-05-04' && i.day <= '2026-05-10').toBe(true);
      if (!i.planned && i.dueStatus !== 'overdue') expect(i.day).toBe(i.nextDueOn);
    }
    for (const d of w.days)
      for (const s of d.sites)
        expect(s.items.every((i) => i.siteId === s.siteId && i.day === d.day)).toBe(true);
    // Skylark's periodic (last done 25 days before the seed day, every 30 days) falls due on Sunday 10 May.
    expect(items.find((i) => i.rideName === 'Skylark' && i.inspectionType === 'periodic')?.day).toBe(
      '2026-05-10',
    );
    // Twin Comet's (last done 10 days before, every 30 days) on 25 May: not this week, but that one.
    expect(items.some((i) => i.rideName === 'Twin Comet' && i.inspectionType === 'periodic')).toBe(false);
    const later = itemsOf(await week('2026-05-27'));
    expect(later.find((i) => i.rideName === 'Twin Comet' && i.inspectionType === 'periodic')?.day).toBe(
      '2026-05-25',
    );
  });
});

describe('planning', () => {
  test('an inspection’s day and inspector are saved and audited, and the phone pulls them', async () => {
    const schedule = scheduleOf('Tidebreaker', 'follow_up');
    const inspector2 = userIdOf(server.db, 'inspector2@pivotwatch.test');
    const audits = auditCount();
    const res = await api.supervisor.put(`/api/rounds/items/${schedule.id}`, {
      day: '2026-05-08',
      assignedTo: inspector2,
    });
    expect(res.status).toBe(204);
    const item = itemsOf(await week('2026-05-06')).find((i) => i.scheduleId === schedule.id);
    expect(item).toMatchObject({
      day: '2026-05-08',
      planned: true,
      assignedTo: { id: inspector2, name: 'Lena Marwick' },
    });
    // One entry for the round, one for the schedule's new inspector.
    expect(auditCount()).toBe((audits ?? 0) + 2);
    const entries = (await api.supervisor.get('/api/audit?entity=round')).body.entries;
    expect(entries[0]).toMatchObject({
      entityId: schedule.id,
      summary: 'Round: inspection planned for 2026-05-08',
    });

    await api.supervisor.put('/api/rounds/order', {
      day: '2026-05-08',
      siteIds: [siteId('Marrowby Wharf winter fair'), siteId('Lowfield Common fairground')],
    });
    const token = await api.as('inspector2@pivotwatch.test').get('/api/sync/pull');
    const pulled = pullResponseSchema.parse(token.body);
    const assignment = pulled.assignments?.find((a) => a.id === schedule.id);
    // Tidebreaker stands at Lowfield: second in that day's travel order.
    expect(assignment).toMatchObject({ plannedOn: '2026-05-08', roundPosition: 1 });
  });

  test('a day’s travel order is saved, audited and followed by the week', async () => {
    const lowfield = siteId('Lowfield Common fairground');
    const marrowby = siteId('Marrowby Wharf winter fair');
    const pier = siteId('Tamsworth Pier');
    // Put a pier inspection on the same day, so the day has two sites to order.
    const skylark = scheduleOf('Skylark', 'periodic');
    await api.supervisor.put(`/api/rounds/items/${skylark.id}`, {
      day: '2026-05-08',
      assignedTo: userIdOf(server.db, 'inspector@pivotwatch.test'),
    });
    const order = async () =>
      (await week('2026-05-08')).days.find((d) => d.day === '2026-05-08')!.sites.map((s) => s.siteName);
    expect(await order()).toEqual(['Lowfield Common fairground', 'Tamsworth Pier']);
    const res = await api.supervisor.put('/api/rounds/order', {
      day: '2026-05-08',
      siteIds: [pier, marrowby, lowfield],
    });
    expect(res.status).toBe(204);
    expect(await order()).toEqual(['Tamsworth Pier', 'Lowfield Common fairground']);
    const entries = (await api.supervisor.get('/api/audit?entity=round')).body.entries;
    expect(entries[0]).toMatchObject({
      entityId: '2026-05-08',
      before: { siteIds: [marrowby, lowfield] },
      after: { siteIds: [pier, marrowby, lowfield] },
    });
  });

  test('bad input is refused and changes nothing', async () => {
    const schedule = scheduleOf('Skylark', 'periodic');
    const plans = planCount();
    const audits = auditCount();
    const orderRows = server.db.select().from(roundSiteOrder).all();
    expectApiError(
      await api.supervisor.put(`/api/rounds/items/${schedule.id}`, { day: '2026-13-01', assignedTo: null }),
      400,
      'validation_failed',
    );
    // An operator is no inspector: the schedule's own check refuses it, and the day is not saved either.
    expectApiError(
      await api.supervisor.put(`/api/rounds/items/${schedule.id}`, {
        day: '2026-05-09',
        assignedTo: userIdOf(server.db, 'operator@pivotwatch.test'),
      }),
      400,
      'validation_failed',
    );
    expectApiError(
      await api.supervisor.put('/api/rounds/items/no-such-schedule', { day: '2026-05-09', assignedTo: null }),
      404,
      'not_found',
    );
    const twice = expectApiError(
      await api.supervisor.put('/api/rounds/order', {
        day: '2026-05-08',
        siteIds: [siteId('Tamsworth Pier'), siteId('Tamsworth Pier')],
      }),
      400,
      'validation_failed',
    );
    expect(twice.issues?.[0]).toEqual({ path: 'siteIds', message: 'A site is listed twice' });
    const unknown = expectApiError(
      await api.supervisor.put('/api/rounds/order', {
        day: '2026-05-08',
        siteIds: [siteId('Tamsworth Pier'), 'nowhere'],
      }),
      400,
      'validation_failed',
    );
    expect(unknown.issues?.[0]).toEqual({ path: 'siteIds.1', message: 'No such site' });
    expect(planCount()).toBe(plans);
    expect(auditCount()).toBe(audits);
    expect(server.db.select().from(roundSiteOrder).all()).toEqual(orderRows);
    expect(
      server.db.select().from(roundPlans).where(eq(roundPlans.scheduleId, schedule.id)).get()?.plannedOn,
    ).toBe('2026-05-08');
  });
});

describe('scope', () => {
  test('operators and inspectors cannot use the planner', async () => {
    const schedule = scheduleOf('Skylark', 'periodic');
    for (const client of [api.operator, api.operator2, api.inspector]) {
      expectApiError(await client.get('/api/rounds'), 403, 'forbidden');
      expectApiError(
        await client.put(`/api/rounds/items/${schedule.id}`, { day: '2026-05-09', assignedTo: null }),
        403,
        'forbidden',
      );
      expectApiError(
        await client.put('/api/rounds/order', { day: '2026-05-09', siteIds: [siteId('Tamsworth Pier')] }),
        403,
        'forbidden',
      );
    }
    expectApiError(await api.anonymous.get('/api/rounds'), 401, 'unauthorized');
  });
});
