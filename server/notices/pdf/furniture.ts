/**
 * The notice's page furniture: the first page's band (logo, wordmark, issuer), the title block, the
 * running header of later pages and the footer of every page ("page n of m", written once all exist).
 */
import { colors as C } from '@/lib/colors';
import { formatWhen, formatWhenDay } from '@/lib/dates';
import { logoColors } from '@/lib/logo-mark';
import { noticeKindVocabulary } from '@/lib/vocabulary';
import type { NoticeDocument } from '@/features/notices/schema';
import {
  draw,
  drawLine,
  lineHeight,
  measure,
  S,
  setStyle,
  textWidth,
  type Doc,
  type Layout,
  type TextStyle,
} from '@/server/pdf/layout';

const HEADER_BAND = 66;

export const titleOf = (doc: NoticeDocument) => noticeKindVocabulary[doc.kind].label;

/** The mark of lib/logo-mark.ts (its SVG drawn with pdfkit; the band behind it is the base colour). */
function drawLogo(doc: Doc, x: number, y: number, size: number) {
  doc.save();
  doc.translate(x, y).scale(size / 100);
  doc
    .path('M 22.5 65.3 A 48 48 0 0 0 77.5 65.3')
    .lineWidth(4)
    .lineCap('round')
    .dash(2, { space: 7 })
    .stroke(logoColors.arc);
  doc.undash();
  doc.moveTo(50, 26).lineTo(66.4, 64.7).lineWidth(7).lineCap('round').stroke(logoColors.white);
  doc.save();
  doc.rotate(-23, { origin: [69.2, 70.7] });
  doc.roundedRect(58.2, 63.2, 22, 15, 4).fill(logoColors.gondola);
  doc.restore();
  doc.circle(50, 26, 10).fill(logoColors.white);
  doc.circle(50, 26, 4).fill(logoColors.base);
  doc.restore();
}

/** The first page's band: logo, wordmark and the issuer. Returns the band's height. */
export function drawFirstHeader(l: Layout, n: NoticeDocument): number {
  const { doc } = l;
  const issuerW = Math.min(250, l.width * 0.5);
  const nameStyle: TextStyle = { font: 'semibold', size: 9.5, gap: 0.5, color: '#FFFFFF' };
  const lineStyle: TextStyle = { font: 'regular', size: 7.6, gap: 0.8, color: C.baseMuted };
  const issuerLines = [n.issuer.address, n.issuer.phone].filter((v): v is string => !!v);
  const issuerH =
    measure(l, n.issuer.name, nameStyle, issuerW) +
    1 +
    issuerLines.reduce((h, line) => h + measure(l, line, lineStyle, issuerW), 0);
  const band = Math.max(HEADER_BAND, 14 + issuerH + 12);
  doc.rect(0, 0, l.pageW, band).fill(C.base);
  drawLogo(doc, l.left - 4, 12, 42);
  draw(l, 'Pivotwatch', { font: 'bold', size: 17, gap: 0, color: '#FFFFFF' }, l.left + 42, 17, 200);
  draw(
    l,
    'Ride inspection records',
    { font: 'regular', size: 7.5, gap: 0, color: C.baseMuted, spacing: 0.3 },
    l.left + 43,
    39,
    200,
  );

  const ix = l.right - issuerW;
  let iy = 14;
  draw(l, n.issuer.name, nameStyle, ix, iy, issuerW, 'right');
  iy += measure(l, n.issuer.name, nameStyle, issuerW) + 1;
  for (const line of issuerLines) {
    draw(l, line, lineStyle, ix, iy, issuerW, 'right');
    iy += measure(l, line, lineStyle, issuerW);
  }
  return band;
}

/** The header of every page after the first: the wordmark, the notice and its ride, over a rule. */
export const runningHeader = (n: NoticeDocument) => (l: Layout) => {
  const y = 26;
  const s: TextStyle = { font: 'semibold', size: 8.5, gap: 0, color: C.base };
  setStyle(l, s);
  l.doc.text('Pivotwatch', l.left, y, { lineBreak: false });
  const w = textWidth(l, 'Pivotwatch', s);
  const rest = `  ·  ${titleOf(n)} ${n.reference}  ·  ${n.ride.name}`;
  drawLine(l, rest, { ...S.small, size: 8 }, l.left + w, y + 0.6, l.width - w);
  l.doc
    .moveTo(l.left, y + 15)
    .lineTo(l.right, y + 15)
    .lineWidth(0.6)
    .stroke(C.border);
};

export function drawFooters(l: Layout, n: NoticeDocument) {
  const range = l.doc.bufferedPageRange();
  for (let i = 0; i < range.count; i++) {
    l.doc.switchToPage(range.start + i);
    const y = l.pageH - 44;
    l.doc.moveTo(l.left, y).lineTo(l.right, y).lineWidth(0.6).stroke(C.border);
    const s: TextStyle = { ...S.small, size: 7.8, color: C.text };
    const pageWord = `Page ${i + 1} of ${range.count}`;
    const pw = textWidth(l, pageWord, { ...s, font: 'semibold' });
    drawLine(
      l,
      `${titleOf(n)} ${n.reference}  ·  issued ${formatWhenDay(n.issuedAt, n.timeZone)}  ·  ${n.issuer.name}`,
      s,
      l.left,
      y + 7,
      l.width - pw - 12,
    );
    draw(l, pageWord, { ...s, font: 'semibold' }, l.right - pw - 1, y + 7, pw + 2, 'right');
    const lead = `Read and acknowledge this notice in Pivotwatch: ${n.url}`;
    const urlStyle: TextStyle = { ...S.small, size: 7.4 };
    // A long address drops the lead-in, then gets smaller, rather than lose its end.
    const urlLine = textWidth(l, lead, urlStyle) <= l.width ? lead : n.url;
    const fit = Math.max(5, Math.min(7.4, Math.floor((74 * l.width) / textWidth(l, urlLine, urlStyle)) / 10));
    drawLine(l, urlLine, { ...urlStyle, size: fit }, l.left, y + 19, l.width);
  }
}

export function titleBlock(l: Layout, n: NoticeDocument, band: number) {
  const y = band + 18;
  const refW = 170;
  const titleStyle: TextStyle = { font: 'bold', size: 21, gap: 0, color: C.text };
  draw(l, titleOf(n), titleStyle, l.left, y, l.width - refW - 10);
  const sub = `${n.ride.name}${n.site ? ` · ${n.site.name}` : ''}`;
  const subStyle: TextStyle = { font: 'regular', size: 10.5, gap: 1, color: C.textMuted };
  const titleH = lineHeight(l, titleStyle);
  draw(l, sub, subStyle, l.left, y + titleH + 1, l.width - refW - 10);
  const leftH = titleH + 1 + measure(l, sub, subStyle, l.width - refW - 10);

  const rx = l.right - refW;
  let ry = y + 2;
  draw(l, 'REFERENCE', S.label, rx, ry, refW, 'right');
  ry += lineHeight(l, S.label);
  const refStyle: TextStyle = { font: 'mono', size: 12, gap: 0, color: C.text };
  draw(l, n.reference, refStyle, rx, ry, refW, 'right');
  ry += lineHeight(l, refStyle) + 3;
  draw(l, 'ISSUED', S.label, rx, ry, refW, 'right');
  ry += lineHeight(l, S.label);
  draw(l, formatWhen(n.issuedAt, n.timeZone), { ...S.body, font: 'semibold' }, rx, ry, refW, 'right');
  ry += lineHeight(l, S.body);

  l.y = Math.max(y + leftH, ry) + 10;
  l.doc.moveTo(l.left, l.y).lineTo(l.right, l.y).lineWidth(2).stroke(C.accent);
  l.y += 12;
}
