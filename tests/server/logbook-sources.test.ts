/**
 * The ride logbook's later sources (incident reports, part replacements, design documents, set-ups,
 * operators' daily checks, makers' bulletins), each record made through its own API on a pinned clock and
 * then read back through GET /api/rides/:id/logbook: the kind and id of each entry, newest first, the date
 * filter on the site's clock, and who sees what. The site day of an instant is checked against Intl's
 * IANA time-zone database (the platform's, not the app's `dayInZone`).
 */
import { desc, eq } from 'drizzle-orm';

import { designVersions } from '@/db/server/schema';
import { logbookPageSchema, type LogbookEvent } from '@/features/logbook/schema';
import type { InspectionRecord } from '@/features/records/schema';
import { pdfBytes, sha256Hex } from '@/tests/support/pdf-files';

import type { PhoneKey } from '../support/phone-keys';
import { expectApiError, pushSigned, registerPhoneKey, signInAs, userIdOf } from './helpers';
import { companyOfRide, makeNoticeServer, type NoticeServer } from './notices-fixtures';
import { demoRide, makeRecord } from './sync-fixtures';

jest.setTimeout(120_000);

const start = new Date('2026-05-04T08:00:00.000Z');
let s: NoticeServer;
let skylarkId: string;
let zone: string;
const ids: Record<string, string> = {};

const at = (hhmm: string) => s.setNow(new Date(`2026-05-04T${hhmm}:00.000Z`));
const newKinds = 'incident,part,setup,daily_check,bulletin,design';

/** The site day of an instant, by Intl (en-CA formats a date as YYYY-MM-DD). */
const intlDay = (iso: string) => new Intl.DateTimeFormat('en-CA', { timeZone: zone }).format(new Date(iso));

async function upload(text: string) {
  const pdf = await pdfBytes(text);
  expect((await s.api.supervisor.putBytes(`/api/documents/${sha256Hex(pdf)}`, pdf)).status).toBe(201);
  return sha256Hex(pdf);
}

beforeAll(async () => {
  s = await makeNoticeServer(start);
  const skylark = demoRide(s.db, 'Skylark');
  skylarkId = skylark.id;

  // An operator's incident report (its time typed on the site's clock, the day before), then its review.
  at('09:00');
  const incident = await s.api.operator.post(`/api/rides/${skylarkId}/incidents`, {
    kind: 'near_miss',
    occurredAt: '2026-05-03T12:00',
    what: 'Gondola gate swung open on the platform while unloading',
    ridersAffected: 2,
    anyoneHurt: false,
  });
  expect(incident.status).toBe(201);
  ids.incident = incident.body.incident.id;
  at('10:00');
  expect(
    (await s.api.supervisor.post(`/api/incidents/${ids.incident}/review`, { note: 'Gate latch renewed' }))
      .status,
  ).toBe(200);

  // A part fitted, with its certificate.
  at('11:00');
  const certificate = await upload('Certificate of conformity, gate latch GL-58.');
  ids.certificate = certificate;
  const part = await s.api.operator.post(`/api/rides/${skylarkId}/parts`, {
    component: 'Gondola gate latch',
    serialNumber: 'GL-58',
    maker: 'Harwick Latches',
    fittedOn: '2026-05-03',
    fittedBy: 'Ines Barlow (site fitter)',
    documents: [{ sha256: certificate, title: 'Certificate of conformity' }],
  });
  expect(part.status).toBe(201);
  ids.part = part.body.replacement.id;
  // The serial was mistyped: a later record corrects it (both stay).
  at('11:30');
  const correction = await s.api.operator.post(`/api/rides/${skylarkId}/parts`, {
    component: 'Gondola gate latch',
    serialNumber: 'GL-59',
    maker: 'Harwick Latches',
    fittedOn: '2026-05-03',
    fittedBy: 'Ines Barlow (site fitter)',
    correctsId: ids.part,
  });
  expect(correction.status).toBe(201);
  ids.correction = correction.body.replacement.id;

  // A document attached to the design version in force, then removed.
  at('12:00');
  const version = s.db
    .select({ version: designVersions.version })
    .from(designVersions)
    .where(eq(designVersions.rideId, skylarkId))
    .orderBy(desc(designVersions.version))
    .get()!.version;
  const manual = await upload('Skylark gate latch service sheet.');
  const attached = await s.api.supervisor.post(
    `/api/rides/${skylarkId}/design/versions/${version}/documents`,
    {
      sha256: manual,
      kind: 'other',
      title: 'Gate latch service sheet',
    },
  );
  expect(attached.status).toBe(201);
  ids.document = attached.body.document.id;
  at('12:30');
  expect(
    (
      await s.api.supervisor.delete(
        `/api/rides/${skylarkId}/design/versions/${version}/documents/${ids.document}`,
      )
    ).status,
  ).toBeLessThan(300);

  // A set-up planned at a new fairground.
  at('13:00');
  const site = await s.api.admin.post('/api/sites', {
    name: 'Wenlow common',
    kind: 'fairground',
    locality: 'Wenlow',
    timeZone: 'Europe/London',
    operatorCompanyId: companyOfRide(s.db, 'Skylark').id,
  });
  expect(site.status).toBe(201);
  const setup = await s.api.supervisor.post('/api/setups', {
    rideId: skylarkId,
    siteId: site.body.site.id,
    fromDate: '2026-06-01',
    toDate: '2026-06-14',
  });
  expect(setup.status).toBe(201);
  ids.setup = setup.body.setup.id;

  // The operator's daily check, pushed from their phone, with one failed item.
  at('14:00');
  const operatorId = userIdOf(s.db, 'operator@pivotwatch.test');
  const token = await signInAs(s.app, 'operator@pivotwatch.test');
  const key: PhoneKey = await registerPhoneKey(s.app, token);
  const check: InspectionRecord = makeRecord(
    { id: skylarkId, designVersionId: null },
    {
      type: 'daily_pre_opening',
      authorId: operatorId,
      readings: [],
      checklist: [
        { itemId: 'restraints', area: 'Before opening', text: 'Every restraint locks', result: 'pass' },
        { itemId: 'gates', area: 'Before opening', text: 'Gondola gates latch shut', result: 'fail' },
      ],
      testRuns: [{ cycles: 3, result: 'pass' }],
      submittedAt: '2026-05-04T14:00:00.000Z',
      declaration: {
        text: 'I made these checks before opening and recorded what I found.',
        declaredAt: '2026-05-04T14:00:00.000Z',
        declaredBy: operatorId,
        declaredByName: 'Priya Castellan',
      },
    },
  );
  const pushed = await pushSigned(s.app, token, key, [check]);
  expect(pushed.body.results).toEqual([{ id: check.id, status: 'accepted' }]);
  ids.dailyCheck = check.id;

  // A maker's bulletin for Skylark's model, recorded done by a supervisor.
  at('15:00');
  const bulletin = await s.api.supervisor.post('/api/bulletins', {
    maker: 'Orrin Rideworks',
    models: ['PX-15'],
    reference: 'ORW-LB-7',
    title: 'Gondola gate latch spring',
    issuedOn: '2026-04-01',
    severity: 'safety',
    requiredAction: 'Fit the stiffer gate latch spring',
    deadlineOn: '2026-12-31',
  });
  expect(bulletin.status).toBe(201);
  const done = await s.api.supervisor.post(
    `/api/rides/${skylarkId}/bulletins/${bulletin.body.bulletin.id}/done`,
    {
      on: '2026-05-03',
      note: 'Springs fitted to all gates',
    },
  );
  expect(done.status).toBe(201);
  at('16:00');
  zone = logbookPageSchema.parse((await s.api.supervisor.get(`/api/rides/${skylarkId}/logbook`)).body).ride
    .timeZone;
});
afterAll(() => s.close());

type Client = NoticeServer['api']['supervisor'];

async function all(client: Client, query = ''): Promise<LogbookEvent[]> {
  const out: LogbookEvent[] = [];
  for (let p = 1; ; p++) {
    const res = await client.get(`/api/rides/${skylarkId}/logbook?page=${p}${query}`);
    expect(res.status).toBe(200);
    const got = logbookPageSchema.parse(res.body);
    out.push(...got.events);
    if (p * got.pageSize >= got.total) return out;
  }
}

describe('each new kind of record', () => {
  test('appears once per event, with its kind, newest first', async () => {
    const events = await all(s.api.supervisor, `&kinds=${newKinds}`);
    // What this test made: everything on the pinned clock after its start (the demo's design data carries
    // the real clock's time), and the incident that happened the day before.
    const mine = events.filter(
      (e) =>
        (e.at > start.toISOString() && e.at <= s.now().toISOString()) || e.id === `incident:${ids.incident}`,
    );
    const idOf = (kind: string) => mine.find((e) => e.kind === kind)?.id;
    expect(mine.map((e) => e.id)).toEqual([
      idOf('bulletin'),
      `daily_check:${ids.dailyCheck}`,
      idOf('setup'),
      `design-document-removed:${ids.document}`,
      `design-document:${ids.document}`,
      `part:${ids.correction}`,
      `part:${ids.part}`,
      `incident-review:${ids.incident}`,
      `incident:${ids.incident}`,
    ]);
    // The whole list is newest first, by instant.
    const instants = events.map((e) => e.at);
    expect(instants).toEqual([...instants].sort().reverse());
    for (const e of events) expect(e.day).toBe(intlDay(e.at));

    const byId = new Map(mine.map((e) => [e.id, e]));
    expect(byId.get(`incident:${ids.incident}`)).toMatchObject({
      kind: 'incident',
      title: 'Near miss reported',
      who: 'Priya Castellan',
      link: { href: `/incidents/${ids.incident}` },
    });
    // The report's time was typed on the site's clock: it reads back as that day there.
    expect(byId.get(`incident:${ids.incident}`)?.day).toBe('2026-05-03');
    expect(byId.get(`incident-review:${ids.incident}`)?.detail).toContain('Note: Gate latch renewed');
    const part = byId.get(`part:${ids.part}`)!;
    expect(part).toMatchObject({ kind: 'part', who: 'Priya Castellan' });
    expect(part.title).toContain('GL-58');
    expect(part.detail.join('\n')).toContain('Harwick Latches');
    expect(part.detail.join('\n')).toContain('Ines Barlow');
    expect(part.documents).toEqual([
      expect.objectContaining({
        label: 'Certificate of conformity',
        apiPath: `/api/documents/${ids.certificate}`,
      }),
    ]);
    expect(part.detail).toContain(`Corrected by a later record (${intlDay('2026-05-04T11:30:00.000Z')})`);
    expect(byId.get(`part:${ids.correction}`)?.detail.join('\n')).toContain(
      'Corrects the record of GL-58 fitted',
    );
    expect(byId.get(`design-document:${ids.document}`)?.kind).toBe('design');
    expect(mine.find((e) => e.kind === 'setup')?.title).toContain('Wenlow common');
    const daily = byId.get(`daily_check:${ids.dailyCheck}`)!;
    expect(daily).toMatchObject({ kind: 'daily_check', who: 'Priya Castellan' });
    expect(daily.detail.join('\n')).toContain('Gondola gates latch shut');
    expect(mine.find((e) => e.kind === 'bulletin')?.title).toContain('ORW-LB-7');
  });

  test('the certificate an entry lists is served to the operator', async () => {
    const part = (await all(s.api.operator, '&kinds=part')).find((e) => e.id === `part:${ids.part}`);
    expect(part?.documents).toHaveLength(1);
    expect((await s.api.operator.get(part!.documents[0].apiPath)).status).toBe(200);
  });

  test('a daily check is listed as a daily check, not as an inspection', async () => {
    const inspections = await all(s.api.supervisor, '&kinds=inspection');
    expect(inspections.some((e) => e.id.endsWith(ids.dailyCheck))).toBe(false);
    expect(inspections.every((e) => !e.title.toLowerCase().includes('daily'))).toBe(true);
  });
});

describe('date filter', () => {
  test('the site day of each entry decides; the incident belongs to the day it happened', async () => {
    const everything = await all(s.api.supervisor, `&kinds=${newKinds}`);
    for (const day of ['2026-05-03', '2026-05-04']) {
      const got = await all(s.api.supervisor, `&kinds=${newKinds}&from=${day}&to=${day}`);
      expect(got.map((e) => e.id)).toEqual(everything.filter((e) => e.day === day).map((e) => e.id));
    }
    const before = await all(s.api.supervisor, `&kinds=incident&to=2026-05-03`);
    expect(before.map((e) => e.id)).toContain(`incident:${ids.incident}`);
    expect(before.map((e) => e.id)).not.toContain(`incident-review:${ids.incident}`);
  });
});

describe('scope', () => {
  test('an operator sees their ride’s new records, but not the design documents’ history', async () => {
    const events = await all(s.api.operator, `&kinds=${newKinds}`);
    const kinds = new Set(events.map((e) => e.kind));
    for (const k of ['incident', 'part', 'setup', 'daily_check', 'bulletin']) expect(kinds).toContain(k);
    expect(kinds).not.toContain('design');
    // Links lead only where an operator may go: the bulletin register and review screens are staff's.
    for (const e of events) expect(e.link?.href ?? '/').not.toMatch(/^\/(review|register)\//);
    expect(events.some((e) => e.id.includes(ids.document))).toBe(false);
  });

  test('an operator of another company gets 404 for the ride', async () => {
    expectApiError(
      await s.api.operator2.get(`/api/rides/${skylarkId}/logbook?kinds=incident`),
      404,
      'not_found',
    );
  });

  test('an inspector sees the ride’s new records and the design documents', async () => {
    const kinds = new Set((await all(s.api.inspector, `&kinds=${newKinds}`)).map((e) => e.kind));
    for (const k of ['incident', 'part', 'setup', 'daily_check', 'bulletin', 'design'])
      expect(kinds).toContain(k);
  });
});
