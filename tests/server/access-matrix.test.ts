import { count } from 'drizzle-orm';

import {
  auditLog,
  checklistTemplates,
  checklistTemplateVersions,
  companies,
  designVersions,
  inspectionSchedules,
  rides,
  sites,
} from '@/db/server/schema';
import { inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import {
  checklistTemplateListResponseSchema,
  companyListResponseSchema,
  rideListPageSchema,
  scheduleListResponseSchema,
  siteListResponseSchema,
} from '@/features/registry/schema';

import { makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';

/*
 * Route × role matrix of the register API and the review desk. Expected outcomes:
 *   ok      2xx — the role may do it (reads only, so the matrix changes nothing)
 *   bad     400 — the role passed the guard; the deliberately invalid body was refused
 *   gone    404 — the role passed the guard; the record does not exist (deletes aimed at a missing id),
 *                 or, for an operator, the ride belongs to another company
 *   403/401 — refused by role / not signed in
 * Rules: admin everything · supervisor edits rides, design data, templates and schedules · inspector reads
 * rides, design data and templates and its own assignments · operator reads its own company's rides only.
 * Review desk: supervisors and admins read the queue and decide (findings, decisions); inspectors read
 * their own inspections' findings, trail and cycle, and ride trends; operators see none of it.
 */

type Outcome = 'ok' | 'bad' | 'gone' | 403 | 401;
type Role = 'admin' | 'supervisor' | 'inspector' | 'operator' | 'anonymous';
type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';
type Ids = {
  own: string;
  other: string;
  company: string;
  site: string;
  template: string;
  schedule: string;
  /** An inspection of the demo inspector's, with one finding. */
  inspection: string;
  finding: string;
};
type Route = {
  method: Method;
  path: (ids: Ids) => string;
  body?: unknown;
  expect: Record<Exclude<Role, 'anonymous'>, Outcome>;
};

const READ_ALL = { admin: 'ok', supervisor: 'ok', inspector: 'ok', operator: 'ok' } as const;
const STAFF_READ = { admin: 'ok', supervisor: 'ok', inspector: 'ok', operator: 403 } as const;
const PLANNERS_READ = { admin: 'ok', supervisor: 'ok', inspector: 403, operator: 403 } as const;
const EDITORS = { admin: 'bad', supervisor: 'bad', inspector: 403, operator: 403 } as const;
const EDITORS_DELETE = { admin: 'gone', supervisor: 'gone', inspector: 403, operator: 403 } as const;
const ADMIN_ONLY = { admin: 'bad', supervisor: 403, inspector: 403, operator: 403 } as const;
const ADMIN_DELETE = { admin: 'gone', supervisor: 403, inspector: 403, operator: 403 } as const;
const ALL_GONE = { admin: 'gone', supervisor: 'gone', inspector: 'gone', operator: 'gone' } as const;
const VERIFIERS_GONE = { admin: 'gone', supervisor: 'gone', inspector: 'gone', operator: 403 } as const;
const ALL_BAD = { admin: 'bad', supervisor: 'bad', inspector: 'bad', operator: 'bad' } as const;
const ADMIN_GONE = { admin: 'gone', supervisor: 403, inspector: 403, operator: 403 } as const;

const routes: Route[] = [
  // Rides
  { method: 'get', path: () => '/api/rides', expect: READ_ALL },
  { method: 'get', path: (i) => `/api/rides/${i.own}`, expect: READ_ALL },
  { method: 'get', path: (i) => `/api/rides/${i.other}`, expect: { ...READ_ALL, operator: 'gone' } },
  { method: 'post', path: () => '/api/rides', body: {}, expect: ADMIN_ONLY },
  { method: 'patch', path: (i) => `/api/rides/${i.own}`, body: { name: '' }, expect: { ...EDITORS } },
  { method: 'delete', path: () => '/api/rides/missing', expect: ADMIN_DELETE },
  // Companies and sites
  { method: 'get', path: () => '/api/companies', expect: STAFF_READ },
  { method: 'get', path: (i) => `/api/companies/${i.company}`, expect: STAFF_READ },
  { method: 'post', path: () => '/api/companies', body: {}, expect: ADMIN_ONLY },
  { method: 'patch', path: (i) => `/api/companies/${i.company}`, body: { name: '' }, expect: ADMIN_ONLY },
  { method: 'delete', path: () => '/api/companies/missing', expect: ADMIN_DELETE },
  { method: 'get', path: () => '/api/sites', expect: STAFF_READ },
  { method: 'get', path: (i) => `/api/sites/${i.site}`, expect: STAFF_READ },
  { method: 'post', path: () => '/api/sites', body: {}, expect: ADMIN_ONLY },
  { method: 'patch', path: (i) => `/api/sites/${i.site}`, body: { kind: 'moon' }, expect: ADMIN_ONLY },
  { method: 'delete', path: () => '/api/sites/missing', expect: ADMIN_DELETE },
  // Instrument register and the declaration text
  { method: 'get', path: () => '/api/instruments', expect: STAFF_READ },
  {
    method: 'get',
    path: () => '/api/instruments/missing',
    expect: { ...ADMIN_GONE, supervisor: 'gone', inspector: 'gone' },
  },
  { method: 'post', path: () => '/api/instruments', body: {}, expect: ADMIN_ONLY },
  { method: 'patch', path: () => '/api/instruments/missing', body: { kinds: [] }, expect: ADMIN_ONLY },
  { method: 'delete', path: () => '/api/instruments/missing', expect: ADMIN_DELETE },
  { method: 'get', path: () => '/api/settings/declaration', expect: STAFF_READ },
  { method: 'put', path: () => '/api/settings/declaration', body: { text: '' }, expect: ADMIN_ONLY },
  // Design data
  { method: 'get', path: (i) => `/api/rides/${i.own}/design`, expect: STAFF_READ },
  { method: 'put', path: (i) => `/api/rides/${i.own}/design`, body: {}, expect: EDITORS },
  { method: 'get', path: (i) => `/api/rides/${i.own}/design/versions`, expect: STAFF_READ },
  { method: 'get', path: (i) => `/api/rides/${i.own}/design/versions/1`, expect: STAFF_READ },
  { method: 'post', path: (i) => `/api/rides/${i.own}/design/import`, body: {}, expect: EDITORS },
  { method: 'get', path: (i) => `/api/rides/${i.own}/design/export?format=csv`, expect: STAFF_READ },
  { method: 'get', path: (i) => `/api/rides/${i.own}/design/pending`, expect: PLANNERS_READ },
  {
    method: 'post',
    path: (i) => `/api/rides/${i.own}/design/versions/1/decision`,
    body: {},
    expect: EDITORS,
  },
  // Checklist templates
  { method: 'get', path: () => '/api/checklist-templates', expect: STAFF_READ },
  { method: 'get', path: (i) => `/api/checklist-templates/${i.template}`, expect: STAFF_READ },
  { method: 'get', path: (i) => `/api/checklist-templates/${i.template}/versions`, expect: STAFF_READ },
  { method: 'post', path: () => '/api/checklist-templates', body: {}, expect: EDITORS },
  { method: 'put', path: (i) => `/api/checklist-templates/${i.template}`, body: {}, expect: EDITORS },
  { method: 'delete', path: () => '/api/checklist-templates/missing', expect: EDITORS_DELETE },
  // Schedules and assignments
  { method: 'get', path: () => '/api/schedules', expect: PLANNERS_READ },
  { method: 'get', path: (i) => `/api/schedules/${i.schedule}`, expect: PLANNERS_READ },
  { method: 'get', path: (i) => `/api/rides/${i.own}/schedules`, expect: PLANNERS_READ },
  { method: 'post', path: () => '/api/schedules', body: {}, expect: EDITORS },
  {
    method: 'patch',
    path: (i) => `/api/schedules/${i.schedule}`,
    body: { intervalDays: 0 },
    expect: EDITORS,
  },
  { method: 'delete', path: () => '/api/schedules/missing', expect: EDITORS_DELETE },
  { method: 'get', path: () => '/api/inspectors', expect: PLANNERS_READ },
  { method: 'get', path: () => '/api/assignments/mine', expect: { ...STAFF_READ } },
  // Audit log
  { method: 'get', path: () => '/api/audit', expect: PLANNERS_READ },
  // Notices and the corrective-action loop (missing ids: the guard is what is tested)
  { method: 'get', path: () => '/api/notices', expect: READ_ALL },
  { method: 'get', path: () => '/api/notices/missing', expect: ALL_GONE },
  { method: 'get', path: () => '/api/notices/missing/pdf', expect: ALL_GONE },
  {
    method: 'post',
    path: () => '/api/notices/missing/acknowledge',
    expect: { admin: 403, supervisor: 403, inspector: 403, operator: 'gone' },
  },
  {
    method: 'post',
    path: () => '/api/notices/missing/resend',
    expect: { admin: 'gone', supervisor: 'gone', inspector: 403, operator: 403 },
  },
  {
    method: 'post',
    path: () => '/api/findings/missing/actions',
    body: {},
    expect: { admin: 403, supervisor: 403, inspector: 403, operator: 'bad' },
  },
  {
    method: 'post',
    path: () => '/api/findings/missing/close',
    body: { note: 'Checked', evidenceRef: 'WO-1' },
    expect: VERIFIERS_GONE,
  },
  {
    method: 'post',
    path: () => '/api/findings/missing/reopen',
    body: {},
    expect: { admin: 'bad', supervisor: 'bad', inspector: 'bad', operator: 403 },
  },
  { method: 'get', path: () => `/api/photos/${'0'.repeat(64)}`, expect: { ...VERIFIERS_GONE } },
  // The outbox: admin only; the matrix's server has no local mailbox, so the admin gets its 404.
  { method: 'get', path: () => '/api/admin/outbox', expect: ADMIN_GONE },
  { method: 'get', path: () => '/api/admin/outbox/missing', expect: ADMIN_GONE },
  { method: 'get', path: () => '/api/admin/outbox/missing/attachments/0', expect: ADMIN_GONE },
  // Review desk
  { method: 'get', path: () => '/api/review/queue', expect: PLANNERS_READ },
  // A ride's status on its own (status rules): supervisors and admins; the rules then refuse by role.
  { method: 'post', path: (i) => `/api/rides/${i.own}/status`, body: {}, expect: EDITORS },
  {
    method: 'post',
    path: () => '/api/rides/missing/status',
    body: { status: 'out_of_service', reason: 'Checked' },
    expect: EDITORS_DELETE,
  },
  { method: 'get', path: (i) => `/api/inspections/${i.inspection}/findings`, expect: STAFF_READ },
  { method: 'post', path: (i) => `/api/inspections/${i.inspection}/findings`, body: {}, expect: EDITORS },
  { method: 'patch', path: (i) => `/api/findings/${i.finding}`, body: {}, expect: EDITORS },
  { method: 'delete', path: () => '/api/findings/missing', expect: EDITORS_DELETE },
  { method: 'post', path: (i) => `/api/inspections/${i.inspection}/decision`, body: {}, expect: EDITORS },
  { method: 'get', path: (i) => `/api/inspections/${i.inspection}/trail`, expect: STAFF_READ },
  { method: 'get', path: (i) => `/api/inspections/${i.inspection}/cycle`, expect: STAFF_READ },
  { method: 'get', path: (i) => `/api/rides/${i.own}/trends`, expect: STAFF_READ },
  // Record chain: staff who decide, and the ride's own operator (a notice's QR opens it)
  {
    method: 'get',
    path: (i) => `/api/rides/${i.own}/chain/verify`,
    expect: { admin: 'ok', supervisor: 'ok', inspector: 403, operator: 'ok' },
  },
  {
    method: 'get',
    path: (i) => `/api/rides/${i.other}/chain/verify`,
    expect: { admin: 'ok', supervisor: 'ok', inspector: 403, operator: 'gone' },
  },
  // Phone keys: everyone signed in registers and lists their own; revoking a key no one has is a 404 for
  // all (a key of another person's is too, unless an administrator asks)
  { method: 'get', path: () => '/api/devices/keys', expect: READ_ALL },
  { method: 'post', path: () => '/api/devices/keys', body: { publicKey: 'x' }, expect: ALL_BAD },
  { method: 'post', path: () => '/api/devices/keys/missing/revoke', expect: ALL_GONE },
];

const statusOf: Record<Exclude<Outcome, 'ok'>, number> = { bad: 400, gone: 404, 403: 403, 401: 401 };

// Seeding, signing in five users and pushing an inspection can take seconds on a busy machine.
jest.setTimeout(30_000);

let server: TestServer;
let api: Clients;
let ids: Ids;
let before: Record<string, number | undefined>;

const tableCounts = () =>
  Object.fromEntries(
    Object.entries({
      auditLog,
      checklistTemplates,
      checklistTemplateVersions,
      companies,
      designVersions,
      findings,
      inspections,
      inspectionSchedules,
      rides,
      sites,
    }).map(([name, table]) => [name, server.db.select({ n: count() }).from(table).get()?.n]),
  );

beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  const list = rideListPageSchema.parse((await api.admin.get('/api/rides')).body).rides;
  const ride = (name: string) => list.find((r) => r.name === name)?.id ?? '';
  ids = {
    own: ride('Skylark'), // Tamsworth Pier Leisure: the demo operator's company
    other: ride('Tidebreaker'), // Corvane Travelling Shows
    company: companyListResponseSchema.parse((await api.admin.get('/api/companies')).body).companies[0].id,
    site: siteListResponseSchema.parse((await api.admin.get('/api/sites')).body).sites[0].id,
    template: checklistTemplateListResponseSchema.parse(
      (await api.admin.get('/api/checklist-templates')).body,
    ).templates[0].id,
    schedule: scheduleListResponseSchema.parse((await api.admin.get('/api/schedules')).body).schedules[0].id,
    inspection: '',
    finding: '',
  };
  const record = makeRecord(demoRide(server.db, 'Skylark'));
  await api.inspector.push([record]);
  ids.inspection = record.id;
  ids.finding = (
    await api.supervisor.post(`/api/inspections/${record.id}/findings`, {
      severity: 'note',
      description: 'Paint chipped at the gondola door.',
    })
  ).body.finding.id;
  before = tableCounts();
});
afterAll(() => server.close());

const cases = routes.flatMap((route) =>
  (['admin', 'supervisor', 'inspector', 'operator', 'anonymous'] as const).map((role) => {
    const outcome: Outcome = role === 'anonymous' ? 401 : route.expect[role];
    const label = route.path({
      own: ':own',
      other: ':other',
      company: ':id',
      site: ':id',
      template: ':id',
      schedule: ':id',
      inspection: ':id',
      finding: ':id',
    });
    return [`${route.method.toUpperCase()} ${label}`, role, outcome, route] as const;
  }),
);

test.each(cases)('%s as %s → %s', async (_label, role, outcome, route) => {
  const client = role === 'anonymous' ? api.anonymous : api[role];
  const path = route.path(ids);
  const res =
    route.method === 'get' || route.method === 'delete'
      ? await client[route.method](path)
      : await client[route.method](path, route.body);
  if (outcome === 'ok') {
    expect([200, 201, 204]).toContain(res.status);
  } else {
    expect(res.status).toBe(statusOf[outcome]);
    expect(res.body.error.code).toEqual(expect.any(String));
  }
});

test('the matrix changed nothing: every write was refused by role or by validation', () => {
  expect(tableCounts()).toEqual(before);
});

test('operators see their rides and statuses only: never design data', async () => {
  const detail = await api.operator.get(`/api/rides/${ids.own}`);
  expect(detail.body.design).toBeNull();
  expect(detail.body.ride).toMatchObject({ status: expect.any(String), statusSince: expect.any(String) });
  const list = rideListPageSchema.parse((await api.operator2.get('/api/rides')).body);
  expect(list.rides.map((r) => r.operatorName)).toEqual(list.rides.map(() => 'Corvane Travelling Shows'));
  expect((await api.operator2.get(`/api/rides/${ids.own}`)).status).toBe(404);
});
