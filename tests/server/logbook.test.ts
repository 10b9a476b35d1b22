/**
 * The ride logbook (GET /api/rides/:id/logbook, .csv, .pdf) over the demo scenario plus a history made
 * through the API on a pinned clock: an inspection, findings, the decision and its notice, the operator's
 * acknowledgement and corrective action, closing and reopening, a status change. Checks the order, each
 * source, the filters, paging, each role's scope, bad queries, the CSV against RFC 4180 and the PDF as an
 * independent reader (pdf-parse, on Mozilla's pdf.js) reads it.
 */
import { execFileSync } from 'node:child_process';
import path from 'node:path';

import request from 'supertest';

import { logbookPageSchema, type LogbookEvent, type LogbookPage } from '@/features/logbook/schema';
import { CAUTION_FULL } from '@/lib/caution-text';

import { expectApiError } from './helpers';
import { makeNoticeServer, type NoticeServer } from './notices-fixtures';
import { demoRide, makeRecord, speedReading } from './sync-fixtures';

jest.setTimeout(120_000);

const start = new Date('2026-05-04T09:00:00.000Z');
let s: NoticeServer;
let skylarkId: string;
let tidebreakerId: string;
let inspectionId: string;
let otherInspectionId: string;
let pendingFindingText: string;

const at = (hhmm: string) => s.setNow(new Date(`2026-05-04T${hhmm}:00.000Z`));

beforeAll(async () => {
  s = await makeNoticeServer(start);
  const skylark = demoRide(s.db, 'Skylark');
  skylarkId = skylark.id;
  tidebreakerId = demoRide(s.db, 'Tidebreaker').id;

  const record = makeRecord(skylark, { readings: [speedReading(11.5)] });
  inspectionId = record.id;
  expect((await s.api.inspector.push([record])).body.results[0]).toMatchObject({ status: 'accepted' });
  // Another inspector's inspection of the same ride, left undecided, with a finding the operator must not see.
  const other = makeRecord(skylark, {
    readings: [speedReading(11.4)],
    submittedAt: '2026-05-04T08:50:00.000Z',
  });
  otherInspectionId = other.id;
  const inspector2 = s.api.as('inspector2@pivotwatch.test');
  expect((await inspector2.push([other])).body.results[0]).toMatchObject({ status: 'accepted' });

  at('10:00');
  const f1 = await s.api.supervisor.post(`/api/inspections/${inspectionId}/findings`, {
    severity: 'fix_by_date',
    description: 'Step edge worn, "lip" raised',
    requiredAction: 'Replace the step edge, then report',
    dueOn: '2026-05-30',
  });
  expect(f1.status).toBe(201);
  pendingFindingText = 'Drive cover bolt, missing washer';
  expect(
    (
      await s.api.supervisor.post(`/api/inspections/${otherInspectionId}/findings`, {
        severity: 'note',
        description: pendingFindingText,
      })
    ).status,
  ).toBe(201);

  at('11:00');
  const decided = await s.api.supervisor.post(`/api/inspections/${inspectionId}/decision`, {
    decision: 'approve',
    note: 'Fine apart from the step edge',
  });
  expect(decided.status).toBe(200);
  const noticeId = decided.body.notice.id as string;

  at('12:00');
  expect((await s.api.operator.post(`/api/notices/${noticeId}/acknowledge`)).status).toBe(200);
  at('13:00');
  const findingId = f1.body.finding?.id ?? f1.body.id;
  expect(
    (
      await s.api.operator.post(`/api/findings/${findingId}/actions`, {
        note: 'New edge fitted, torque 40 N·m',
      })
    ).status,
  ).toBe(201);
  at('14:00');
  expect(
    (
      await s.api.supervisor.post(`/api/findings/${findingId}/close`, {
        note: 'New edge seen fitted',
        evidenceRef: 'Work order 4411',
      })
    ).status,
  ).toBe(200);
  at('15:00');
  expect(
    (await s.api.supervisor.post(`/api/findings/${findingId}/reopen`, { note: 'Edge loose again' })).status,
  ).toBe(200);
  at('16:00');
  expect(
    (
      await s.api.supervisor.post(`/api/rides/${skylarkId}/status`, {
        status: 'restricted',
        reason: 'Step closed until the edge is fixed',
      })
    ).status,
  ).toBe(200);
  at('17:00');
});
afterAll(() => s.close());

type Client = NoticeServer['api']['supervisor'];

async function page(client: Client, query = ''): Promise<LogbookPage> {
  const res = await client.get(`/api/rides/${skylarkId}/logbook${query}`);
  expect(res.status).toBe(200);
  return logbookPageSchema.parse(res.body);
}

/** Every entry, page by page. */
async function all(client: Client, query = ''): Promise<LogbookEvent[]> {
  const out: LogbookEvent[] = [];
  const sep = query ? '&' : '?';
  for (let p = 1; ; p++) {
    const got = await page(client, `${query}${sep}page=${p}`);
    out.push(...got.events);
    if (out.length >= got.total || got.events.length === 0) return out;
  }
}

const kindsOf = (events: LogbookEvent[]) => new Set(events.map((e) => e.kind));

describe('what the logbook holds', () => {
  test('a supervisor sees every source, newest first (compared as instants, not as text)', async () => {
    const events = await all(s.api.supervisor);
    expect(kindsOf(events)).toEqual(
      new Set([
        'inspection',
        'decision',
        'finding',
        'corrective_action',
        'notice',
        'ndt',
        'design',
        'status',
      ]),
    );
    for (let i = 1; i < events.length; i++)
      expect(Date.parse(events[i - 1].at)).toBeGreaterThanOrEqual(Date.parse(events[i].at));
    const titles = events.map((e) => e.title);
    expect(titles).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^Status: In service → Restricted$/),
        expect.stringMatching(/^Finding \d+ reopened$/),
        expect.stringMatching(/^Finding \d+ verified and closed$/),
        expect.stringMatching(/^Corrective action reported on finding \d+$/),
        expect.stringMatching(/^Inspection notice PW-2026-\d{4} acknowledged$/),
        expect.stringMatching(/^Inspection notice PW-2026-\d{4} issued to Tamsworth Pier Leisure$/),
        expect.stringMatching(/inspection approved$/),
        expect.stringMatching(/^Finding \d+ raised — Fix by date$/),
        expect.stringMatching(/inspection submitted$/),
      ]),
    );
    // The day's history in the order it was made: the status change last, the submission first.
    const today = events.filter((e) => e.day === '2026-05-04');
    expect(today[0].kind).toBe('status');
    expect(today[0].who).toBe('Mira Delacourt');
    const closed = events.find((e) => /verified and closed/.test(e.title));
    expect(closed?.detail).toEqual(['Verifier’s note: New edge seen fitted', 'Evidence: Work order 4411']);
    const submitted = events.find((e) => e.id === `inspection:${inspectionId}`);
    expect(submitted?.link?.href).toBe(`/review/${inspectionId}`);
    expect(submitted?.documents[0].apiPath).toBe(`/api/inspections/${inspectionId}/report.pdf`);
  });

  test('the report each inspection entry offers is one the report route serves that person', async () => {
    const events = await all(s.api.inspector, '?kinds=inspection');
    expect(events.length).toBeGreaterThan(0);
    for (const e of events.slice(0, 3)) {
      const res = await s.api.inspector.get(e.documents[0].apiPath);
      expect(res.status).toBe(200);
    }
  });
});

describe('scope', () => {
  test('an operator of another company gets 404 for the ride, its CSV and its PDF', async () => {
    for (const suffix of ['logbook', 'logbook.csv', 'logbook.pdf'])
      expectApiError(await s.api.operator2.get(`/api/rides/${skylarkId}/${suffix}`), 404, 'not_found');
    expect((await s.api.operator2.get(`/api/rides/${tidebreakerId}/logbook`)).status).toBe(200);
  });

  test('an operator sees notices, their findings, corrective actions, NDT and status — nothing internal', async () => {
    const events = await all(s.api.operator);
    const kinds = kindsOf(events);
    for (const k of ['notice', 'finding', 'corrective_action', 'ndt', 'status']) expect(kinds).toContain(k);
    for (const k of ['inspection', 'decision', 'design']) expect(kinds).not.toContain(k);
    // A finding on an inspection still under review is on no notice: not theirs to see yet.
    expect(JSON.stringify(events)).not.toContain(pendingFindingText);
    expect(JSON.stringify(await all(s.api.supervisor))).toContain(pendingFindingText);
    // Links lead only where an operator may go.
    for (const e of events) expect(e.link?.href ?? '/').not.toMatch(/^\/review\//);
    // Asking for internal kinds by name changes nothing.
    expect((await page(s.api.operator, '?kinds=inspection,decision,design')).total).toBe(0);
  });

  test('an inspector sees their own inspections and decisions only, as everywhere else', async () => {
    const events = await all(s.api.inspector, '?kinds=inspection,decision');
    expect(events.some((e) => e.id === `inspection:${inspectionId}`)).toBe(true);
    expect(events.some((e) => e.id === `inspection:${otherInspectionId}`)).toBe(false);
    for (const e of events.filter((x) => x.kind === 'inspection')) expect(e.who).toBe('Tomas Reyne');
    // No review-desk links for an inspector.
    for (const e of events) expect(e.link).toBeNull();
    const theirs = await all(s.api.as('inspector2@pivotwatch.test'), '?kinds=inspection');
    expect(theirs.some((e) => e.id === `inspection:${otherInspectionId}`)).toBe(true);
  });

  test('no session: 401', async () => {
    expectApiError(await s.api.anonymous.get(`/api/rides/${skylarkId}/logbook`), 401, 'unauthorized');
  });
});

describe('filters and paging', () => {
  test('by kind', async () => {
    const events = await all(s.api.supervisor, '?kinds=notice,status');
    expect(events.length).toBeGreaterThanOrEqual(4);
    expect(kindsOf(events)).toEqual(new Set(['notice', 'status']));
  });

  test('by site day, both ends inclusive', async () => {
    const every = await all(s.api.supervisor);
    const today = await all(s.api.supervisor, '?from=2026-05-04&to=2026-05-04');
    expect(today.length).toBeGreaterThan(5);
    expect(today.every((e) => e.day === '2026-05-04')).toBe(true);
    expect(today).toEqual(every.filter((e) => e.day === '2026-05-04'));
    const before = await all(s.api.supervisor, '?to=2026-05-03');
    expect(before.every((e) => e.day <= '2026-05-03')).toBe(true);
    expect(before.length + today.length).toBe(every.filter((e) => e.day <= '2026-05-04').length);
  });

  test('by text: every word, case and accents ignored', async () => {
    const events = await all(s.api.supervisor, `?q=${encodeURIComponent('STEP édge')}`);
    expect(events.length).toBeGreaterThanOrEqual(3);
    for (const e of events)
      expect([e.title, ...e.detail, e.who].join(' ').toLowerCase()).toMatch(
        /step[\s\S]*edge|edge[\s\S]*step/,
      );
    expect((await page(s.api.supervisor, '?q=nothing-like-this')).total).toBe(0);
  });

  test('pages of 25 that together are the whole list, in order, without repeats', async () => {
    // Enough entries for three pages: notes written on the inspection still under review.
    for (let i = 1; i <= 40; i++)
      expect(
        (
          await s.api.supervisor.post(`/api/inspections/${otherInspectionId}/findings`, {
            severity: 'note',
            description: `Paint chip ${i} on the arm`,
          })
        ).status,
      ).toBe(201);
    const first = await page(s.api.supervisor);
    expect(first.pageSize).toBe(25);
    expect(first.events).toHaveLength(25);
    expect(first.total).toBeGreaterThan(25);
    const second = await page(s.api.supervisor, '?page=2');
    expect(second.events[0].id).not.toBe(first.events[0].id);
    const joined = await all(s.api.supervisor);
    expect(joined).toHaveLength(first.total);
    expect(new Set(joined.map((e) => e.id)).size).toBe(first.total);
    const beyond = await page(s.api.supervisor, `?page=${Math.ceil(first.total / 25) + 1}`);
    expect(beyond.events).toEqual([]);
  });

  test('a bad query is a 400 naming each field', async () => {
    const cases: [string, string][] = [
      ['?kinds=inspection,bogus', 'kinds'],
      ['?from=2026-02-30', 'from'],
      ['?from=2026-05-04&to=2026-05-01', 'to'],
      ['?page=0', 'page'],
      ['?to=9999-12-31', 'to'],
      [`?q=${'x'.repeat(101)}`, 'q'],
    ];
    for (const [query, field] of cases) {
      const err = expectApiError(
        await s.api.supervisor.get(`/api/rides/${skylarkId}/logbook${query}`),
        400,
        'validation_failed',
      );
      expect(err.issues?.map((i) => i.path.replace(/^query\./, '').split('.')[0])).toContain(field);
    }
    expectApiError(
      await s.api.supervisor.get(`/api/rides/${skylarkId}/logbook.pdf?size=A3`),
      400,
      'validation_failed',
    );
  });
});

/**
 * RFC 4180 §2 read by its grammar: records end in CRLF; a field is either non-escaped (no comma, quote,
 * CR or LF) or in double quotes with "" for a quote, where commas and line breaks may appear.
 */
function readRfc4180(text: string): string[][] {
  const records: string[][] = [];
  let i = 0;
  while (i < text.length) {
    const fields: string[] = [];
    for (;;) {
      let field = '';
      if (text[i] === '"') {
        i++;
        for (;;) {
          if (i >= text.length) throw new Error('unterminated quoted field');
          if (text[i] === '"' && text[i + 1] === '"') {
            field += '"';
            i += 2;
          } else if (text[i] === '"') {
            i++;
            break;
          } else field += text[i++];
        }
      } else
        while (i < text.length && text[i] !== ',' && text[i] !== '\r') {
          if (text[i] === '"' || text[i] === '\n') throw new Error(`bare ${JSON.stringify(text[i])} at ${i}`);
          field += text[i++];
        }
      fields.push(field);
      if (text[i] === ',') {
        i++;
        continue;
      }
      if (text.slice(i, i + 2) !== '\r\n') throw new Error(`record not ended by CRLF at ${i}`);
      i += 2;
      break;
    }
    records.push(fields);
  }
  return records;
}

describe('exports', () => {
  test('CSV: RFC 4180, a header row, every entry of the filter (all pages), UTF-8', async () => {
    const res = await s.api.supervisor.get(`/api/rides/${skylarkId}/logbook.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="logbook-Skylark.csv"');
    const rows = readRfc4180(res.text);
    expect(rows[0]).toEqual(['at', 'site_day', 'kind', 'title', 'detail', 'who', 'link', 'documents']);
    const events = await all(s.api.supervisor);
    expect(rows.slice(1).map((r) => r[0])).toEqual(events.map((e) => e.at));
    for (const r of rows.slice(1)) expect(r).toHaveLength(8);
    const finding = rows.find((r) => /raised — Fix by date/.test(r[3]));
    // A quote doubled inside quotes, and the detail's lines as line breaks inside one field.
    expect(finding?.[4]).toBe(
      'Step edge worn, "lip" raised\nRequired action: Replace the step edge, then report\nDue: 30 May 2026',
    );
    expect(res.text).toContain('"Step edge worn, ""lip"" raised');
    expect(res.text).toContain('N·m');
  });

  test('CSV keeps the filter and the operator’s scope', async () => {
    const res = await s.api.operator.get(`/api/rides/${skylarkId}/logbook.csv?kinds=notice`);
    const rows = readRfc4180(res.text).slice(1);
    expect(rows.length).toBe((await page(s.api.operator, '?kinds=notice')).total);
    expect(rows.every((r) => r[2] === 'Notice')).toBe(true);
  });

  const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  };
  const pdfOf = async (query: string) => {
    const res = await s.api.supervisor
      .get(`/api/rides/${skylarkId}/logbook.pdf${query}`)
      .buffer(true)
      .parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    return res.body as Buffer;
  };
  const read = (pdf: Buffer) => {
    const out = execFileSync(process.execPath, [path.join(__dirname, 'support', 'read-pdf.cjs')], {
      input: pdf,
      maxBuffer: 64 * 1024 * 1024,
    });
    const parsed = JSON.parse(out.toString('utf8')) as {
      text: string;
      total: number;
      pages: { width: number; height: number }[];
    };
    return { ...parsed, flat: parsed.text.replace(/\s+/g, ' ') };
  };

  test('PDF: the ride, the filter, the entries, the caution and page numbers, on the company’s paper', async () => {
    const pdf = await pdfOf('?kinds=finding,notice,status');
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const text = read(pdf);
    for (const t of [
      'Ride logbook',
      'Skylark',
      'Tamsworth Pier Leisure',
      'Findings, Notices, Status',
      'Step edge worn',
      'verified and closed',
      'Step closed until the edge is fixed',
      'Printed for Mira Delacourt',
    ])
      expect(text.flat).toContain(t);
    expect(text.flat).toContain(CAUTION_FULL.replace(/\s+/g, ' ').slice(0, 120));
    expect(text.flat).toContain(`Page 1 of ${text.total}`);
    // A4 is 210 × 297 mm (ISO 216) = 595.28 × 841.89 pt.
    expect(text.pages[0].width).toBeCloseTo(595.28, 1);
    expect(text.pages[0].height).toBeCloseTo(841.89, 1);
  });

  test('PDF of every entry runs over pages; Letter on request (8.5 × 11 in = 612 × 792 pt)', async () => {
    const text = read(await pdfOf('?size=LETTER'));
    expect(text.total).toBeGreaterThan(1);
    expect(text.flat).toContain(`Page ${text.total} of ${text.total}`);
    expect(text.pages[0].width).toBeCloseTo(612, 1);
    expect(text.pages[0].height).toBeCloseTo(792, 1);
  });
});
