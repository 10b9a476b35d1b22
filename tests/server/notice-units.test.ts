/**
 * Per company: the units and paper of its notices. An operator company set to US customary on Letter gets
 * notices whose figures are in lbf/kip, in, ksi… and whose PDF (download and e-mail attachment) is Letter;
 * the notice keeps both when the company changes its choice later; a company left alone stays SI on A4.
 *
 * Figures are read back from the notice's strings and converted to SI with the exact definitions, not
 * with the project's factor table:
 * - international yard and pound agreement of 1959: 1 in = 0.0254 m, 1 ft = 0.3048 m, 1 lb = 0.453 592 37 kg;
 * - CGPM 1901 standard gravity 9.806 65 m/s², so 1 lbf = 4.448 221 615 260 5 N (NIST SP 811, 2008, App. B);
 * - NIST SP 811 App. B: 1 kip = 1000 lbf, 1 psi = 1 lbf/in², 1 ksi = 1000 psi.
 * Paper: A4 is 210 × 297 mm (ISO 216) = 595.28 × 841.89 pt; US Letter 8.5 × 11 in = 612 × 792 pt.
 */
import { eq, sql } from 'drizzle-orm';
import request from 'supertest';

import { auditLog } from '@/db/server/schema';
import { notices } from '@/db/server/notices';
import { noticeDetailSchema, type NoticeDocument } from '@/features/notices/schema';
import { fixtureNotice } from '@/scripts/sample-notice';
import { limitResults } from '@/tests/server/support/limit-notice';

import { signInAs } from './helpers';
import {
  approveAndIssue,
  companyOfRide,
  inspectWithFindings,
  makeNoticeServer,
  pdfText,
  type NoticeServer,
} from './notices-fixtures';

jest.setTimeout(120_000);

const LBF_N = 0.45359237 * 9.80665; // 4.4482216152605 N exactly
const IN_M = 0.0254;
const FT_M = 0.3048;
/** SI per shown unit, from the definitions above (not from lib/unit-factors.generated.ts). */
const US_TO_SI: Record<string, number> = {
  lbf: LBF_N,
  kip: 1000 * LBF_N,
  'lbf·ft': LBF_N * FT_M,
  'kip·ft': 1000 * LBF_N * FT_M,
  in: IN_M,
  ft: FT_M,
  lb: 0.45359237,
  psi: LBF_N / IN_M ** 2,
  ksi: (1000 * LBF_N) / IN_M ** 2,
};
const SI_TO_SI: Record<string, number> = {
  N: 1,
  kN: 1000,
  'N·m': 1,
  'kN·m': 1000,
  mm: 0.001,
  m: 1,
  kg: 1,
  t: 1000,
  kPa: 1000,
  MPa: 1e6,
};
/** Units both systems share. */
const SHARED: Record<string, number> = {
  rpm: (2 * Math.PI) / 60,
  g: 9.80665,
  '°': Math.PI / 180,
  s: 1,
  Hz: 1,
  'rad/s²': 1,
};

/** "47.21 kip (at the limit)" → its number, decimals and unit. */
function parseFigure(text: string) {
  const m = /^(-?\d+(?:\.(\d+))?)\s?([^\s(]+)/.exec(text);
  if (!m) throw new Error(`not a figure: ${text}`);
  return { value: Number(m[1]), decimals: m[2]?.length ?? 0, unit: m[3] };
}

/** Every result's shown value is its SI value in a unit of the system, to within half its last digit. */
function expectFiguresIn(doc: NoticeDocument, table: Record<string, number>) {
  const shown = doc.results.filter((r) => r.measured);
  expect(shown.length).toBeGreaterThan(0);
  for (const r of shown) {
    const f = parseFigure(r.value);
    const factor = table[f.unit] ?? SHARED[f.unit];
    if (factor === undefined) throw new Error(`${r.label}: "${r.value}" is not in this notice's units`);
    const half = 0.5 * 10 ** -f.decimals * factor;
    // 1e-8 relative: mathjs's kip is 4448.2216 N, 3.4e-9 below 1000 lbf (tests/engine/unit-factors).
    expect(Math.abs(f.value * factor - r.measured!.valueSI)).toBeLessThanOrEqual(
      half * (1 + 1e-9) + 1e-8 * Math.abs(r.measured!.valueSI),
    );
  }
  for (const l of doc.loadSummary) {
    const f = parseFigure(l.peakForce);
    expect(table[f.unit]).toBeDefined();
  }
}

/** Page boxes as written in the page dictionaries (PDF 32000-1:2008 §7.7.3.3, /MediaBox). */
const mediaBoxes = (pdf: Buffer) =>
  [...pdf.toString('latin1').matchAll(/\/MediaBox \[([^\]]+)\]/g)].map((m) =>
    m[1].trim().split(/\s+/).map(Number),
  );
function expectPaper(pdf: Buffer, width: number, height: number) {
  const boxes = mediaBoxes(pdf);
  expect(boxes.length).toBeGreaterThan(0);
  for (const [x0, y0, x1, y1] of boxes) {
    expect([x0, y0]).toEqual([0, 0]);
    expect(x1).toBeCloseTo(width, 2);
    expect(y1).toBeCloseTo(height, 2);
  }
}

describe('the notice’s results in US customary units, by the issuer’s own resultsOf', () => {
  // Invented values at and just past their limits (tests/support/limit-values.ts): a pin typed as
  // "139.05" and "139.0" mm against a 139 mm minimum, a clearance "0.50" mm against 0.5 mm, and a pivot
  // force of 210 000.3 N against 210 000 N.
  const us = limitResults('us');
  const si = limitResults('si');

  test('are the SI values converted by the definitions, with the typed precision carried over', () => {
    expectFiguresIn({ ...fixtureNotice, results: us, loadSummary: [] }, US_TO_SI);
    expectFiguresIn({ ...fixtureNotice, results: si, loadSummary: [] }, SI_TO_SI);
    const pin = us.find((r) => r.label === 'Main pivot: pin diameter (wear)')!;
    // 139.05 mm ÷ 25.4 = 5.474 409… in; typed to 0.01 mm = 0.000 39 in, so four decimals (rule 3 of
    // lib/measured-format.ts): 5.4744 in.
    expect(pin.value).toBe('5.4744 in');
    expect(si.find((r) => r.label === pin.label)!.value).toBe('139.05 mm');
  });

  test('never round a value onto or across its limit, in either system', () => {
    for (const results of [us, si])
      for (const r of results) {
        const value = parseFigure(r.value).value;
        const limit = parseFigure(r.limit.replace(/^[≤≥] /, '')).value;
        if (r.value.includes('(at the limit)')) expect(value).toBe(limit);
        else if (r.status === 'over')
          expect(r.limit.startsWith('≤') ? value > limit : value < limit).toBe(true);
        else expect(r.limit.startsWith('≤') ? value < limit : value > limit).toBe(true);
      }
    // 210 000.3 N over 210 000 N: 47.210 kip against 47.2099 kip (1 kip = 4448.2216… N).
    const force = us.find((r) => r.label === 'Main pivot: peak pivot force')!;
    expect(force.status).toBe('over');
    expect(parseFigure(force.value).unit).toBe('kip');
  });
});

let s: NoticeServer;
let token: string;
beforeAll(async () => {
  s = await makeNoticeServer(new Date('2026-05-04T08:00:00Z'));
  token = await signInAs(s.app, 'supervisor@pivotwatch.test');
});
afterAll(() => s.close());

const getPdf = (id: string, size?: string) =>
  request(s.app)
    .get(`/api/notices/${id}/pdf${size ? `?size=${size}` : ''}`)
    .set('Authorization', `Bearer ${token}`)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
const getNotice = async (id: string) => {
  const res = await s.api.supervisor.get(`/api/notices/${id}`);
  expect(res.status).toBe(200);
  return noticeDetailSchema.parse(res.body.notice);
};

describe('the company register', () => {
  test('keeps each company’s notice units and paper, SI and A4 unless chosen, and refuses other values', async () => {
    const pier = companyOfRide(s.db, 'Skylark');
    const read = await s.api.admin.get(`/api/companies/${pier.id}`);
    expect(read.body.company).toMatchObject({ noticeUnits: 'si', noticePaper: 'A4' });

    const bad = await s.api.admin.patch(`/api/companies/${pier.id}`, { noticeUnits: 'imperial' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues.map((i: { path: string }) => i.path)).toContain('noticeUnits');
    const badPaper = await s.api.admin.patch(`/api/companies/${pier.id}`, { noticePaper: 'A3' });
    expect(badPaper.status).toBe(400);
    expect((await s.api.admin.get(`/api/companies/${pier.id}`)).body.company).toMatchObject({
      noticeUnits: 'si',
      noticePaper: 'A4',
    });
    // Only administrators keep the register.
    expect((await s.api.supervisor.patch(`/api/companies/${pier.id}`, { noticeUnits: 'us' })).status).toBe(
      403,
    );

    const created = await s.api.admin.post('/api/companies', { name: 'Brindlecombe Amusements' });
    expect(created.status).toBe(201);
    expect(created.body.company).toMatchObject({ noticeUnits: 'si', noticePaper: 'A4' });
  });
});

describe('a company on US customary and Letter', () => {
  let id: string;
  let issued: NoticeDocument;
  let letterPdf: Buffer;
  beforeAll(async () => {
    const pier = companyOfRide(s.db, 'Skylark');
    const set = await s.api.admin.patch(`/api/companies/${pier.id}`, {
      noticeUnits: 'us',
      noticePaper: 'LETTER',
    });
    expect(set.status).toBe(200);
    expect(set.body.company).toMatchObject({ noticeUnits: 'us', noticePaper: 'LETTER' });
    const inspected = await inspectWithFindings(
      s,
      'Skylark',
      [{ severity: 'fix_by_date', description: 'Gondola step edge worn', dueOn: '2026-05-30' }],
      0,
    );
    id = approveAndIssue(s, inspected.inspectionId).id;
    issued = (await getNotice(id)).document;
  });

  test('the change is audited with the company', () => {
    const pier = companyOfRide(s.db, 'Skylark');
    const entries = s.db.select().from(auditLog).where(eq(auditLog.entityId, pier.id)).all();
    const change = entries.find((e) => e.action === 'update');
    expect(change?.before).toMatchObject({ noticeUnits: 'si', noticePaper: 'A4' });
    expect(change?.after).toMatchObject({ noticeUnits: 'us', noticePaper: 'LETTER' });
  });

  test('issues a notice frozen in US customary units and on Letter, its figures the SI values converted', () => {
    expect(issued.units).toBe('us');
    expect(issued.paper).toBe('LETTER');
    expectFiguresIn(issued, US_TO_SI);
    // Skylark's pivots carry tens of kN: a US engineer reads them in kip (common practice).
    expect(issued.loadSummary.length).toBeGreaterThan(0);
    for (const l of issued.loadSummary) expect(l.peakForce).toMatch(/ (kip|lbf)\b/);
    const all = JSON.stringify([issued.results.map((r) => [r.value, r.limit]), issued.loadSummary]);
    expect(all).not.toMatch(/\d (kN|N|mm|MPa|kN·m|kg)\b/);
    // The caution stays.
    expect(issued.caution.length).toBeGreaterThan(50);
  });

  test('its PDF is on Letter, says its units, prints the figures and the caution', async () => {
    const res = await getPdf(id);
    expect(res.status).toBe(200);
    letterPdf = res.body as Buffer;
    expectPaper(letterPdf, 612, 792);
    const text = await pdfText(letterPdf);
    expect(text).toContain('Figures in US customary units');
    expect(text).toContain(issued.loadSummary[0].peakForce);
    expect(text).toContain('SAFETY CAUTION');
    // The other paper stays a choice for printing.
    const a4 = await getPdf(id, 'A4');
    expectPaper(a4.body as Buffer, 595.28, 841.89);
  });

  test('its e-mail says its units and attaches the Letter PDF', async () => {
    const run = await s.deliver();
    expect(run.sent).toBeGreaterThan(0);
    const mail = s.fake.list().find((m) => m.subject.includes(issued.reference));
    const message = await s.fake.get(mail!.id);
    expectPaper(message!.attachments[0].content, 612, 792);
    expect(Buffer.compare(message!.attachments[0].content, letterPdf)).toBe(0);
    const concerning = issued.results.filter((r) => r.status !== 'within');
    if (concerning.length > 0) {
      expect(message?.text).toContain('Figures in US customary units');
      expect(message?.text).toContain(concerning[0].value);
    }
  });

  test('a later change of the company leaves the issued notice, its PDF and its paper as they were', async () => {
    const pier = companyOfRide(s.db, 'Skylark');
    const back = await s.api.admin.patch(`/api/companies/${pier.id}`, {
      noticeUnits: 'si',
      noticePaper: 'A4',
    });
    expect(back.status).toBe(200);
    expect((await getNotice(id)).document).toEqual(issued);
    const again = await getPdf(id);
    expectPaper(again.body as Buffer, 612, 792);
    expect(Buffer.compare(again.body as Buffer, letterPdf)).toBe(0);

    // The next notice follows the company's new choice.
    const inspected = await inspectWithFindings(
      s,
      'Skylark',
      [{ severity: 'note', description: 'Queue line rope frayed' }],
      0,
    );
    const next = (await getNotice(approveAndIssue(s, inspected.inspectionId).id)).document;
    expect(next).toMatchObject({ units: 'si', paper: 'A4' });
    expectFiguresIn(next, SI_TO_SI);
  });
});

describe('a company left on SI and A4', () => {
  test('issues notices as before: SI figures, an A4 PDF', async () => {
    const inspected = await inspectWithFindings(
      s,
      'Tidebreaker',
      [{ severity: 'fix_by_date', description: 'Handrail paint chipped', dueOn: '2026-05-30' }],
      0,
    );
    const id = approveAndIssue(s, inspected.inspectionId).id;
    const doc = (await getNotice(id)).document;
    expect(doc).toMatchObject({ units: 'si', paper: 'A4' });
    expectFiguresIn(doc, SI_TO_SI);
    for (const l of doc.loadSummary) expect(l.peakForce).toMatch(/ k?N\b/);
    const pdf = (await getPdf(id)).body as Buffer;
    expectPaper(pdf, 595.28, 841.89);
    expect(await pdfText(pdf)).toContain('Figures in SI units');
  });

  test('a notice issued before the choice existed reads as SI on A4', async () => {
    const inspected = await inspectWithFindings(
      s,
      'Tidebreaker',
      [{ severity: 'note', description: 'Fence panel loose' }],
      0,
    );
    const id = approveAndIssue(s, inspected.inspectionId).id;
    s.db.run(
      sql`UPDATE ${notices} SET document = json_remove(document, '$.units', '$.paper') WHERE id = ${id}`,
    );
    const doc = (await getNotice(id)).document;
    expect(doc.units).toBeUndefined();
    expectPaper((await getPdf(id)).body as Buffer, 595.28, 841.89);
  });
});
