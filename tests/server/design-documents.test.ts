/**
 * Documents on design-data versions through the API: supervisors and admins attach and remove them (each
 * audited; removing detaches, the file stays stored), a new version starts with the documents of the
 * version it was made from, an operator reads a document attached to their own ride's version and gets
 * 403 for another company's, and bad input is refused with the field named and nothing changed. The PDFs
 * are real ones written by pdfkit; what comes back is checked against the SHA-256 (FIPS 180-4, Node's
 * crypto) of the bytes sent.
 */
import { and, eq } from 'drizzle-orm';

import { designDocuments } from '@/db/server/parts';
import { auditLog, users } from '@/db/server/schema';
import type { DesignData } from '@/features/loads/design-schema';
import { entryChanges } from '@/features/registry/audit-diff';
import {
  designDocumentResponseSchema,
  versionDocumentsSchema,
  type VersionDocuments,
} from '@/features/registry/schema';
import { designDocumentEventsOfRide } from '@/server/parts/logbook';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { asBytes, pdfBytes, sha256Hex } from '@/tests/support/pdf-files';
import { rodDesign } from '@/tests/support/rod-design';

let server: TestServer;
let api: Clients;
let rideId = '';
let otherRideId = '';
let manual = '';
let report = '';

const companyOf = (email: string) =>
  server.db.select({ companyId: users.companyId }).from(users).where(eq(users.email, email)).get()
    ?.companyId ?? '';

async function makeRide(companyId: string, name: string) {
  const ride = await api.admin.post('/api/rides', { operatorCompanyId: companyId, name, rideClass: 'other' });
  expect(ride.status).toBe(201);
  const id: string = ride.body.ride.id;
  await api.admin
    .put(`/api/rides/${id}/design`, { reason: 'First data', data: rodDesign(900, 5, name) })
    .expect(201);
  return id;
}

async function upload(text: string) {
  const pdf = await pdfBytes(text);
  expect((await api.supervisor.putBytes(`/api/documents/${sha256Hex(pdf)}`, pdf)).status).toBe(201);
  return sha256Hex(pdf);
}

const attach = (as: Clients['admin'], version: number, body: Record<string, unknown>, ride = rideId) =>
  as.post(`/api/rides/${ride}/design/versions/${version}/documents`, body);

async function documentsOf(
  version: number,
  as: Clients['admin'] = api.supervisor,
): Promise<VersionDocuments> {
  const res = await as.get(`/api/rides/${rideId}/design/versions/${version}/documents`);
  expect(res.status).toBe(200);
  return versionDocumentsSchema.parse(res.body);
}

const rowCount = () => server.db.select().from(designDocuments).all().length;
const auditCount = () => server.db.select().from(auditLog).all().length;

beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  rideId = await makeRide(companyOf('operator@pivotwatch.test'), 'Lantern Docs Swing');
  otherRideId = await makeRide(companyOf('operator2@pivotwatch.test'), 'Comet Docs Arm');
  manual = await upload('Lantern Docs Swing — operation and maintenance manual, issue 3.');
  report = await upload('Lantern Docs Swing — design report, revision B.');
}, 60_000);
afterAll(() => server.close());

describe('attaching and removing', () => {
  let manualId = '';

  test('a supervisor attaches a maker’s manual to version 1, audited, and everyone on the ride reads it', async () => {
    const res = await attach(api.supervisor, 1, {
      sha256: manual,
      kind: 'makers_manual',
      title: 'Operation and maintenance manual',
      revision: 'Issue 3',
      issuedOn: '2024-04-30',
    });
    expect(res.status).toBe(201);
    const { document } = designDocumentResponseSchema.parse(res.body);
    manualId = document.id;
    expect(document).toMatchObject({
      version: 1,
      firstVersion: 1,
      kind: 'makers_manual',
      revision: 'Issue 3',
      issuedOn: '2024-04-30',
      attachedByName: 'Mira Delacourt',
      detachedAt: null,
    });
    const entry = server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.entityId, manualId), eq(auditLog.action, 'create')))
      .get();
    expect(entry).toMatchObject({ entity: 'design', rideId });
    expect(entry?.summary).toContain('“Operation and maintenance manual” attached to design data version 1');
    // The history of changes lists it in words, not stored keys.
    expect(entryChanges('design', entry?.before, entry?.after, 'si')).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ field: 'Document', before: null, after: 'Maker’s manual' }),
        expect.objectContaining({ field: 'Title', after: 'Operation and maintenance manual' }),
        expect.objectContaining({ field: 'Issued on', after: '2024-04-30' }),
      ]),
    );

    for (const as of [api.admin, api.supervisor, api.inspector])
      expect((await documentsOf(1, as)).documents.map((d) => d.id)).toEqual([manualId]);
    // The operator reads the ride's documents (the version in force) and the file itself.
    const ours = await api.operator.get(`/api/rides/${rideId}/documents`);
    expect(ours.status).toBe(200);
    expect(versionDocumentsSchema.parse(ours.body)).toMatchObject({
      version: 1,
      documents: [{ sha256: manual }],
    });
    const file = await asBytes(api.operator.get(`/api/documents/${manual}`));
    expect(file.status).toBe(200);
    expect(sha256Hex(file.body as Buffer)).toBe(manual);
  });

  test('another company’s operator sees neither the ride’s documents nor the file', async () => {
    expectApiError(await api.operator2.get(`/api/rides/${rideId}/documents`), 404, 'not_found');
    expectApiError(await api.operator2.get(`/api/documents/${manual}`), 403, 'forbidden');
    // Operators never reach the design pages' own routes, and may not attach.
    expectApiError(
      await api.operator.get(`/api/rides/${rideId}/design/versions/1/documents`),
      403,
      'forbidden',
    );
    expectApiError(
      await attach(api.operator, 1, { sha256: report, kind: 'other', title: 'x' }),
      403,
      'forbidden',
    );
    expectApiError(
      await attach(api.inspector, 1, { sha256: report, kind: 'other', title: 'x' }),
      403,
      'forbidden',
    );
  });

  test('bad input is refused naming the field, and nothing is written', async () => {
    const before = { rows: rowCount(), audit: auditCount() };
    const notStored = expectApiError(
      await attach(api.admin, 1, { sha256: 'e'.repeat(64), kind: 'drawing', title: 'General arrangement' }),
      400,
      'validation_failed',
    );
    expect(notStored.issues?.[0].path).toBe('sha256');
    const noTitle = expectApiError(
      await attach(api.admin, 1, { sha256: report, kind: 'design_report', title: '  ' }),
      400,
      'validation_failed',
    );
    expect(noTitle.issues?.map((i) => i.path)).toEqual(['title']);
    const badKind = expectApiError(
      await attach(api.admin, 1, { sha256: report, kind: 'brochure', title: 'Design report' }),
      400,
      'validation_failed',
    );
    expect(badKind.issues?.map((i) => i.path)).toEqual(['kind']);
    // 2025 is not a leap year (Gregorian calendar): there is no 29 February.
    const badDay = expectApiError(
      await attach(api.admin, 1, {
        sha256: report,
        kind: 'design_report',
        title: 'Design report',
        issuedOn: '2025-02-29',
      }),
      400,
      'validation_failed',
    );
    expect(badDay.issues?.map((i) => i.path)).toEqual(['issuedOn']);
    expectApiError(
      await attach(api.admin, 9, { sha256: report, kind: 'design_report', title: 'R' }),
      404,
      'not_found',
    );
    expectApiError(
      await attach(api.admin, 1, { sha256: manual, kind: 'makers_manual', title: 'Again' }),
      409,
      'already_attached',
    );
    expect({ rows: rowCount(), audit: auditCount() }).toEqual(before);
  });

  test('a new version carries the documents of the version it was made from, saying where they came from', async () => {
    await attach(api.admin, 1, {
      sha256: report,
      kind: 'design_report',
      title: 'Design report',
      revision: 'Rev. B',
    }).expect(201);
    const v1 = rodDesign(900, 5, 'Lantern Docs Swing');
    // Tightening the clearance limit takes effect at once (no second person needed).
    const tighter: DesignData = {
      ...v1,
      source: { ...v1.source, revision: 'B' },
      pivots: v1.pivots.map((p) => ({ ...p, maxClearanceM: 0.0004 })),
    };
    await api.admin
      .put(`/api/rides/${rideId}/design`, { reason: 'Rev. B of the design report', data: tighter })
      .expect(201);
    const v2 = await documentsOf(2);
    expect(v2.documents.map((d) => [d.title, d.version, d.firstVersion])).toEqual([
      ['Operation and maintenance manual', 2, 1],
      ['Design report', 2, 1],
    ]);
    // The operator's view follows the version in force.
    const ours = versionDocumentsSchema.parse(
      (await api.operator.get(`/api/rides/${rideId}/documents`)).body,
    );
    expect(ours.version).toBe(2);
    expect(ours.documents).toHaveLength(2);
  });

  test('removing detaches from that version only, audited; the file stays and the next version does not carry it', async () => {
    const v2 = await documentsOf(2);
    const onV2 = v2.documents.find((d) => d.sha256 === report);
    const res = await api.supervisor.delete(`/api/rides/${rideId}/design/versions/2/documents/${onV2?.id}`);
    expect(res.status).toBe(200);
    expect(designDocumentResponseSchema.parse(res.body).document).toMatchObject({
      detachedByName: 'Mira Delacourt',
    });
    const entry = server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.entityId, onV2?.id ?? ''), eq(auditLog.action, 'delete')))
      .get();
    expect(entry?.summary).toContain('removed from design data version 2 (the file stays stored)');
    expect((await documentsOf(2)).documents.map((d) => d.sha256)).toEqual([manual]);
    expect((await documentsOf(1)).documents.map((d) => d.sha256)).toEqual([manual, report]);
    // Staff still read the file; a second removal finds nothing.
    expect((await asBytes(api.admin.get(`/api/documents/${report}`))).status).toBe(200);
    expectApiError(
      await api.supervisor.delete(`/api/rides/${rideId}/design/versions/2/documents/${onV2?.id}`),
      404,
      'not_found',
    );

    const v1 = rodDesign(900, 5, 'Lantern Docs Swing');
    const tighter: DesignData = {
      ...v1,
      source: { ...v1.source, revision: 'C' },
      pivots: v1.pivots.map((p) => ({ ...p, maxClearanceM: 0.0003 })),
    };
    await api.admin.put(`/api/rides/${rideId}/design`, { reason: 'Rev. C', data: tighter }).expect(201);
    expect((await documentsOf(3)).documents.map((d) => [d.sha256, d.firstVersion])).toEqual([[manual, 1]]);
  });

  test('a revision waiting for approval carries what was on its base, and on approval also what was attached meanwhile', async () => {
    const drawing = await upload('Lantern Docs Swing — general arrangement drawing GA-12.');
    const v1 = rodDesign(900, 5, 'Lantern Docs Swing');
    // A larger clearance limit loosens it: version 4 waits for a second person (four-eyes principle).
    const looser: DesignData = {
      ...v1,
      source: { ...v1.source, revision: 'D' },
      pivots: v1.pivots.map((p) => ({ ...p, maxClearanceM: 0.0006 })),
    };
    await api.supervisor.put(`/api/rides/${rideId}/design`, { reason: 'Rev. D', data: looser }).expect(201);
    expect((await documentsOf(4)).documents.map((d) => d.sha256)).toEqual([manual]);
    expectApiError(
      await api.inspector.get(`/api/rides/${rideId}/design/versions/4/documents`),
      404,
      'not_found',
    );
    await attach(api.admin, 3, {
      sha256: drawing,
      kind: 'drawing',
      title: 'General arrangement GA-12',
    }).expect(201);
    await api.admin
      .post(`/api/rides/${rideId}/design/versions/4/decision`, { decision: 'approve', reason: 'Checked' })
      .expect(200);
    expect((await documentsOf(4)).documents.map((d) => [d.title, d.firstVersion])).toEqual([
      ['Operation and maintenance manual', 1],
      ['General arrangement GA-12', 3],
    ]);
  });

  test('the logbook’s rows: each attachment once (not its carried copies) and each removal, newest first', () => {
    const events = designDocumentEventsOfRide(server.db, rideId);
    expect(events.map((e) => [e.action, e.version, e.title])).toEqual([
      ['attached', 3, 'General arrangement GA-12'],
      ['removed', 2, 'Design report'],
      ['attached', 1, 'Design report'],
      ['attached', 1, 'Operation and maintenance manual'],
    ]);
    expect(events[1].documentSha256s).toEqual([report]);
    expect(events[1].byName).toBe('Mira Delacourt');
    expect(events[0].byName).toBe('Rowan Ashby');
  });

  test('another company’s document: its own operator reads it, ours gets 403', async () => {
    const theirs = await upload('Comet Docs Arm — type examination certificate.');
    await attach(
      api.admin,
      1,
      { sha256: theirs, kind: 'certificate', title: 'Type examination' },
      otherRideId,
    ).expect(201);
    expect((await asBytes(api.operator2.get(`/api/documents/${theirs}`))).status).toBe(200);
    expectApiError(await api.operator.get(`/api/documents/${theirs}`), 403, 'forbidden');
  });
});
