/**
 * Findings on an inspection: create, list, change, remove; validation naming fields; photo references
 * limited to the inspection's own photos; numbering; concurrent edits; nothing changes once approved;
 * every change audited with before and after.
 */
import { randomUUID } from 'node:crypto';

import { count, eq } from 'drizzle-orm';

import { findings } from '@/db/server/review';
import { findingSeverities } from '@/features/review/schema';
import {
  findingListResponseSchema,
  findingResponseSchema,
  type Finding,
} from '@/features/notices/finding-schema';

import { numberRideFindings } from '@/server/findings/findings';

import { expectApiError, makeTestServer, userIdOf, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { auditOf, pushAccepted, secondInspector } from './review-desk-fixtures';
import { demoRide, imageBytes, makeRecord, photoRefFor, sha256Hex } from './sync-fixtures';

// Seeding hashes five passwords; on a busy machine that alone can take seconds.
jest.setTimeout(30_000);

let server: TestServer;
let api: Clients;
let skylark: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  skylark = demoRide(server.db, 'Skylark');
});
afterAll(() => server.close());

const pinPhoto = imageBytes(7);
const bushingPhoto = imageBytes(8);

/** A fresh submitted Skylark inspection with two photos. */
async function inspection() {
  const record = makeRecord(skylark, {
    photos: [
      photoRefFor(pinPhoto, { caption: 'Main pivot shaft, drive side' }),
      photoRefFor(bushingPhoto, { caption: 'Bushing, scoring at 4 o’clock' }),
    ],
  });
  await pushAccepted(server.db, api.inspector, [record]);
  return record.id;
}

const fixByDate = {
  severity: 'fix_by_date',
  description: 'Main pivot shaft bushing scored over a quarter of its circumference.',
  ruleRef: 'Maker’s maintenance manual, section 7.3',
  requiredAction: 'Replace the bushing and measure the diametral clearance again.',
  dueOn: '2026-06-30',
  photoShas: [sha256Hex(bushingPhoto)],
};

async function create(inspectionId: string, body: object = fixByDate): Promise<Finding> {
  const res = await api.supervisor.post(`/api/inspections/${inspectionId}/findings`, body);
  expect(res.status).toBe(201);
  return findingResponseSchema.parse(res.body).finding;
}

const findingCount = () => server.db.select({ n: count() }).from(findings).get()?.n;

describe('creating and listing', () => {
  test('a supervisor adds findings; they are listed in number order and in the inspection detail', async () => {
    const id = await inspection();
    const first = await create(id);
    expect(first).toMatchObject({
      inspectionId: id,
      rideId: skylark.id,
      number: 1,
      ...fixByDate,
      state: 'open',
      createdByName: 'Mira Delacourt',
      updatedByName: 'Mira Delacourt',
      closedAt: null,
      closedByName: null,
      stateNote: null,
    });
    expect(first.updatedAt).toBe(first.createdAt);
    const second = await create(id, { severity: 'note', description: 'Grease nipple on seat 3 dirty.' });
    expect(second).toMatchObject({
      number: 2,
      ruleRef: null,
      requiredAction: null,
      dueOn: null,
      photoShas: [],
    });
    // An admin decides too.
    const third = await api.admin.post(`/api/inspections/${id}/findings`, {
      severity: 'stop_now',
      description: 'Crack at the weld toe of the arm root, 40 mm long.',
      requiredAction: 'Stop the ride, lock it out, and have the weld examined by NDT.',
    });
    expect(third.status).toBe(201);
    expect(third.body.finding).toMatchObject({ number: 3, createdByName: 'Rowan Ashby' });

    const list = findingListResponseSchema.parse(
      (await api.supervisor.get(`/api/inspections/${id}/findings`)).body,
    );
    expect(list.findings.map((f) => f.number)).toEqual([1, 2, 3]);
    const detail = (await api.supervisor.get(`/api/inspections/${id}`)).body.inspection;
    expect(findingListResponseSchema.parse({ findings: detail.findings }).findings).toEqual(list.findings);
    // The inspector reads the findings on their own inspection.
    const own = await api.inspector.get(`/api/inspections/${id}/findings`);
    expect(own.status).toBe(200);
    expect(own.body.findings).toHaveLength(3);
  });

  test('bad input is refused with the field named, and nothing is stored', async () => {
    const id = await inspection();
    const before = findingCount();
    const missing = expectApiError(
      await api.supervisor.post(`/api/inspections/${id}/findings`, {
        severity: 'fix_by_date',
        description: ' ',
      }),
      400,
      'validation_failed',
    );
    expect(missing.issues).toEqual(
      expect.arrayContaining([
        { path: 'description', message: 'Say what was found' },
        { path: 'requiredAction', message: 'Say what must be done' },
        { path: 'dueOn', message: 'A fix-by-date finding needs a due date' },
      ]),
    );
    const severity = expectApiError(
      await api.supervisor.post(`/api/inspections/${id}/findings`, { severity: 'urgent', description: 'x' }),
      400,
      'validation_failed',
    );
    expect(severity.issues).toEqual([
      { path: 'severity', message: `One of ${findingSeverities.join(', ')}` },
    ]);
    const date = expectApiError(
      await api.supervisor.post(`/api/inspections/${id}/findings`, { ...fixByDate, dueOn: '2026-02-30' }),
      400,
      'validation_failed',
    );
    expect(date.issues).toEqual([{ path: 'dueOn', message: 'Not a real date' }]);
    const notAPhoto = expectApiError(
      await api.supervisor.post(`/api/inspections/${id}/findings`, { ...fixByDate, photoShas: ['abc'] }),
      400,
      'validation_failed',
    );
    expect(notAPhoto.issues?.[0]).toEqual({
      path: 'photoShas.0',
      message: 'Must be a photo reference (64 hex digits)',
    });
    expect(findingCount()).toBe(before);
  });

  test('photo references must be photos of the same inspection', async () => {
    const id = await inspection();
    const elsewhere = sha256Hex(imageBytes(99));
    const before = findingCount();
    const err = expectApiError(
      await api.supervisor.post(`/api/inspections/${id}/findings`, {
        ...fixByDate,
        photoShas: [sha256Hex(pinPhoto), elsewhere],
      }),
      400,
      'validation_failed',
    );
    expect(err.issues).toEqual([{ path: 'photoShas.1', message: 'Not a photo of this inspection' }]);
    expect(findingCount()).toBe(before);
    const ok = await create(id, { ...fixByDate, photoShas: [sha256Hex(pinPhoto), sha256Hex(pinPhoto)] });
    expect(ok.photoShas).toEqual([sha256Hex(pinPhoto)]);
  });

  test('numbers are never given twice within an inspection, even after a delete', async () => {
    const id = await inspection();
    const [, two, three] = [await create(id), await create(id), await create(id)];
    expect((await api.supervisor.delete(`/api/findings/${three.id}`)).status).toBe(204);
    expect((await create(id)).inspectionNumber).toBe(4);
    expect((await api.supervisor.delete(`/api/findings/${two.id}`)).status).toBe(204);
    expect((await create(id)).inspectionNumber).toBe(5);
    // Another inspection starts at 1.
    expect((await create(await inspection())).inspectionNumber).toBe(1);
  });

  test('the number people use is the finding’s number on the ride: unique over its inspections, never reused', async () => {
    const first = await inspection();
    const second = await inspection();
    const a = await create(first);
    const b = await create(second);
    const c = await create(first);
    // Both inspections have a "finding 1" of their own; on the ride each number names one finding.
    expect([a.inspectionNumber, b.inspectionNumber, c.inspectionNumber]).toEqual([1, 1, 2]);
    expect([b.number - a.number, c.number - b.number]).toEqual([1, 1]);
    expect((await api.supervisor.delete(`/api/findings/${c.id}`)).status).toBe(204);
    const d = await create(second);
    expect(d.number).toBe(c.number + 1);
    const listed = [
      ...(await api.supervisor.get(`/api/inspections/${first}/findings`)).body.findings,
      ...(await api.supervisor.get(`/api/inspections/${second}/findings`)).body.findings,
    ].map((f: { number: number }) => f.number);
    expect(new Set(listed).size).toBe(listed.length);
  });
});

describe('numbers on the ride for findings stored before them', () => {
  test('are given once, in the order the findings were made, after the highest number already given', async () => {
    const id = await inspection();
    const numbered = await create(id);
    const supervisor = userIdOf(server.db, 'supervisor@pivotwatch.test');
    // Two findings as an older server stored them: no number on the ride.
    const old = [8, 9].map((n) => {
      const fid = randomUUID();
      server.db
        .insert(findings)
        .values({
          id: fid,
          inspectionId: id,
          rideId: skylark.id,
          number: n,
          severity: 'note',
          description: `Older finding ${n}`,
          createdAt: `2026-01-0${n - 7}T10:00:00.000Z`,
          createdBy: supervisor,
          updatedAt: `2026-01-0${n - 7}T10:00:00.000Z`,
          updatedBy: supervisor,
        })
        .run();
      return fid;
    });
    const rideNumberOf = (fid: string) =>
      server.db.select({ n: findings.rideNumber }).from(findings).where(eq(findings.id, fid)).get()?.n;
    // Until numbered, the API names them by their number in the inspection.
    const listed = (await api.supervisor.get(`/api/inspections/${id}/findings`)).body.findings;
    expect(listed.find((f: Finding) => f.id === old[0]).number).toBe(8);
    numberRideFindings(server.db);
    expect(old.map(rideNumberOf)).toEqual([numbered.number + 1, numbered.number + 2]);
    // Once only: a second run changes nothing, and a new finding comes after them.
    numberRideFindings(server.db);
    expect(old.map(rideNumberOf)).toEqual([numbered.number + 1, numbered.number + 2]);
    expect((await create(id)).number).toBe(numbered.number + 3);
  });
});

describe('changing and removing', () => {
  test('a change merges with the stored finding, and the rules are checked on the result', async () => {
    const id = await inspection();
    const note = await create(id, { severity: 'note', description: 'Slight fretting dust at the bushing.' });
    // Raising a note to fix-by-date needs an action and a due date the note never had.
    const err = expectApiError(
      await api.supervisor.patch(`/api/findings/${note.id}`, { severity: 'fix_by_date' }),
      400,
      'validation_failed',
    );
    expect(err.issues).toEqual([
      { path: 'requiredAction', message: 'Say what must be done' },
      { path: 'dueOn', message: 'A fix-by-date finding needs a due date' },
    ]);
    const res = await api.supervisor.patch(`/api/findings/${note.id}`, {
      severity: 'fix_by_date',
      requiredAction: 'Re-grease and check again in a week.',
      dueOn: '2026-05-11',
      expectedUpdatedAt: note.updatedAt,
    });
    expect(res.status).toBe(200);
    const changed = findingResponseSchema.parse(res.body).finding;
    expect(changed).toMatchObject({
      number: note.number,
      inspectionNumber: 1,
      severity: 'fix_by_date',
      description: note.description,
      requiredAction: 'Re-grease and check again in a week.',
      dueOn: '2026-05-11',
    });
    expect(changed.updatedAt > note.updatedAt).toBe(true);
    // Clearing the due date of a fix-by-date finding is refused.
    const cleared = expectApiError(
      await api.supervisor.patch(`/api/findings/${note.id}`, { dueOn: null }),
      400,
      'validation_failed',
    );
    expect(cleared.issues).toEqual([{ path: 'dueOn', message: 'A fix-by-date finding needs a due date' }]);
    const empty = expectApiError(
      await api.supervisor.patch(`/api/findings/${note.id}`, {}),
      400,
      'validation_failed',
    );
    expect(empty.issues?.[0].message).toBe('Nothing to change');
    const photo = expectApiError(
      await api.supervisor.patch(`/api/findings/${note.id}`, { photoShas: [sha256Hex(imageBytes(123))] }),
      400,
      'validation_failed',
    );
    expect(photo.issues).toEqual([{ path: 'photoShas.0', message: 'Not a photo of this inspection' }]);
  });

  test('an edit made from a stale copy is a 409 that says so, and changes nothing', async () => {
    const id = await inspection();
    const opened = await create(id);
    const first = await api.admin.patch(`/api/findings/${opened.id}`, {
      description: 'Bushing scored; clearance 0.52 mm.',
      expectedUpdatedAt: opened.updatedAt,
    });
    expect(first.status).toBe(200);
    const err = expectApiError(
      await api.supervisor.patch(`/api/findings/${opened.id}`, {
        description: 'My older wording',
        expectedUpdatedAt: opened.updatedAt,
      }),
      409,
      'edit_conflict',
    );
    expect(err.message).toMatch(
      /^Finding \d+ was changed by Rowan Ashby at .+ after you opened it\. Reload it/,
    );
    const stored = (await api.supervisor.get(`/api/inspections/${id}/findings`)).body.findings[0];
    expect(stored.description).toBe('Bushing scored; clearance 0.52 mm.');
  });

  test('every change is audited with who, what, before and after, on the ride', async () => {
    const id = await inspection();
    const made = await create(id);
    await api.supervisor.patch(`/api/findings/${made.id}`, { severity: 'fix_before_operation' });
    await api.supervisor.delete(`/api/findings/${made.id}`);
    const entries = auditOf(server.db, 'finding', made.id);
    expect(entries.map((e) => [e.action, e.summary])).toEqual([
      ['create', `Skylark: finding ${made.number} added (Fix by date)`],
      ['update', `Skylark: finding ${made.number} changed (Fix by date → Fix before operation)`],
      ['delete', `Skylark: finding ${made.number} removed`],
    ]);
    const supervisorId = entries[0].userId;
    expect(entries.every((e) => e.userId === supervisorId && e.rideId === skylark.id)).toBe(true);
    expect(entries[0].before).toBeNull();
    expect(entries[0].after).toMatchObject({ id: made.id, inspectionId: id, severity: 'fix_by_date' });
    expect(entries[1].before).toMatchObject({ severity: 'fix_by_date' });
    expect(entries[1].after).toMatchObject({ severity: 'fix_before_operation' });
    expect(entries[2].before).toMatchObject({
      severity: 'fix_before_operation',
      number: made.number,
      inspectionNumber: 1,
    });
    expect(entries[2].after).toBeNull();
  });

  test('once the inspection is approved its findings are fixed: no adds, edits or removals (409)', async () => {
    const id = await inspection();
    const made = await create(id);
    expect(
      (await api.supervisor.post(`/api/inspections/${id}/decision`, { decision: 'approve' })).status,
    ).toBe(200);
    const before = findingCount();
    const add = expectApiError(
      await api.supervisor.post(`/api/inspections/${id}/findings`, fixByDate),
      409,
      'inspection_approved',
    );
    expect(add.message).toMatch(
      /^This inspection was approved on \d{4}-\d{2}-\d{2}, so no finding can be added/,
    );
    expectApiError(
      await api.supervisor.patch(`/api/findings/${made.id}`, { description: 'Changed afterwards' }),
      409,
      'inspection_approved',
    );
    expectApiError(await api.supervisor.delete(`/api/findings/${made.id}`), 409, 'inspection_approved');
    expect(findingCount()).toBe(before);
    const stored = server.db.select().from(findings).where(eq(findings.id, made.id)).get();
    expect(stored?.description).toBe(fixByDate.description);
  });

  test('a returned inspection’s findings can still be edited', async () => {
    const id = await inspection();
    const made = await create(id);
    await api.supervisor.post(`/api/inspections/${id}/decision`, {
      decision: 'return',
      note: 'Add the bushing photo.',
    });
    const res = await api.supervisor.patch(`/api/findings/${made.id}`, { dueOn: '2026-07-15' });
    expect(res.status).toBe(200);
  });
});

describe('who may', () => {
  test('inspectors and operators may not write; another inspector sees nothing; unknown ids are 404', async () => {
    const id = await inspection();
    const made = await create(id);
    expectApiError(await api.inspector.post(`/api/inspections/${id}/findings`, fixByDate), 403, 'forbidden');
    expectApiError(
      await api.inspector.patch(`/api/findings/${made.id}`, { description: 'x' }),
      403,
      'forbidden',
    );
    expectApiError(await api.inspector.delete(`/api/findings/${made.id}`), 403, 'forbidden');
    expectApiError(await api.operator.get(`/api/inspections/${id}/findings`), 403, 'forbidden');
    const other = await secondInspector(server.app, server.db);
    expectApiError(await other.get(`/api/inspections/${id}/findings`), 404, 'not_found');
    expectApiError(await api.supervisor.get('/api/inspections/missing/findings'), 404, 'not_found');
    expectApiError(
      await api.supervisor.post('/api/inspections/missing/findings', fixByDate),
      404,
      'not_found',
    );
    expectApiError(
      await api.supervisor.patch('/api/findings/missing', { description: 'x' }),
      404,
      'not_found',
    );
    expectApiError(await api.supervisor.delete('/api/findings/missing'), 404, 'not_found');
  });
});
