import { count, eq } from 'drizzle-orm';

import { auditLog, companies, rides, sites } from '@/db/server/schema';
import {
  companyListResponseSchema,
  companyResponseSchema,
  rideListPageSchema,
  rideResponseSchema,
  siteListResponseSchema,
  siteResponseSchema,
} from '@/features/registry/schema';
import { rideListResponseSchema } from '@/features/rides/schema';
import { demoOperators, demoRides, demoSites } from '@/server/seed/demo';
import { auditRowOrder } from '@/server/registry/audit-query';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';

let server: TestServer;
let api: Clients;
const fixedNow = new Date('2025-06-02T09:00:00.000Z');
beforeAll(async () => {
  server = await makeTestServer();
  // The clock only matters for status dates here; pin it through a second app on the same database.
  api = await demoClients(server.app);
});
afterAll(() => server.close());

const rowCounts = () => ({
  companies: server.db.select({ n: count() }).from(companies).get()?.n,
  sites: server.db.select({ n: count() }).from(sites).get()?.n,
  rides: server.db.select({ n: count() }).from(rides).get()?.n,
  audit: server.db.select({ n: count() }).from(auditLog).get()?.n,
});

async function companyId(name: string) {
  const res = await api.admin.get(`/api/companies?q=${encodeURIComponent(name)}`);
  return companyListResponseSchema.parse(res.body).companies[0].id;
}
async function rideByName(name: string) {
  const res = await api.admin.get(`/api/rides?q=${encodeURIComponent(name)}`);
  return rideListPageSchema.parse(res.body).rides[0];
}

describe('GET /api/rides: server-side search, filter, sort and pages', () => {
  test('without parameters: every ride, the old shape plus the page, by operator then name', async () => {
    const res = await api.admin.get('/api/rides');
    expect(res.status).toBe(200);
    // The app's existing list schema still reads it.
    expect(rideListResponseSchema.safeParse(res.body).success).toBe(true);
    const page = rideListPageSchema.parse(res.body);
    expect(page).toMatchObject({ total: demoRides.length, page: 1, pageSize: 50 });
    const expected = [...demoRides]
      .sort((a, b) => a.operator.localeCompare(b.operator) || a.name.localeCompare(b.name))
      .map((r) => r.name);
    expect(page.rides.map((r) => r.name)).toEqual(expected);
  });

  test('sort by name both ways, and by year', async () => {
    const names = [...demoRides.map((r) => r.name)].sort();
    const asc = rideListPageSchema.parse((await api.admin.get('/api/rides?sort=name')).body);
    expect(asc.rides.map((r) => r.name)).toEqual(names);
    const desc = rideListPageSchema.parse((await api.admin.get('/api/rides?sort=-name')).body);
    expect(desc.rides.map((r) => r.name)).toEqual([...names].reverse());
    const byYear = rideListPageSchema.parse((await api.admin.get('/api/rides?sort=-year')).body);
    const years = byYear.rides.map((r) => r.year ?? 0);
    expect(years).toEqual([...years].sort((a, b) => b - a));
  });

  test('pages do not overlap and add up to the total', async () => {
    const seen: string[] = [];
    for (let page = 1; page <= 3; page++) {
      const res = rideListPageSchema.parse(
        (await api.admin.get(`/api/rides?sort=name&pageSize=2&page=${page}`)).body,
      );
      expect(res.total).toBe(demoRides.length);
      expect(res.rides.length).toBeLessThanOrEqual(2);
      seen.push(...res.rides.map((r) => r.id));
    }
    expect(new Set(seen).size).toBe(demoRides.length);
    const beyond = rideListPageSchema.parse((await api.admin.get('/api/rides?pageSize=2&page=9')).body);
    expect(beyond.rides).toEqual([]);
  });

  test('filters: status, class (comma list or repeated), site, operator; and free text', async () => {
    const restricted = rideListPageSchema.parse((await api.admin.get('/api/rides?status=restricted')).body);
    expect(restricted.rides.map((r) => r.name)).toEqual(['Tidebreaker']);
    const twoClasses = rideListPageSchema.parse(
      (await api.admin.get('/api/rides?rideClass=wheel,swing_carousel&sort=name')).body,
    );
    expect(twoClasses.rides.map((r) => r.name)).toEqual(['Lantern Wheel', 'Whirligig Chairs']);
    const repeated = rideListPageSchema.parse(
      (await api.admin.get('/api/rides?rideClass=wheel&rideClass=swing_carousel')).body,
    );
    expect(repeated.total).toBe(2);
    const pier = rideListPageSchema.parse(
      (await api.admin.get(`/api/rides?operatorId=${await companyId('Tamsworth')}`)).body,
    );
    expect(pier.rides.map((r) => r.name).sort()).toEqual(
      demoRides
        .filter((r) => r.operator === 'Tamsworth Pier Leisure')
        .map((r) => r.name)
        .sort(),
    );
    const siteId = pier.rides[0].siteId;
    const atSite = rideListPageSchema.parse((await api.admin.get(`/api/rides?siteId=${siteId}`)).body);
    expect(atSite.rides.every((r) => r.siteId === siteId)).toBe(true);
    // Search covers maker, serial and names, case-insensitively; % is taken literally.
    const orrin = rideListPageSchema.parse((await api.admin.get('/api/rides?q=orrin%20ride')).body);
    expect(orrin.rides.map((r) => r.name).sort()).toEqual(['Little Kite', 'Skylark', 'Tidebreaker']);
    const serial = rideListPageSchema.parse((await api.admin.get('/api/rides?q=MFW-LW18')).body);
    expect(serial.rides.map((r) => r.name)).toEqual(['Lantern Wheel']);
    const percent = rideListPageSchema.parse((await api.admin.get('/api/rides?q=%25')).body);
    expect(percent.total).toBe(0);
  });

  test('an operator’s filters never reach past its own company', async () => {
    const corvane = await companyId('Corvane');
    const res = rideListPageSchema.parse((await api.operator.get(`/api/rides?operatorId=${corvane}`)).body);
    expect(res).toMatchObject({ total: 0, rides: [] });
    const search = rideListPageSchema.parse((await api.operator.get('/api/rides?q=Tidebreaker')).body);
    expect(search.total).toBe(0);
  });

  test('bad parameters → 400 naming each one', async () => {
    const error = expectApiError(
      await api.admin.get('/api/rides?status=broken&sort=colour&page=0&pageSize=500'),
      400,
      'validation_failed',
    );
    expect(error.issues?.map((i) => i.path).sort()).toEqual([
      'query.page',
      'query.pageSize',
      'query.sort',
      'query.status.0',
    ]);
  });
});

describe('operator companies', () => {
  test('the list holds the operators (not the inspection body), with contacts and counts', async () => {
    const res = await api.inspector.get('/api/companies');
    expect(res.status).toBe(200);
    const list = companyListResponseSchema.parse(res.body);
    expect(list.companies.map((c) => c.name)).toEqual(demoOperators.map((o) => o.name).sort());
    const pier = list.companies.find((c) => c.name === 'Tamsworth Pier Leisure');
    expect(pier).toMatchObject({
      kind: 'operator',
      noticeEmails: ['notices@tamsworth-pier.test'],
      siteCount: 1,
      rideCount: 3,
    });
    expect(pier?.contacts[0]).toEqual({
      name: 'Priya Castellan',
      role: 'Rides manager',
      email: 'operator@pivotwatch.test',
      phone: '+44 20 7946 0212',
    });
  });

  test('create, read, change and delete, each with an audit entry holding before and after', async () => {
    const created = await api.admin.post('/api/companies', {
      name: '  Harrow Lane Amusements ',
      noticeEmails: ['Safety@Harrow-Lane.test'],
      phone: '',
      contacts: [{ name: 'Ada Penhallow', email: '' }],
    });
    expect(created.status).toBe(201);
    const company = companyResponseSchema.parse(created.body).company;
    expect(company).toMatchObject({
      name: 'Harrow Lane Amusements',
      kind: 'operator',
      noticeEmails: ['safety@harrow-lane.test'],
      phone: null,
      address: null,
      contacts: [{ name: 'Ada Penhallow', role: null, email: null, phone: null }],
      siteCount: 0,
      rideCount: 0,
    });
    const read = await api.supervisor.get(`/api/companies/${company.id}`);
    expect(companyResponseSchema.parse(read.body).company).toEqual(company);

    const changed = await api.admin.patch(`/api/companies/${company.id}`, { phone: '+44 20 7946 0999' });
    expect(changed.status).toBe(200);
    expect(companyResponseSchema.parse(changed.body).company).toMatchObject({
      name: 'Harrow Lane Amusements',
      phone: '+44 20 7946 0999',
      noticeEmails: ['safety@harrow-lane.test'],
    });

    expect((await api.admin.delete(`/api/companies/${company.id}`)).status).toBe(204);
    expectApiError(await api.admin.get(`/api/companies/${company.id}`), 404, 'not_found');

    const entries = server.db
      .select()
      .from(auditLog)
      .where(eq(auditLog.entityId, company.id))
      .orderBy(auditRowOrder)
      .all();
    expect(entries.map((e) => e.action)).toEqual(['create', 'update', 'delete']);
    expect(entries[0]).toMatchObject({ entity: 'company', before: null, after: company });
    expect(entries[1].before).toMatchObject({ phone: null });
    expect(entries[1].after).toMatchObject({ phone: '+44 20 7946 0999' });
    expect(entries[2]).toMatchObject({ after: null });
    expect(entries.every((e) => e.userId !== null)).toBe(true);
  });

  test('bad input → 400 naming the fields, and nothing is stored', async () => {
    const before = rowCounts();
    const error = expectApiError(
      await api.admin.post('/api/companies', {
        name: ' ',
        noticeEmails: ['not-an-address'],
        contacts: [{ role: 'x' }],
      }),
      400,
      'validation_failed',
    );
    expect(error.issues?.map((i) => i.path).sort()).toEqual(['contacts.0.name', 'name', 'noticeEmails.0']);
    expect(rowCounts()).toEqual(before);
  });

  test('a company with rides, sites or users cannot be deleted (409, nothing removed)', async () => {
    const before = rowCounts();
    const error = expectApiError(
      await api.admin.delete(`/api/companies/${await companyId('Tamsworth')}`),
      409,
      'in_use',
    );
    expect(error.message).toMatch(/3 ride\(s\).*1 site\(s\).*1 user account\(s\)/);
    expect(rowCounts()).toEqual(before);
  });
});

describe('sites', () => {
  test('list with search and operator filter', async () => {
    const all = siteListResponseSchema.parse((await api.inspector.get('/api/sites')).body);
    expect(all.sites.map((s) => s.name).sort()).toEqual(demoSites.map((s) => s.name).sort());
    const lowfield = siteListResponseSchema.parse((await api.admin.get('/api/sites?q=lowfield')).body);
    expect(lowfield.sites).toHaveLength(1);
    expect(lowfield.sites[0]).toMatchObject({
      kind: 'travelling_setup',
      operatorName: 'Corvane Travelling Shows',
      rideCount: 3,
    });
  });

  test('create checks the operator company; a site with rides cannot be deleted', async () => {
    const bad = expectApiError(
      await api.admin.post('/api/sites', { name: 'Quayside', kind: 'park', operatorCompanyId: 'nope' }),
      400,
      'validation_failed',
    );
    expect(bad.issues).toEqual([{ path: 'operatorCompanyId', message: 'No operator company with this id' }]);

    const created = await api.admin.post('/api/sites', {
      name: 'Brackley Meadow',
      kind: 'fairground',
      locality: 'Brackley',
      operatorCompanyId: await companyId('Corvane'),
    });
    expect(created.status).toBe(201);
    const site = siteResponseSchema.parse(created.body).site;
    expect(site).toMatchObject({
      name: 'Brackley Meadow',
      operatorName: 'Corvane Travelling Shows',
      rideCount: 0,
    });
    expect(
      (await api.admin.patch(`/api/sites/${site.id}`, { kind: 'travelling_setup' })).body.site.kind,
    ).toBe('travelling_setup');
    expect((await api.admin.delete(`/api/sites/${site.id}`)).status).toBe(204);

    const busy = siteListResponseSchema.parse((await api.admin.get('/api/sites?q=Tamsworth')).body).sites[0];
    expectApiError(await api.admin.delete(`/api/sites/${busy.id}`), 409, 'in_use');
  });
});

describe('rides', () => {
  test('create with every field; the list shape comes back', async () => {
    const site = siteListResponseSchema.parse((await api.admin.get('/api/sites?q=Tamsworth')).body).sites[0];
    const res = await api.admin.post('/api/rides', {
      name: 'Moth Spinner',
      rideClass: 'rotating_arm',
      description: 'Short arm with one gondola',
      maker: 'Brede Motion Engineering',
      model: 'TA-1',
      serial: 'BME-TA1-0201',
      year: 2021,
      siteId: site.id,
      operatorCompanyId: site.operatorCompanyId,
      status: 'out_of_service',
      statusReason: 'Awaiting its first set-up inspection.',
    });
    expect(res.status).toBe(201);
    const ride = rideResponseSchema.parse(res.body).ride;
    expect(ride).toMatchObject({
      name: 'Moth Spinner',
      siteName: 'Tamsworth Pier',
      operatorName: 'Tamsworth Pier Leisure',
      status: 'out_of_service',
      statusReason: 'Awaiting its first set-up inspection.',
    });
    // Its operator sees it, the other operator does not.
    expect((await api.operator.get(`/api/rides/${ride.id}`)).status).toBe(200);
    expectApiError(await api.operator2.get(`/api/rides/${ride.id}`), 404, 'not_found');

    // Back in service: not by the register's PATCH (status rules: an approved follow-up or an override)…
    expectApiError(
      await api.supervisor.patch(`/api/rides/${ride.id}`, { status: 'in_service' }),
      409,
      'override_required',
    );
    // …but by a supervisor's override with a reason; the reason is cleared and a new "since" starts.
    expect(
      (
        await api.supervisor.post(`/api/rides/${ride.id}/status`, {
          status: 'in_service',
          reason: 'Set-up inspection done on paper before the register existed.',
        })
      ).status,
    ).toBe(200);
    const back = rideResponseSchema.parse((await api.supervisor.get(`/api/rides/${ride.id}`)).body).ride;
    expect(back).toMatchObject({ status: 'in_service', statusReason: null });
    expect(Date.parse(back.statusSince ?? '')).toBeGreaterThanOrEqual(Date.parse(ride.statusSince ?? ''));

    // A rename keeps the status date.
    const renamed = rideResponseSchema.parse(
      (await api.supervisor.patch(`/api/rides/${ride.id}`, { name: 'Moth Spinner II' })).body,
    ).ride;
    expect(renamed.statusSince).toBe(back.statusSince);

    // Going back into service issued the operator a notice, and issued notices are kept: no deleting.
    const refused = expectApiError(await api.admin.delete(`/api/rides/${ride.id}`), 409, 'in_use');
    expect(refused.message).toMatch(/1 notice\(s\) issued to its operator/);
    const actions = server.db
      .select({ entity: auditLog.entity, action: auditLog.action })
      .from(auditLog)
      .where(eq(auditLog.rideId, ride.id))
      .all()
      .map((e) => `${e.entity} ${e.action}`);
    expect(actions).toEqual(['ride create', 'ride update', 'notice create', 'ride update']);
  });

  test('restricting a ride needs a reason; a given date is kept', async () => {
    const skylark = await rideByName('Skylark');
    const before = rowCounts();
    const error = expectApiError(
      await api.supervisor.patch(`/api/rides/${skylark.id}`, { status: 'restricted' }),
      400,
      'validation_failed',
    );
    expect(error.issues).toEqual([
      { path: 'statusReason', message: 'Say why the ride is restricted or out of service' },
    ]);
    expect(rowCounts()).toEqual(before);
    expect(await rideByName('Skylark')).toEqual(skylark);

    const res = await api.supervisor.patch(`/api/rides/${skylark.id}`, {
      status: 'restricted',
      statusReason: 'Seat 14 restraint lock sticks; seat closed off.',
      statusSince: '2025-06-01',
    });
    expect(rideResponseSchema.parse(res.body).ride).toMatchObject({
      status: 'restricted',
      statusSince: '2025-06-01T00:00:00.000Z',
    });
    await api.supervisor.post(`/api/rides/${skylark.id}/status`, {
      status: 'in_service',
      reason: 'Restraint lock replaced and tested.',
    });
  });

  test('bad fields → 400 naming each, nothing stored', async () => {
    const before = rowCounts();
    const error = expectApiError(
      await api.admin.post('/api/rides', {
        name: '',
        rideClass: 'coaster',
        year: 1700,
        operatorCompanyId: await companyId('Corvane'),
        statusSince: 'yesterday',
      }),
      400,
      'validation_failed',
    );
    expect(error.issues?.map((i) => i.path).sort()).toEqual(['name', 'rideClass', 'statusSince', 'year']);
    const unknownSite = expectApiError(
      await api.admin.post('/api/rides', {
        name: 'Nowhere',
        rideClass: 'other',
        siteId: 'nope',
        operatorCompanyId: await companyId('Corvane'),
      }),
      400,
      'validation_failed',
    );
    expect(unknownSite.issues?.[0].path).toBe('siteId');
    expect(rowCounts()).toEqual(before);
  });

  test('a ride with design data cannot be deleted (409)', async () => {
    const skylark = await rideByName('Skylark');
    const error = expectApiError(await api.admin.delete(`/api/rides/${skylark.id}`), 409, 'in_use');
    expect(error.message).toMatch(/design data/);
  });

  test('unknown ids → 404 on change and delete', async () => {
    expectApiError(await api.admin.patch('/api/rides/nope', { name: 'X' }), 404, 'not_found');
    expectApiError(await api.admin.delete('/api/rides/nope'), 404, 'not_found');
    expectApiError(await api.admin.patch('/api/sites/nope', { name: 'X' }), 404, 'not_found');
    expectApiError(await api.admin.delete('/api/companies/nope'), 404, 'not_found');
  });
});

test('the pinned test clock is used for new status dates', async () => {
  const { createApp } = await import('@/server/app');
  const { createLogger } = await import('@/server/logger');
  const pinned = createApp({
    db: server.db,
    config: server.config,
    logger: createLogger(server.config),
    now: () => fixedNow,
  });
  const clients = await demoClients(pinned);
  const kite = await rideByName('Little Kite');
  const res = await clients.supervisor.patch(`/api/rides/${kite.id}`, {
    status: 'out_of_service',
    statusReason: 'Winter lay-up.',
  });
  expect(rideResponseSchema.parse(res.body).ride.statusSince).toBe(fixedNow.toISOString());
  await clients.supervisor.post(`/api/rides/${kite.id}/status`, {
    status: 'in_service',
    reason: 'Lay-up over; opening checks done.',
  });
});
