/**
 * Makers' bulletins through the API: the register (supervisors and admins write, every refusal changes
 * nothing, the PDF must be stored first), which rides a bulletin applies to (maker and model, case and
 * spaces ignored), what each role sees (an operator only their own rides and the PDFs of bulletins for
 * them), a supervisor's record of one done, and an inspection's bulletin checklist items: carried to the
 * phone in the pull, checked at push (a bulletin for another model is refused, naming the field) and
 * recorded on the ride. PDFs are real ones written by pdfkit; the records are signed like a phone's.
 */
import { count, eq } from 'drizzle-orm';

import { bulletinActions, bulletins } from '@/db/server/bulletins';
import { type Bulletin, type RideBulletin, bulletinItemId } from '@/features/bulletins/schema';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';
import { asBytes, pdfBytes, sha256Hex } from '@/tests/support/pdf-files';

let server: TestServer;
let api: Clients;
let skylark: ReturnType<typeof demoRide>;
let tidebreaker: ReturnType<typeof demoRide>;

beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  skylark = demoRide(server.db, 'Skylark'); // Orrin Ride Works PX-15, Tamsworth Pier Leisure
  tidebreaker = demoRide(server.db, 'Tidebreaker'); // Orrin Ride Works RX-30, Corvane Travelling Shows
});
afterAll(() => server.close());

const bulletinCount = () => server.db.select({ n: count() }).from(bulletins).get()?.n ?? 0;
const actionCount = () => server.db.select({ n: count() }).from(bulletinActions).get()?.n ?? 0;

let refNo = 0;
/** A valid bulletin for Skylark's model, spelt as a clerk might type it. */
const input = (patch: Record<string, unknown> = {}) => ({
  maker: 'ORRIN  rideworks',
  models: [' Px-15 '],
  reference: `T-${++refNo}`,
  title: 'Seat belt buckle latch spring',
  issuedOn: '2026-03-01',
  severity: 'safety',
  requiredAction: 'Fit the stiffer latch spring (part 77-2) to every seat belt buckle',
  deadlineOn: '2026-12-31',
  ...patch,
});

async function storedPdf(text: string): Promise<{ bytes: Buffer; hash: string }> {
  const bytes = await pdfBytes(text);
  const res = await api.supervisor.putBytes(`/api/documents/${sha256Hex(bytes)}`, bytes);
  expect(res.status).toBe(201);
  return { bytes, hash: sha256Hex(bytes) };
}

async function create(patch: Record<string, unknown> = {}): Promise<Bulletin> {
  const res = await api.supervisor.post('/api/bulletins', input(patch));
  expect(res.status).toBe(201);
  return res.body.bulletin;
}

async function rideBulletins(as: Clients['admin'], rideId: string): Promise<RideBulletin[]> {
  const res = await as.get(`/api/rides/${rideId}/bulletins`);
  expect(res.status).toBe(200);
  return res.body.bulletins;
}

test('bad input is refused naming the field, and changes nothing', async () => {
  const before = bulletinCount();
  const cases: [Record<string, unknown>, string][] = [
    [{ models: [] }, 'models'],
    [{ models: ['PX-15', ' px-15'] }, 'models'],
    [{ issuedOn: '2026-02-30' }, 'issuedOn'],
    [{ severity: 'whenever' }, 'severity'],
    [{ requiredAction: '  ' }, 'requiredAction'],
    [{ beforeNextOperation: true }, 'deadlineOn'],
    [{ deadlineOn: '2026-01-01' }, 'deadlineOn'],
    [{ documentSha256: 'not-a-hash' }, 'documentSha256'],
    // A well-formed hash of a file never uploaded: the PDF must be stored first.
    [{ documentSha256: 'e'.repeat(64) }, 'documentSha256'],
  ];
  for (const [patch, path] of cases) {
    const err = expectApiError(
      await api.supervisor.post('/api/bulletins', input(patch)),
      400,
      'validation_failed',
    );
    expect(err.issues?.map((i) => i.path)).toContain(path);
  }
  expectApiError(await api.inspector.post('/api/bulletins', input()), 403, 'forbidden');
  expectApiError(await api.operator.post('/api/bulletins', input()), 403, 'forbidden');
  expect(bulletinCount()).toBe(before);
});

test('the register: add with a stored PDF, search, change, remove; a maker’s reference is used once; all audited', async () => {
  const pdf = await storedPdf('Service bulletin T: seat belt buckle latch spring.');
  const made = await create({ documentSha256: pdf.hash, reference: 'ORW-T-100' });
  expect(made).toMatchObject({ maker: 'ORRIN  rideworks', models: ['Px-15'], documentSha256: pdf.hash });

  const dup = expectApiError(
    await api.admin.post('/api/bulletins', input({ reference: 'ORW-T-100', maker: 'orrin ride works' })),
    400,
    'validation_failed',
  );
  expect(dup.issues?.[0].path).toBe('reference');

  const found = await api.inspector.get('/api/bulletins?q=latch%20spring');
  expect(found.status).toBe(200);
  expect(found.body.bulletins.map((b: Bulletin) => b.id)).toContain(made.id);

  const changed = await api.admin.patch(`/api/bulletins/${made.id}`, {
    title: 'Buckle latch spring (rev. B)',
  });
  expect(changed.status).toBe(200);
  expect(changed.body.bulletin.title).toBe('Buckle latch spring (rev. B)');
  // The rules hold for the bulletin as it would become: both kinds of deadline at once are refused.
  const both = expectApiError(
    await api.admin.patch(`/api/bulletins/${made.id}`, { beforeNextOperation: true }),
    400,
    'validation_failed',
  );
  expect(both.issues?.[0].path).toBe('deadlineOn');
  expect((await api.admin.get(`/api/bulletins/${made.id}`)).body.bulletin.beforeNextOperation).toBe(false);

  expect((await api.supervisor.delete(`/api/bulletins/${made.id}`)).status).toBe(204);
  expectApiError(await api.admin.get(`/api/bulletins/${made.id}`), 404, 'not_found');

  const audit = await api.admin.get(`/api/audit?entity=bulletin&q=ORW-T-100`);
  expect(audit.status).toBe(200);
  const actions = audit.body.entries
    .filter((e: { entityId: string }) => e.entityId === made.id)
    .map((e: { action: string }) => e.action)
    .sort();
  expect(actions).toEqual(['create', 'delete', 'update']);
});

test('a bulletin applies to the rides of its maker and models, case and spaces ignored', async () => {
  const b = await create();
  // Skylark is "Orrin Ride Works" / "PX-15": matched; Tidebreaker (RX-30) and Little Kite (PX-6) are not.
  const detail = await api.admin.get(`/api/bulletins/${b.id}`);
  expect(detail.body.rides.map((r: RideBulletin) => r.rideName)).toEqual(['Skylark']);
  expect(detail.body.bulletin).toMatchObject({ rideCount: 1, doneCount: 0 });
  const onSkylark = (await rideBulletins(api.admin, skylark.id)).find((r) => r.bulletin.id === b.id);
  expect(onSkylark).toMatchObject({ state: 'open', done: null });
  expect((await rideBulletins(api.admin, tidebreaker.id)).map((r) => r.bulletin.id)).not.toContain(b.id);

  // Past its deadline and not done: overdue; "before the next operation" is overdue while open.
  const late = await create({ deadlineOn: '2026-03-02' });
  const now = await create({ deadlineOn: null, beforeNextOperation: true });
  const states = new Map((await rideBulletins(api.admin, skylark.id)).map((r) => [r.bulletin.id, r.state]));
  expect(states.get(late.id)).toBe('overdue');
  expect(states.get(now.id)).toBe('overdue');
});

test('operators see the bulletins of their own rides only, and read those bulletins’ PDFs', async () => {
  const pdf = await storedPdf('Service bulletin: PX-15 hanger pins.');
  const mine = await create({ documentSha256: pdf.hash });
  const rx30 = await create({ models: ['RX-30'] });

  const list = await api.operator.get('/api/bulletins?pageSize=200');
  const ids = list.body.bulletins.map((b: Bulletin) => b.id);
  expect(ids).toContain(mine.id);
  expect(ids).not.toContain(rx30.id);
  // The demo's bulletin for PX-15 and PX-6 shows the operator their Skylark, never Corvane's Little Kite.
  const shared = list.body.bulletins.find((b: Bulletin) => b.reference === 'ORW-SB-26-04');
  expect(shared.rideCount).toBe(1);
  const sharedDetail = await api.operator.get(`/api/bulletins/${shared.id}`);
  expect(sharedDetail.body.rides.map((r: RideBulletin) => r.rideName)).toEqual(['Skylark']);

  expectApiError(await api.operator.get(`/api/bulletins/${rx30.id}`), 404, 'not_found');
  expectApiError(await api.operator.get(`/api/rides/${tidebreaker.id}/bulletins`), 404, 'not_found');
  expect((await rideBulletins(api.operator, skylark.id)).map((r) => r.bulletin.id)).toContain(mine.id);

  const got = await asBytes(api.operator.get(`/api/documents/${pdf.hash}`));
  expect(got.status).toBe(200);
  expect(sha256Hex(got.body as Buffer)).toBe(pdf.hash);
  // Corvane runs no PX-15: the same PDF is not theirs to read.
  expectApiError(await api.operator2.get(`/api/documents/${pdf.hash}`), 403, 'forbidden');
  expectApiError(
    await api.operator.post(`/api/rides/${skylark.id}/bulletins/${mine.id}/done`, {
      on: '2026-04-01',
      note: 'x',
    }),
    403,
    'forbidden',
  );
});

test('a supervisor records a bulletin done on a ride, with a note; refusals change nothing', async () => {
  const b = await create();
  const before = actionCount();
  const path = `/api/rides/${skylark.id}/bulletins/${b.id}/done`;
  expect(
    expectApiError(await api.supervisor.post(path, { on: '2026-04-01' }), 400, 'validation_failed')
      .issues?.[0].path,
  ).toBe('note');
  expect(
    expectApiError(
      await api.supervisor.post(path, { on: '2999-01-01', note: 'Seen' }),
      400,
      'validation_failed',
    ).issues?.[0].path,
  ).toBe('on');
  expectApiError(
    await api.supervisor.post(`/api/rides/${tidebreaker.id}/bulletins/${b.id}/done`, {
      on: '2026-04-01',
      note: 'Seen',
    }),
    409,
    'not_applicable',
  );
  expectApiError(await api.inspector.post(path, { on: '2026-04-01', note: 'Seen' }), 403, 'forbidden');
  expect(actionCount()).toBe(before);

  const res = await api.supervisor.post(path, {
    on: '2026-04-01',
    note: 'Springs seen fitted on all 24 seats',
  });
  expect(res.status).toBe(201);
  expect(res.body.bulletin).toMatchObject({
    state: 'done',
    done: { outcome: 'done', on: '2026-04-01', byName: 'Mira Delacourt', inspectionId: null },
  });
  const seen = (await rideBulletins(api.operator, skylark.id)).find((r) => r.bulletin.id === b.id);
  expect(seen?.done?.note).toBe('Springs seen fitted on all 24 seats');
  expect((await api.admin.get(`/api/bulletins/${b.id}`)).body.bulletin).toMatchObject({
    rideCount: 1,
    doneCount: 1,
  });
  // Recorded against a ride, the bulletin stays in the register.
  expectApiError(await api.supervisor.delete(`/api/bulletins/${b.id}`), 409, 'in_use');
  const audit = await api.supervisor.get(`/api/audit?entity=bulletin_action&rideId=${skylark.id}`);
  expect(audit.body.entries.length).toBeGreaterThan(0);
});

test('the open bulletins reach the phone with the ride; a passed checklist item records the bulletin done', async () => {
  const passed = await create();
  const failed = await create();
  const first = await api.inspector.get('/api/sync/pull');
  const ride = first.body.rides.find((r: { id: string }) => r.id === skylark.id);
  const open = ride.openBulletins.map((b: { id: string }) => b.id);
  expect(open).toEqual(expect.arrayContaining([passed.id, failed.id]));
  expect(
    first.body.rides
      .find((r: { id: string }) => r.id === tidebreaker.id)
      .openBulletins.map((b: { id: string }) => b.id),
  ).not.toContain(passed.id);

  const record = makeRecord(skylark, {
    checklist: [
      ...makeRecord(skylark).checklist,
      {
        itemId: bulletinItemId(passed.id),
        area: 'Maker bulletins',
        text: `Bulletin ${passed.reference}`,
        result: 'pass',
      },
      {
        itemId: bulletinItemId(failed.id),
        area: 'Maker bulletins',
        text: `Bulletin ${failed.reference}`,
        result: 'fail',
        note: 'Springs not delivered yet',
      },
    ],
  });
  const push = await api.inspector.push([record]);
  expect(push.body.results[0]).toMatchObject({ status: 'accepted' });

  const states = new Map((await rideBulletins(api.supervisor, skylark.id)).map((r) => [r.bulletin.id, r]));
  expect(states.get(passed.id)).toMatchObject({
    state: 'done',
    // The inspection's day at Tamsworth (Europe/London): submitted 2026-05-04T08:40Z.
    done: { on: '2026-05-04', byName: 'Tomas Reyne', inspectionId: record.id },
  });
  expect(states.get(failed.id)).toMatchObject({
    state: 'open',
    done: null,
    lastNotDone: { note: 'Springs not delivered yet', inspectionId: record.id },
  });

  // The next pull sends Skylark again without the bulletin now done.
  const next = await api.inspector.get(`/api/sync/pull?cursor=${encodeURIComponent(first.body.cursor)}`);
  const again = next.body.rides.find((r: { id: string }) => r.id === skylark.id);
  const stillOpen = again.openBulletins.map((b: { id: string }) => b.id);
  expect(stillOpen).toContain(failed.id);
  expect(stillOpen).not.toContain(passed.id);
});

test('a bulletin item for a bulletin that does not apply to the ride is refused at push, naming the item', async () => {
  const rx30 = await create({ models: ['RX-30'] });
  const before = actionCount();
  const base = makeRecord(skylark).checklist;
  const stray = makeRecord(skylark, {
    checklist: [
      ...base,
      { itemId: bulletinItemId(rx30.id), area: 'Maker bulletins', text: 'Bulletin', result: 'pass' },
    ],
  });
  const unknown = makeRecord(skylark, {
    checklist: [
      ...base,
      { itemId: bulletinItemId('no-such-bulletin'), area: 'Maker bulletins', text: 'B', result: 'pass' },
    ],
  });
  const res = await api.inspector.push([stray, unknown]);
  expect(res.body.results).toEqual([
    {
      id: stray.id,
      status: 'rejected',
      issues: [{ path: 'checklist.2.itemId', message: expect.stringMatching(/RX-30, not this ride/) }],
    },
    {
      id: unknown.id,
      status: 'rejected',
      issues: [{ path: 'checklist.2.itemId', message: expect.stringMatching(/No maker bulletin/) }],
    },
  ]);
  expect(actionCount()).toBe(before);
  expect(
    server.db.select().from(bulletinActions).where(eq(bulletinActions.bulletinId, rx30.id)).all(),
  ).toEqual([]);
});
