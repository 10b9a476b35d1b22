/**
 * The notice PDF, read back with an independent PDF reader (pdf-parse, built on Mozilla's pdf.js) and
 * by looking at the bytes: the text the operator must see, the page sizes, the pages of a long notice,
 * the photos and the fonts.
 */
import { execFileSync } from 'node:child_process';
import path from 'node:path';

import { CAUTION_FULL } from '@/lib/caution-text';
import { noticeDocumentSchema, type NoticeDocument } from '@/features/notices/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import { renderNoticePdf, type PhotoLoader } from '@/server/notices/pdf';
import { fixtureNotice, fixturePhotos, loadFixturePhoto, noticeWithFindings } from '@/scripts/sample-notice';

jest.setTimeout(60_000);

type Parsed = { text: string; flat: string; pages: { width: number; height: number }[]; total: number };

/** Text and page sizes as pdf-parse reads them (in a child process: see support/read-pdf.cjs). */
function parse(pdf: Buffer): Parsed {
  const out = execFileSync(process.execPath, [path.join(__dirname, 'support', 'read-pdf.cjs')], {
    input: pdf,
    maxBuffer: 64 * 1024 * 1024,
  });
  const { text, total, pages } = JSON.parse(out.toString('utf8')) as Omit<Parsed, 'flat'>;
  // Wrapped lines join with a space, so a sentence can be looked for whole.
  return { text, total, pages, flat: text.replace(/\s+/g, ' ') };
}

const render = (
  doc: NoticeDocument,
  pageSize: 'A4' | 'LETTER' = 'A4',
  loadPhoto: PhotoLoader = loadFixturePhoto,
) => renderNoticePdf(doc, { pageSize, loadPhoto });

/** Image XObjects in the file (PDF 32000-1:2008 §8.9.5: an image XObject's /Subtype is /Image). */
const imageCount = (pdf: Buffer) => (pdf.toString('latin1').match(/\/Subtype \/Image/g) ?? []).length;

/** Page boxes as written in the page dictionaries (PDF 32000-1:2008 §7.7.3.3, /MediaBox). */
const mediaBoxes = (pdf: Buffer) =>
  [...pdf.toString('latin1').matchAll(/\/MediaBox \[([^\]]+)\]/g)].map((m) =>
    m[1].trim().split(/\s+/).map(Number),
  );

const escapeRe = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

test('the fixture is a valid notice document', () => {
  expect(() => noticeDocumentSchema.parse(fixtureNotice)).not.toThrow();
  expect(() => noticeDocumentSchema.parse(noticeWithFindings(25))).not.toThrow();
});

// Page sizes: A4 is 210 × 297 mm (ISO 216) = 595.28 × 841.89 pt at 72 pt per inch; US Letter is
// 8.5 × 11 in (ANSI/ASME Y14.1) = 612 × 792 pt.
describe.each([
  { pageSize: 'A4' as const, width: 595.28, height: 841.89 },
  { pageSize: 'LETTER' as const, width: 612, height: 792 },
])('the fixture on $pageSize', ({ pageSize, width, height }) => {
  let pdf: Buffer;
  let parsed: Parsed;
  beforeAll(async () => {
    pdf = await render(fixtureNotice, pageSize);
    parsed = parse(pdf);
  });

  test('is a PDF whose every page has the paper size', () => {
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(parsed.total).toBeGreaterThanOrEqual(2);
    expect(parsed.pages).toHaveLength(parsed.total);
    for (const p of parsed.pages) {
      expect(p.width).toBeCloseTo(width, 2);
      expect(p.height).toBeCloseTo(height, 2);
    }
    const boxes = mediaBoxes(pdf);
    expect(boxes).toHaveLength(parsed.total);
    for (const [x0, y0, x1, y1] of boxes) {
      expect([x0, y0]).toEqual([0, 0]);
      expect(x1).toBeCloseTo(width, 2);
      expect(y1).toBeCloseTo(height, 2);
    }
  });

  test('reads back with the ride, site, reference and operating status', () => {
    const t = parsed.flat;
    expect(t).toContain('Inspection notice');
    expect(t).toContain('PW-2026-0042');
    expect(t).toContain('Tidecaller');
    expect(t).toContain('FRW-AW30-0412');
    expect(t).toContain('Fenlow Ride Works');
    expect(t).toContain('Arcwing 30');
    expect(t).toContain('Marrowby Bay Pleasure Gardens');
    expect(t).toContain('Marrowby Leisure Company Ltd');
    expect(t).toContain('Out of service');
    expect(t).toContain('Finding 1 (stop now): crack indication at the main pivot lug.');
    expect(t).toContain('Priya Ostrander');
    expect(t).toContain('Periodic inspection');
    expect(t).toContain('11 Mar 2026');
    // Re-inspection needed, and why.
    expect(t).toContain('RE-INSPECTION NEEDED Yes');
    expect(t).toContain('before the ride returns to service');
  });

  test('reads back with every finding, its severity words, required action and due date', () => {
    const t = parsed.flat;
    const due: Record<string, string> = { fnd_1: '20 Mar 2026', fnd_2: '27 Mar 2026', fnd_3: '17 Apr 2026' };
    for (const f of fixtureNotice.findings) {
      expect(t).toContain(f.description);
      expect(t).toContain(f.requiredAction);
      expect(t).toContain(f.ruleRef);
      expect(t).toContain(severityInfo[f.severity].label);
      expect(t).toContain(`Due ${due[f.id]}`);
    }
    expect(t).toContain('Findings (3)');
  });

  test('reads back with the results table, the load summary, the full caution and the signature', () => {
    const t = parsed.flat;
    for (const r of fixtureNotice.results) expect(t).toContain(r.value);
    for (const word of ['Within', 'Near limit', 'Over limit']) expect(t).toContain(word);
    expect(t).toContain('124 %');
    expect(t).toContain('Counterweight arm pin');
    expect(t).toContain('96.4 kN');
    // The caution in full, not only its first sentence.
    expect(t).toContain('Decision aid only.');
    expect(t).toContain(CAUTION_FULL);
    expect(t).toContain(fixtureNotice.appeal);
    expect(t).toContain(fixtureNotice.note);
    expect(t).toContain('Tomas Brennock');
    expect(t).toContain('Lead inspector (supervisor)');
  });

  test('has a footer with the reference, the page number of the total and the app address on every page', () => {
    for (let i = 1; i <= parsed.total; i++) expect(parsed.flat).toContain(`Page ${i} of ${parsed.total}`);
    const refs = parsed.flat.match(/Inspection notice PW-2026-0042 · issued 12 Mar 2026/g) ?? [];
    expect(refs.length).toBe(parsed.total);
    const urls = parsed.flat.match(new RegExp(escapeRe(fixtureNotice.url), 'g')) ?? [];
    expect(urls.length).toBe(parsed.total);
  });

  test('embeds the three photos as images', () => {
    expect(imageCount(pdf)).toBe(3);
    expect(parsed.flat).not.toMatch(/not available/i);
    for (const f of fixtureNotice.findings)
      for (const p of f.photos) expect(parsed.flat).toContain(p.caption);
  });

  test('embeds only the shipped IBM Plex fonts', () => {
    const raw = pdf.toString('latin1');
    const names = new Set([...raw.matchAll(/\/BaseFont \/(?:[A-Z]{6}\+)?([\w-]+)/g)].map((m) => m[1]));
    expect([...names].sort()).toEqual([
      'IBMPlexMono-Medium',
      'IBMPlexSans-Bold',
      'IBMPlexSans-Regular',
      'IBMPlexSans-SemiBold',
    ]);
    // Each is embedded (a TrueType font program, /FontFile2), not merely named.
    expect((raw.match(/\/FontFile2/g) ?? []).length).toBe(4);
  });
});

test('the same notice renders to the same bytes, dated when it was issued', async () => {
  const a = await render(fixtureNotice);
  const b = await render(fixtureNotice);
  expect(a.equals(b)).toBe(true);
  // The info dictionary's /CreationDate (here an indirect string) in the PDF date form D:YYYYMMDDHHmmSSZ
  // (PDF 32000-1:2008 §7.9.4), from issuedAt 2026-03-12T16:05:00Z.
  expect(a.toString('latin1')).toMatch(/\/CreationDate \d+ 0 R/);
  expect(a.toString('latin1')).toContain('(D:20260312160500Z)');
});

test('a notice with 25 findings runs over several pages and keeps every finding and due date', async () => {
  const doc = noticeWithFindings(25);
  const parsed = parse(await render(doc));
  expect(parsed.total).toBeGreaterThanOrEqual(5);
  const t = parsed.flat;
  expect(t).toContain('Findings (25)');
  for (let i = 1; i <= 25; i++) {
    expect(t).toContain(`Finding ${i} of 25.`);
    // Due dates 1–25 May 2026; the look-behind keeps "1 May" from matching inside "21 May".
    expect(t).toMatch(new RegExp(`Due (?<!\\d)${i} May 2026`));
  }
  for (let i = 1; i <= parsed.total; i++) expect(t).toContain(`Page ${i} of ${parsed.total}`);
  // A finding that runs onto the next page says so at the top of that page.
  expect(t).toMatch(/Finding \d+, continued/);
  expect(t).toContain(CAUTION_FULL);
});

test('a long results table repeats its header row on each page it runs onto', async () => {
  const results = Array.from({ length: 12 }, (_, i) =>
    fixtureNotice.results.map((r) => ({ ...r, label: `${r.label}, run ${i + 1}` })),
  ).flat();
  const parsed = parse(await render({ ...fixtureNotice, results }));
  const t = parsed.flat;
  for (let i = 1; i <= 12; i++)
    expect(t).toContain(`Gondola slewing bearing spindle — diametral clearance, run ${i}`);
  const headers = t.match(/VALUE CHECKED VALUE LIMIT RATIO STATUS/g) ?? [];
  const continued = t.match(/Readings and computed values, continued/g) ?? [];
  expect(continued.length).toBeGreaterThanOrEqual(1);
  expect(headers.length).toBe(continued.length + 1);
});

test('text of the longest allowed length wraps and runs over a page without losing a word', async () => {
  // 2000 characters each (the findings schema's maximum): together taller than a Letter page's text
  // area, so the finding must break.
  const text = (prefix: string) =>
    Array.from({ length: 500 }, (_, i) => `${prefix}${i}`)
      .join(' ')
      .slice(0, 2000)
      .replace(/ \S*$/, '');
  const doc = noticeWithFindings(2);
  doc.findings[1] = { ...doc.findings[1], description: text('d'), requiredAction: text('a') };
  const { flat } = parse(await render(doc, 'LETTER'));
  expect(flat.match(/\bd\d+\b/g)).toEqual(text('d').split(' '));
  expect(flat.match(/\ba\d+\b/g)).toEqual(text('a').split(' '));
  expect(flat).toContain('Finding 2, continued');
});

describe('photos that cannot be shown', () => {
  test('a missing photo prints "photo not available" and the rest still print', async () => {
    const loadPhoto = (sha: string) => (sha === fixturePhotos.pinBoss.sha256 ? null : loadFixturePhoto(sha));
    const pdf = await render(fixtureNotice, 'A4', loadPhoto);
    expect(imageCount(pdf)).toBe(2);
    const { flat } = parse(pdf);
    expect(flat).toContain('Main pivot boss and arm, general view (photo not available)');
    expect(flat).toContain('Photo not available');
  });

  test('a loader that fails, answers late or returns something that is not JPEG or PNG does not stop the notice', async () => {
    const loadPhoto: PhotoLoader = async (sha) => {
      await new Promise((r) => setTimeout(r, 5));
      if (sha === fixturePhotos.weldToe.sha256) throw new Error('disk gone');
      if (sha === fixturePhotos.dial.sha256) return Buffer.from('GIF89a not a photo we embed');
      return loadFixturePhoto(sha);
    };
    const pdf = await render(fixtureNotice, 'LETTER', loadPhoto);
    expect(imageCount(pdf)).toBe(1);
    const { flat } = parse(pdf);
    expect(flat.match(/\(photo not available\)/g) ?? []).toHaveLength(2);
    for (const f of fixtureNotice.findings) expect(flat).toContain(f.description);
  });
});

test('a ride status notice without an inspection renders with its own title and status', async () => {
  const doc: NoticeDocument = {
    ...fixtureNotice,
    kind: 'status_change',
    inspection: null,
    results: [],
    loadSummary: [],
    checklist: null,
    findings: [],
    operatingStatus: {
      status: 'restricted',
      reason: 'Outer seats empty until the spindle bushing is replaced.',
    },
    reinspection: { required: false, reason: null },
    note: null,
  };
  expect(() => noticeDocumentSchema.parse(doc)).not.toThrow();
  const { flat } = parse(await render(doc, 'LETTER'));
  expect(flat).toContain('Ride status notice');
  expect(flat).toContain('Restricted');
  expect(flat).toContain('Outer seats empty until the spindle bushing is replaced.');
  expect(flat).toContain('RE-INSPECTION NEEDED No');
  expect(flat).toContain('No findings were recorded.');
  expect(flat).toContain(CAUTION_FULL);
});
