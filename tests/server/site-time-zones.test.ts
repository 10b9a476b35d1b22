/**
 * Sites keep their own clock: "today", due and overdue, the review queue's overdue rows and the reminder
 * hour are taken in the site's IANA zone, with the server's clock pinned.
 *
 * The offsets below are published facts of the IANA tz database (tzdata, files `northamerica`,
 * `australasia`, `europe`): in December America/Los_Angeles keeps PST, UTC−8 (US daylight time ends on the
 * first Sunday in November); Pacific/Auckland keeps NZDT, UTC+13 (New Zealand daylight time runs from the
 * last Sunday in September to the first Sunday in April); Europe/London keeps GMT, UTC+0.
 */
import { queueResponseSchema } from '@/features/review/schema';
import {
  scheduleListResponseSchema,
  siteListResponseSchema,
  siteResponseSchema,
  rideListPageSchema,
} from '@/features/registry/schema';
import { reminderGroups, REMINDER_HOUR } from '@/server/notices/reminders';

import { expectApiError, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';

// 05:00 UTC on 4 Dec 2026 = 21:00 PST on 3 Dec in Los Angeles, 18:00 NZDT on 4 Dec in Auckland.
const now = new Date('2026-12-04T05:00:00Z');
let server: TestServer;
let api: Clients;

beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
});
afterAll(() => server.close());

async function sites() {
  return siteListResponseSchema.parse((await api.admin.get('/api/sites?pageSize=50')).body).sites;
}
const siteNamed = async (name: string) => (await sites()).find((s) => s.name === name)!;

describe('a zone per site', () => {
  test('the demo sites keep real IANA zones (invented places)', async () => {
    const zones = Object.fromEntries((await sites()).map((s) => [s.name, s.effectiveTimeZone]));
    expect(zones).toMatchObject({
      'Tamsworth Pier': 'Europe/London',
      'Lowfield Common fairground': 'America/Los_Angeles',
      'Marrowby Wharf winter fair': 'Pacific/Auckland',
    });
  });

  test('a zone Intl does not know, or a bare offset, is refused with a plain message and changes nothing', async () => {
    const site = await siteNamed('Tamsworth Pier');
    for (const zone of ['Mars/Olympus_Mons', '+02:00', 'Not a zone']) {
      const res = await api.admin.patch(`/api/sites/${site.id}`).send({ timeZone: zone });
      expectApiError(res, 400, 'validation_failed');
      expect(JSON.stringify(res.body.error.issues)).toContain('is not a time zone this system knows');
    }
    expect((await siteNamed('Tamsworth Pier')).timeZone).toBe('Europe/London');
  });

  test('a site without a zone takes the inspection body default; the default is validated and audited', async () => {
    const site = await siteNamed('Tamsworth Pier');
    const bad = await api.admin.put('/api/settings/time-zone').send({ zone: 'Atlantis/Capital' });
    expectApiError(bad, 400, 'validation_failed');
    const forbidden = await api.supervisor.put('/api/settings/time-zone').send({ zone: 'Asia/Tokyo' });
    expect(forbidden.status).toBe(403);
    const set = await api.admin.put('/api/settings/time-zone').send({ zone: 'Asia/Tokyo' });
    expect(set.status).toBe(200);
    expect(set.body.timeZone.zone).toBe('Asia/Tokyo');
    const cleared = await api.admin.patch(`/api/sites/${site.id}`).send({ timeZone: null });
    expect(siteResponseSchema.parse(cleared.body).site).toMatchObject({
      timeZone: null,
      effectiveTimeZone: 'Asia/Tokyo',
    });
    const audit = await api.admin.get('/api/audit?entity=setting');
    expect(JSON.stringify(audit.body)).toContain('Default time zone for sites set to Asia/Tokyo');
    // Back as it was, for the tests below.
    await api.admin.patch(`/api/sites/${site.id}`).send({ timeZone: 'Europe/London' });
  });
});

describe('due and overdue on the site clock', () => {
  test('a schedule due on 3 Dec is due today in Los Angeles (still 3 Dec) and overdue in London (4 Dec)', async () => {
    const rides = rideListPageSchema.parse((await api.admin.get('/api/rides?pageSize=100')).body).rides;
    const la = rides.find((r) => r.siteName === 'Lowfield Common fairground')!;
    const london = rides.find((r) => r.siteName === 'Tamsworth Pier')!;
    expect(la.siteTimeZone).toBe('America/Los_Angeles');
    for (const ride of [la, london]) {
      const made = await api.supervisor
        .post('/api/schedules')
        .send({ rideId: ride.id, inspectionType: 'follow_up', dueOn: '2026-12-03' });
      expect(made.status).toBe(201);
    }
    const list = scheduleListResponseSchema.parse(
      (await api.supervisor.get('/api/schedules?pageSize=200&inspectionType=follow_up')).body,
    ).schedules;
    const of = (rideId: string) => list.find((s) => s.rideId === rideId && s.dueOn === '2026-12-03')!;
    expect(of(la.id)).toMatchObject({ dueStatus: 'due', daysUntilDue: 0 });
    expect(of(london.id)).toMatchObject({ dueStatus: 'overdue', daysUntilDue: -1 });

    // The status filter in SQL agrees with the rows.
    const overdue = scheduleListResponseSchema.parse(
      (await api.supervisor.get('/api/schedules?pageSize=200&dueStatus=overdue&inspectionType=follow_up'))
        .body,
    ).schedules;
    expect(overdue.map((s) => s.rideId)).toContain(london.id);
    expect(overdue.map((s) => s.rideId)).not.toContain(la.id);

    // The review queue's overdue rows follow the same clocks.
    const queue = queueResponseSchema.parse(
      (await api.supervisor.get('/api/review/queue?pageSize=100')).body,
    );
    const rideRow = (id: string) => queue.items.find((i) => i.kind === 'ride' && i.rideId === id);
    expect(rideRow(london.id)?.overdueSince).toBe('2026-12-03');
    expect(rideRow(la.id)?.overdueSince ?? null).not.toBe('2026-12-03');
  });
});

describe('the reminder hour on each site clock', () => {
  // Zones with rides (Marrowby Wharf has none yet): each is open from 07:00 to midnight of its own day.
  const groups = (at: string) =>
    Object.fromEntries(reminderGroups(server.db, new Date(at)).map((g) => [g.zone, g.today]));

  test(`reminders go out from ${REMINDER_HOUR}:00 on each site's clock, dated by that clock`, () => {
    // 06:59 UTC: London 06:59 on 4 Dec (not yet); Los Angeles 22:59 PST on 3 Dec (its 3 Dec, long open).
    expect(groups('2026-12-04T06:59:00Z')).toEqual({ 'America/Los_Angeles': '2026-12-03' });
    // 07:00 UTC: London reaches 07:00 on 4 Dec.
    expect(groups('2026-12-04T07:00:00Z')).toEqual({
      'America/Los_Angeles': '2026-12-03',
      'Europe/London': '2026-12-04',
    });
    // 08:00 UTC = 00:00 PST on 4 Dec: a new day in Los Angeles, not yet at its reminder hour.
    expect(groups('2026-12-04T08:00:00Z')).toEqual({ 'Europe/London': '2026-12-04' });
    // 14:59 UTC = 06:59 PST; 15:00 UTC = 07:00 PST: Los Angeles's turn, on its 4 Dec.
    expect(groups('2026-12-04T14:59:00Z')['America/Los_Angeles']).toBeUndefined();
    expect(groups('2026-12-04T15:00:00Z')).toEqual({
      'America/Los_Angeles': '2026-12-04',
      'Europe/London': '2026-12-04',
    });
  });
});
