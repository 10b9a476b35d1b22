/**
 * Part replacements through the API: the ride's operator records one on their own ride (with a PDF
 * certificate they uploaded, which they may then read), another company's ride is not there for them
 * (404), lists are scoped, a date after today at the ride's site is refused, rows are only added (a
 * correction names the record it corrects), and bad input changes nothing. The clock is pinned; the site's
 * calendar day is worked from the IANA time zone database (Intl, as lib/dates does) and checked by hand:
 * 23:30 UTC on 3 December 2026 is already 4 December in Pacific/Auckland (UTC+13 in summer time).
 * Certificates are real PDFs written by pdfkit, read back against their SHA-256 (FIPS 180-4, Node's crypto).
 */
import { eq } from 'drizzle-orm';

import { partReplacementDocuments, partReplacements } from '@/db/server/parts';
import { users } from '@/db/server/schema';
import { partReplacementCreatedSchema, ridePartsSchema, type RideParts } from '@/features/parts/schema';
import { partReplacementLogRows } from '@/server/parts/logbook';

import { expectApiError, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { asBytes, pdfBytes, sha256Hex } from '@/tests/support/pdf-files';
import { rodDesign } from '@/tests/support/rod-design';

// Late evening in UTC: already the next day in Auckland, still the same day in London.
const now = new Date('2026-12-03T23:30:00Z');
let server: TestServer;
let api: Clients;
let rideId = '';
let otherRideId = '';

const companyOf = (email: string) =>
  server.db.select({ companyId: users.companyId }).from(users).where(eq(users.email, email)).get()
    ?.companyId ?? '';

async function makeRide(companyId: string, name: string, timeZone: string) {
  const site = await api.admin.post('/api/sites', {
    operatorCompanyId: companyId,
    name: `${name} ground`,
    kind: 'fairground',
    timeZone,
  });
  expect(site.status).toBe(201);
  const ride = await api.admin.post('/api/rides', {
    operatorCompanyId: companyId,
    siteId: site.body.site.id,
    name,
    rideClass: 'other',
  });
  expect(ride.status).toBe(201);
  const id: string = ride.body.ride.id;
  await api.admin
    .put(`/api/rides/${id}/design`, { reason: 'First data', data: rodDesign(900, 5, name) })
    .expect(201);
  return id;
}

async function upload(as: Clients['operator'], text: string) {
  const pdf = await pdfBytes(text);
  expect((await as.putBytes(`/api/documents/${sha256Hex(pdf)}`, pdf)).status).toBe(201);
  return sha256Hex(pdf);
}

async function parts(as: Clients['operator'] = api.operator, ride = rideId): Promise<RideParts> {
  const res = await as.get(`/api/rides/${ride}/parts`);
  expect(res.status).toBe(200);
  return ridePartsSchema.parse(res.body);
}

const input = (patch: Record<string, unknown> = {}) => ({
  component: 'Gondola hanger pin',
  joint: 0,
  serialNumber: 'HP-2291',
  maker: 'Ostrava Pin Works',
  fittedOn: '2026-12-01',
  fittedBy: 'Dale Merriweather (Tamsworth Pier Leisure)',
  replacedSerial: 'HP-1870',
  ...patch,
});

const counts = () => ({
  rows: server.db.select().from(partReplacements).all().length,
  docs: server.db.select().from(partReplacementDocuments).all().length,
});

beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
  rideId = await makeRide(companyOf('operator@pivotwatch.test'), 'Lantern Parts Swing', 'Pacific/Auckland');
  otherRideId = await makeRide(companyOf('operator2@pivotwatch.test'), 'Comet Parts Arm', 'Europe/London');
}, 60_000);
afterAll(() => server.close());

let firstId = '';
let certificate = '';

test('the operator records a part fitted to their ride, with a certificate they may then read', async () => {
  certificate = await upload(
    api.operator,
    'Certificate of conformity — hanger pin HP-2291, EN 10204 type 2.1.',
  );
  const res = await api.operator.post(
    `/api/rides/${rideId}/parts`,
    input({
      note: 'Old pin showed fretting at the lug.',
      documents: [{ sha256: certificate, title: 'Certificate of conformity' }],
    }),
  );
  expect(res.status).toBe(201);
  const { replacement } = partReplacementCreatedSchema.parse(res.body);
  firstId = replacement.id;
  expect(replacement).toMatchObject({
    component: 'Gondola hanger pin',
    joint: 0,
    pivotName: 'Main pivot',
    serialNumber: 'HP-2291',
    replacedSerial: 'HP-1870',
    createdByName: 'Priya Castellan',
    correctsId: null,
    correctedById: null,
    documents: [{ sha256: certificate, title: 'Certificate of conformity' }],
  });
  const file = await asBytes(api.operator.get(`/api/documents/${certificate}`));
  expect(file.status).toBe(200);
  expect(sha256Hex(file.body as Buffer)).toBe(certificate);
  // Staff read it too; the other company's operator does not.
  expect((await asBytes(api.inspector.get(`/api/documents/${certificate}`))).status).toBe(200);
  expectApiError(await api.operator2.get(`/api/documents/${certificate}`), 403, 'forbidden');
});

test('another company’s ride is not there for the operator: 404 to list and to add, nothing written', async () => {
  const before = counts();
  expectApiError(await api.operator.get(`/api/rides/${otherRideId}/parts`), 404, 'not_found');
  expectApiError(await api.operator.post(`/api/rides/${otherRideId}/parts`, input()), 404, 'not_found');
  expectApiError(await api.operator2.get(`/api/rides/${rideId}/parts`), 404, 'not_found');
  expect(counts()).toEqual(before);
});

test('lists are scoped: each operator sees their own ride’s records, staff see all', async () => {
  await api.operator2
    .post(
      `/api/rides/${otherRideId}/parts`,
      input({
        component: 'Sweep arm bushing',
        serialNumber: 'BU-77',
        joint: null,
        replacedSerial: undefined,
      }),
    )
    .expect(201);
  expect((await parts()).replacements.map((r) => r.serialNumber)).toEqual(['HP-2291']);
  expect((await parts(api.operator2, otherRideId)).replacements.map((r) => r.serialNumber)).toEqual([
    'BU-77',
  ]);
  for (const as of [api.admin, api.supervisor, api.inspector])
    expect((await parts(as, otherRideId)).replacements).toHaveLength(1);
  const body = await parts();
  expect(body.pivots).toEqual([{ joint: 0, name: 'Main pivot' }]);
  expect(body.designVersion).toBe(1);
});

test('the date fitted may be today at the ride’s site but not after it', async () => {
  // 23:30 UTC on 3 Dec is 12:30 on 4 Dec in Auckland (NZDT, UTC+13), 23:30 on 3 Dec in London (GMT).
  expect((await parts()).today).toBe('2026-12-04');
  expect((await parts(api.operator2, otherRideId)).today).toBe('2026-12-03');
  await api.inspector
    .post(
      `/api/rides/${rideId}/parts`,
      input({ serialNumber: 'HP-2300', fittedOn: '2026-12-04', joint: null }),
    )
    .expect(201);
  const before = counts();
  const future = expectApiError(
    await api.operator2.post(
      `/api/rides/${otherRideId}/parts`,
      input({ fittedOn: '2026-12-04', joint: null }),
    ),
    400,
    'validation_failed',
  );
  expect(future.issues?.map((i) => i.path)).toEqual(['fittedOn']);
  expect(counts()).toEqual(before);
});

test('bad input is refused naming the field, and nothing is written', async () => {
  const before = counts();
  const post = (body: Record<string, unknown>) => api.operator.post(`/api/rides/${rideId}/parts`, body);
  const missing = expectApiError(await post({ fittedOn: '2026-12-01' }), 400, 'validation_failed');
  expect(missing.issues?.map((i) => i.path).sort()).toEqual([
    'component',
    'fittedBy',
    'maker',
    'serialNumber',
  ]);
  const noPivot = expectApiError(await post(input({ joint: 7 })), 400, 'validation_failed');
  expect(noPivot.issues?.[0]).toMatchObject({ path: 'joint' });
  expect(noPivot.message).toContain('0 (Main pivot)');
  const notStored = expectApiError(
    await post(
      input({
        documents: [
          { sha256: certificate, title: 'CoC' },
          { sha256: 'f'.repeat(64), title: 'Material certificate' },
        ],
      }),
    ),
    400,
    'validation_failed',
  );
  expect(notStored.issues?.[0].path).toBe('documents.1.sha256');
  const untitled = expectApiError(
    await post(input({ documents: [{ sha256: certificate, title: ' ' }] })),
    400,
    'validation_failed',
  );
  expect(untitled.issues?.[0].path).toBe('documents.0.title');
  const twice = expectApiError(
    await post(
      input({
        documents: [
          { sha256: certificate, title: 'A' },
          { sha256: certificate, title: 'B' },
        ],
      }),
    ),
    400,
    'validation_failed',
  );
  expect(twice.issues?.[0].path).toBe('documents.1.sha256');
  // 2026 is not a leap year (Gregorian calendar).
  expect(
    expectApiError(await post(input({ fittedOn: '2026-02-29' })), 400, 'validation_failed').issues?.[0].path,
  ).toBe('fittedOn');
  const foreign = (await parts(api.operator2, otherRideId)).replacements[0].id;
  expect(
    expectApiError(await post(input({ correctsId: foreign })), 400, 'validation_failed').issues?.[0].path,
  ).toBe('correctsId');
  expect(counts()).toEqual(before);
});

test('a wrong record is corrected by a later one naming it; both stay, newest first, for the logbook too', async () => {
  const res = await api.operator.post(
    `/api/rides/${rideId}/parts`,
    input({ serialNumber: 'HP-2219', correctsId: firstId, note: 'Serial misread on the first record.' }),
  );
  expect(res.status).toBe(201);
  const list = (await parts()).replacements;
  // Newest fitted first, then newest recorded: HP-2300 (4 Dec), then the correction, then the original (1 Dec).
  expect(list.map((r) => [r.serialNumber, r.correctsId === firstId, r.correctedById !== null])).toEqual([
    ['HP-2300', false, false],
    ['HP-2219', true, false],
    ['HP-2291', false, true],
  ]);
  const rows = partReplacementLogRows(server.db, rideId);
  expect(rows.map((r) => r.on)).toEqual(['2026-12-04', '2026-12-01', '2026-12-01']);
  expect(rows[2]).toMatchObject({
    summary: 'Gondola hanger pin at Main pivot: serial HP-2291 by Ostrava Pin Works, replacing HP-1870',
    fittedBy: 'Dale Merriweather (Tamsworth Pier Leisure)',
    recordedByName: 'Priya Castellan',
    documentSha256s: [certificate],
  });
  expect(rows[1].summary).toContain('(corrects an earlier record)');
});
