/**
 * One number, one string: a value at or next to its limit is formatted once (lib/measured-format.ts)
 * when the notice is issued, and the e-mail text and the PDF (read back with pdf-parse, an independent
 * reader built on Mozilla's pdf.js) print exactly that string; the app's view is checked in
 * tests/app/measured-format-notice.test.tsx with the same values. Values are invented demo data.
 */
import { execFileSync } from 'node:child_process';
import path from 'node:path';

import { evaluateLimit, type Limit } from '@/features/loads/engine';
import { formatEnvelopeItem, formatRatio } from '@/features/loads/format';
import { noticeDocumentSchema } from '@/features/notices/schema';
import { noticeEmail } from '@/server/notices/deliveries';
import { renderNoticePdf } from '@/server/notices/pdf';
import { limitStrings } from '@/tests/support/limit-values';
import { limitNotice, limitResults } from '@/tests/server/support/limit-notice';

jest.setTimeout(60_000);

function pdfText(pdf: Buffer): string {
  const out = execFileSync(process.execPath, [path.join(__dirname, 'support', 'read-pdf.cjs')], {
    input: pdf,
    maxBuffer: 64 * 1024 * 1024,
  });
  // Wrapped lines join with a space, so a cell's text can be looked for whole.
  return (JSON.parse(out.toString('utf8')) as { text: string }).text.replace(/\s+/g, ' ');
}

describe('a value at its limit reads the same in the notice document, the e-mail and the PDF', () => {
  test('the strings frozen in the document are the ones the rule gives', () => {
    const mm = (x: number) => x / 1000;
    const pin: Limit = { kind: 'lower', min: mm(139), nominal: mm(140) };
    // The typed text is echoed; 139.05 against 139 is never 139.1 or 139.0.
    expect(
      formatEnvelopeItem(
        { id: 'joints.0.pin.diameter', quantity: 'lengthSmall', ...evaluateLimit(mm(139.05), pin) },
        'si',
        { entered: '139.05', unit: 'mm' },
      ),
    ).toEqual({ value: '139.05 mm', limit: '≥ 139 mm', ratio: '95.0 %' });
    const results = limitResults();
    expect(results.map((r) => r.value)).toEqual([
      '210.0003 kN',
      '139.0 mm (at the limit)',
      '0.50 mm (at the limit)',
      '139.05 mm',
    ]);
    expect(results.map((r) => r.status)).toEqual(['over', 'near', 'near', 'near']);
    // The issuer froze what the app's own envelope table shows for the same values.
    const app = new Map(limitStrings.map((s) => [s.label, s]));
    for (const r of results) {
      expect(r.value).toBe(app.get(r.label)?.value);
      expect(r.limit).toBe(app.get(r.label)?.limit);
      expect(formatRatio(r.ratio)).toBe(app.get(r.label)?.ratio);
    }
    expect(() => noticeDocumentSchema.parse(limitNotice())).not.toThrow();
  });

  test('e-mail text and html, and the PDF, carry every value, limit and share exactly as the document', async () => {
    const doc = limitNotice();
    const mail = noticeEmail(doc);
    const pdf = pdfText(await renderNoticePdf(doc, { pageSize: 'A4', loadPhoto: () => null }));
    for (const r of doc.results) {
      expect(mail.text).toContain(`${r.label}: ${r.value}, limit ${r.limit}, ${formatRatio(r.ratio)}`);
      expect(mail.html).toContain(r.value);
      expect(pdf).toContain(r.value);
      expect(pdf).toContain(r.limit);
      expect(pdf).toContain(formatRatio(r.ratio));
    }
    // The share of the allowance is never rounded onto 100 %: 210.0003 kN of 210 kN.
    expect(pdf).toContain('100.0001 %');
    expect(mail.text).toContain('100.0001 %');
  });

  test('a notice issued before the raw values were kept still renders', async () => {
    const doc = limitNotice();
    const old = { ...doc, results: doc.results.map(({ measured: _dropped, ...r }) => r) };
    expect(() => noticeDocumentSchema.parse(old)).not.toThrow();
    expect(noticeEmail(old).text).toContain('139.05 mm');
    expect(pdfText(await renderNoticePdf(old, { pageSize: 'A4', loadPhoto: () => null }))).toContain(
      '139.05 mm',
    );
  });
});
