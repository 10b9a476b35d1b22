/**
 * The inspector's own copy of an inspection report (GET /api/inspections/:id/report.pdf), read back with an
 * independent PDF reader (pdf-parse, built on Mozilla's pdf.js) and by looking at the page boxes.
 */
import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import path from 'node:path';

import request from 'supertest';

import { users } from '@/db/server/schema';
import { CAUTION_FULL } from '@/lib/caution-text';
import { hashPassword } from '@/server/auth/password';
import { renderInspectionReportPdf } from '@/server/reports/inspection-report-pdf';
import { inspectionReport } from '@/server/reports/inspection-report';
import { analysePending } from '@/server/sync/analysis';

import { expectApiError, makeTestServer, signInAs, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord, speedReading } from './sync-fixtures';

jest.setTimeout(60_000);

type Parsed = { flat: string; pages: { width: number; height: number }[]; total: number };

/** Text and page sizes as pdf-parse reads them (in a child process: see support/read-pdf.cjs). */
function parse(pdf: Buffer): Parsed {
  const out = execFileSync(process.execPath, [path.join(__dirname, 'support', 'read-pdf.cjs')], {
    input: pdf,
    maxBuffer: 64 * 1024 * 1024,
  });
  const { text, total, pages } = JSON.parse(out.toString('utf8')) as {
    text: string;
    total: number;
    pages: { width: number; height: number }[];
  };
  return { total, pages, flat: text.replace(/\s+/g, ' ') };
}

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

let server: TestServer;
let api: Clients;
let recordId: string;
let inspectorToken: string;

beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  inspectorToken = await signInAs(server.app, 'inspector@pivotwatch.test');
  const comet = demoRide(server.db, 'Twin Comet');
  const record = makeRecord(comet, {
    readings: [speedReading(11.5, 0, { label: 'Main arm speed, timed over 10 turns' })],
    notes: 'Light drizzle; rail wet.',
  });
  recordId = record.id;
  const res = await api.inspector.push([record]);
  expect(res.body.results[0]).toMatchObject({ status: 'accepted' });
});
afterAll(() => server.close());

const get = (token: string | null, url: string) => {
  const req = request(server.app).get(url).buffer(true).parse(binary);
  return token ? req.set('Authorization', `Bearer ${token}`) : req;
};

test('the inspector downloads their own report: what they recorded, the caution, A4 by default', async () => {
  const res = await get(inspectorToken, `/api/inspections/${recordId}/report.pdf`);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  expect(res.headers['content-disposition']).toMatch(
    /^inline; filename="inspection-Twin_Comet-2026-05-04\.pdf"$/,
  );
  const pdf = parse(res.body as Buffer);
  for (const text of [
    'Inspection report',
    'Twin Comet',
    'Tomas Reyne',
    'Retaining plate bolts tight',
    'Seat 3 slow to lock',
    'Main arm speed, timed over 10 turns',
    'Tap timer',
    'Light drizzle; rail wet.',
  ])
    expect(pdf.flat).toContain(text);
  // The full caution, whole, whatever the line breaks.
  expect(pdf.flat).toContain(CAUTION_FULL.replace(/\s+/g, ' ').slice(0, 120));
  // A4 is 210 × 297 mm (ISO 216) = 595.28 × 841.89 pt at 72 pt per inch.
  expect(pdf.pages[0].width).toBeCloseTo(595.28, 1);
  expect(pdf.pages[0].height).toBeCloseTo(841.89, 1);
  expect(pdf.flat).toMatch(new RegExp(`page 1 of ${pdf.total}`));
});

test('the load check says how it was made: each joint’s model and the governing case with its item', async () => {
  await analysePending(server.db);
  const res = await get(inspectorToken, `/api/inspections/${recordId}/report.pdf`);
  expect(res.status).toBe(200);
  const pdf = parse(res.body as Buffer);
  // Twin Comet's design gives service and emergency stops, so its check runs them as load cases.
  expect(pdf.flat).toMatch(/Models: P1 [^:]+: steady rotation, from the readings/);
  expect(pdf.flat).toMatch(
    /Governing case: (Operating cycle|Service stop|Emergency stop) \(.+ at [\d.,]+ ?% of its limit\)\./,
  );
});

test('US Letter on request (8.5 × 11 in, ANSI/ASME Y14.1 = 612 × 792 pt)', async () => {
  const res = await get(inspectorToken, `/api/inspections/${recordId}/report.pdf?size=LETTER`);
  expect(res.status).toBe(200);
  const pdf = parse(res.body as Buffer);
  expect(pdf.pages[0].width).toBeCloseTo(612, 1);
  expect(pdf.pages[0].height).toBeCloseTo(792, 1);
});

test('supervisors may read any report; operators may not; another inspector gets the same 404 as a missing one', async () => {
  expect((await api.supervisor.get(`/api/inspections/${recordId}/report.pdf`)).status).toBe(200);
  expectApiError(await api.operator.get(`/api/inspections/${recordId}/report.pdf`), 403, 'forbidden');
  expectApiError(await api.anonymous.get(`/api/inspections/${recordId}/report.pdf`), 401, 'unauthorized');

  server.db
    .insert(users)
    .values({
      email: 'second.inspector@pivotwatch.test',
      name: 'Second Inspector',
      role: 'inspector',
      passwordHash: await hashPassword('another-pass-phrase'),
    })
    .run();
  const other = await signInAs(server.app, 'second.inspector@pivotwatch.test', 'another-pass-phrase');
  const res = await request(server.app)
    .get(`/api/inspections/${recordId}/report.pdf`)
    .set('Authorization', `Bearer ${other}`);
  expectApiError(res, 404, 'not_found');
  expectApiError(await api.inspector.get(`/api/inspections/${randomUUID()}/report.pdf`), 404, 'not_found');
});

test('a paper size it does not know is a 400 naming the field', async () => {
  const res = await api.inspector.get(`/api/inspections/${recordId}/report.pdf?size=A3`);
  expectApiError(res, 400, 'validation_failed');
  expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain('query.size');
});

test('the same report printed at the same moment is the same bytes', async () => {
  const session = (await api.inspector.get('/api/me')).body.user;
  const at = new Date('2026-05-05T09:00:00.000Z');
  const a = await renderInspectionReportPdf(inspectionReport(server.db, session, recordId, at), 'A4');
  const b = await renderInspectionReportPdf(inspectionReport(server.db, session, recordId, at), 'A4');
  expect(a.equals(b)).toBe(true);
  // Printed on the site's clock, named: Tamsworth Pier keeps Europe/London time, BST (UTC+1) in May (IANA
  // tz database, `europe`: from the last Sunday in March), so 09:00 UTC reads 10:00.
  expect(parse(a).flat).toContain('copy for Tomas Reyne, 5 May 2026, 10:00 Europe/London (UTC+01:00)');
});
