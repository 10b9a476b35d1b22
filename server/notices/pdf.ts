/**
 * The notice as a PDF: the frozen `NoticeDocument` laid out on A4 or US Letter with the shipped IBM Plex
 * fonts (nothing else is embedded). The layout is done here rather than with pdfkit's automatic page
 * flow, so that a table breaks between rows and repeats its header, a finding that runs onto the next
 * page says so, and the footer ("page n of m") can be written once every page exists.
 *
 * Output is deterministic for a given document: the PDF's creation date and file id come from
 * `issuedAt`, so the same notice renders to the same bytes.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';

import PDFDocument from 'pdfkit';

import { CAUTION_FULL } from '@/components/caution-text';
import { ENVELOPE_STATUS_LABEL, type EnvelopeStatus } from '@/features/loads/engine/envelope';
import { formatRatio } from '@/features/loads/format';
import type { NoticeDocument } from '@/features/notices/schema';
import { findingSeverities, severityInfo, type FindingSeverity } from '@/features/review/schema';
import { rideClassLabel, rideClasses, type RideClass } from '@/features/rides/schema';
import { rideStatusWords } from '@/server/notices/words';
import { repoRoot } from '@/server/paths';

export type PhotoLoader = (sha256: string) => Promise<Buffer | null> | Buffer | null;
export type NoticePdfOptions = { pageSize: 'A4' | 'LETTER'; loadPhoto: PhotoLoader };

type Doc = PDFKit.PDFDocument;

// ——— look ———

/**
 * The palette of components/theme.ts (same values; theme.ts also loads the fonts for the app, which
 * Node cannot import, so the server keeps this copy — tests/server/notice-pdf.test.ts checks they agree).
 */
export const pdfColors = {
  base: '#102A38',
  baseMuted: '#B8CAD4',
  accent: '#B34A16',
  accentSoft: '#FBE9DE',
  surface: '#FFFFFF',
  surfaceSunk: '#E8ECEE',
  border: '#CBD4DA',
  text: '#15232C',
  textMuted: '#4F5F6A',
  within: '#18704A',
  withinSoft: '#E1F2E9',
  near: '#8A5A00',
  nearSoft: '#FCF0D6',
  over: '#B0231A',
  overSoft: '#FBE3E1',
} as const;
const C = pdfColors;

/** Colours of the logo mark (components/logo-mark.ts). */
const LOGO = { arc: '#5E7D8E', gondola: '#E0763A' };

export const fontDir = path.join(repoRoot, 'fonts');
export const FONT_FILES = {
  regular: 'IBMPlexSans_400Regular.ttf',
  semibold: 'IBMPlexSans_600SemiBold.ttf',
  bold: 'IBMPlexSans_700Bold.ttf',
  mono: 'IBMPlexMono_500Medium.ttf',
} as const;
type FontName = keyof typeof FONT_FILES;

let fontData: Record<FontName, Buffer> | undefined;

/**
 * The font files, each followed by a few zero bytes. The shipped Mono keeps its empty glyphs (the space
 * among them) at the very end of its glyf table, which ends the file; fontkit reads a 10-byte glyph
 * header even for an empty glyph and fails there ("Offset is outside the bounds of the DataView"). The
 * padding gives that read zeros; it lies past every table, so nothing embedded changes.
 */
export function fonts(): Record<FontName, Buffer> {
  fontData ??= Object.fromEntries(
    Object.entries(FONT_FILES).map(([name, file]) => [
      name,
      Buffer.concat([readFileSync(path.join(fontDir, file)), Buffer.alloc(16)]),
    ]),
  ) as Record<FontName, Buffer>;
  return fontData;
}

type TextStyle = { font: FontName; size: number; gap: number; color: string; spacing?: number };
const S = {
  body: { font: 'regular', size: 9.5, gap: 2.2, color: C.text },
  bodyStrong: { font: 'semibold', size: 9.5, gap: 2.2, color: C.text },
  small: { font: 'regular', size: 8, gap: 1.6, color: C.textMuted },
  label: { font: 'semibold', size: 7.2, gap: 1.4, color: C.textMuted, spacing: 0.5 },
  figure: { font: 'mono', size: 8.6, gap: 2, color: C.text },
  cell: { font: 'regular', size: 8.6, gap: 1.8, color: C.text },
  cellHead: { font: 'semibold', size: 7.6, gap: 1.4, color: C.base },
  heading: { font: 'bold', size: 12.5, gap: 0, color: C.base },
  caution: { font: 'regular', size: 8.6, gap: 2, color: C.text },
} satisfies Record<string, TextStyle>;

/** Marks carry shape and word together; colour is never the only signal. */
type Shape = 'disc' | 'triangle' | 'barred' | 'ring' | 'diamond' | 'square' | 'octagon';

const rideStatusMark: Record<
  NoticeDocument['operatingStatus']['status'],
  { word: string; shape: Shape; fg: string; bg: string }
> = {
  in_service: { word: rideStatusWords.in_service, shape: 'disc', fg: C.within, bg: C.withinSoft },
  restricted: { word: rideStatusWords.restricted, shape: 'triangle', fg: C.near, bg: C.nearSoft },
  out_of_service: { word: rideStatusWords.out_of_service, shape: 'barred', fg: C.over, bg: C.overSoft },
};

const envelopeMark: Record<EnvelopeStatus, { shape: Shape; fg: string }> = {
  within: { shape: 'disc', fg: C.within },
  near: { shape: 'triangle', fg: C.near },
  over: { shape: 'barred', fg: C.over },
};

/** Severity marks grow heavier with the severity: ring, diamond, square, octagon with a bar. */
export const severityMark: Record<FindingSeverity, { shape: Shape; fg: string }> = {
  note: { shape: 'ring', fg: C.textMuted },
  fix_by_date: { shape: 'diamond', fg: C.near },
  fix_before_operation: { shape: 'square', fg: C.accent },
  stop_now: { shape: 'octagon', fg: C.over },
};

const stateWords: Record<NoticeDocument['findings'][number]['state'], string> = {
  open: 'Open',
  action_reported: 'Corrective action reported',
  closed: 'Closed',
};

// ——— words and dates ———

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "2026-03-20" → "20 Mar 2026": day, month word, year, which reads the same on both sides of the ocean. */
export function formatCalendarDate(date: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return date;
  return `${Number(m[3])} ${MONTHS[Number(m[2]) - 1] ?? m[2]} ${m[1]}`;
}

/** A calendar date as above; an instant as its date and time in UTC (the notice has no time zone). */
export function formatWhen(value: string): string {
  if (/^\d{4}-\d{2}-\d{2}$/.test(value)) return formatCalendarDate(value);
  const d = new Date(value);
  if (Number.isNaN(d.getTime())) return value;
  const iso = d.toISOString();
  return `${formatCalendarDate(iso.slice(0, 10))}, ${iso.slice(11, 16)} UTC`;
}

const dateOf = (value: string) => formatWhen(value).replace(/, \d{2}:\d{2} UTC$/, '');

const orNot = (v: string | number | null | undefined, missing = 'Not recorded') =>
  v === null || v === undefined || v === '' ? missing : String(v);

const classWords = (c: string) =>
  (rideClasses as readonly string[]).includes(c) ? rideClassLabel[c as RideClass] : c;

const titleOf = (doc: NoticeDocument) =>
  doc.kind === 'inspection' ? 'Inspection notice' : 'Ride status notice';

// ——— geometry ———

const MARGIN_X = 50;
const HEADER_BAND = 66;
const RUNNING_TOP = 58;
const FOOTER_SPACE = 60;

type Layout = {
  doc: Doc;
  pageW: number;
  pageH: number;
  left: number;
  width: number;
  right: number;
  bottom: number;
  y: number;
  /** y where content starts on the current page (after the running header and any continuation line). */
  pageStart: number;
  /** Things to draw at the top of a new page while a block is open (a table's header, "continued"). */
  hooks: (() => void)[];
  title: string;
  reference: string;
  rideName: string;
};

function setStyle(l: Layout, s: TextStyle) {
  l.doc.font(s.font).fontSize(s.size).fillColor(s.color);
}

function measure(l: Layout, text: string, s: TextStyle, width: number): number {
  setStyle(l, s);
  return l.doc.heightOfString(text, { width, lineGap: s.gap, characterSpacing: s.spacing ?? 0 });
}

function lineHeight(l: Layout, s: TextStyle): number {
  setStyle(l, s);
  return l.doc.currentLineHeight(true) + s.gap;
}

function textWidth(l: Layout, text: string, s: TextStyle): number {
  setStyle(l, s);
  return l.doc.widthOfString(text, { characterSpacing: s.spacing ?? 0 });
}

function draw(
  l: Layout,
  text: string,
  s: TextStyle,
  x: number,
  y: number,
  width: number,
  align: 'left' | 'right' | 'center' = 'left',
) {
  setStyle(l, s);
  l.doc.text(text, x, y, { width, lineGap: s.gap, characterSpacing: s.spacing ?? 0, align });
}

/** One line of text, cut with an ellipsis when it is wider than `width` (page furniture). */
function drawLine(
  l: Layout,
  text: string,
  s: TextStyle,
  x: number,
  y: number,
  width: number,
  align: 'left' | 'right' = 'left',
) {
  setStyle(l, s);
  l.doc.text(text, x, y, {
    width,
    height: l.doc.currentLineHeight(false),
    ellipsis: true,
    characterSpacing: s.spacing ?? 0,
    align,
  });
}

function newPage(l: Layout) {
  l.doc.addPage();
  drawRunningHeader(l);
  l.y = RUNNING_TOP;
  for (const hook of l.hooks) hook();
  l.pageStart = l.y;
}

/** Starts a new page unless `h` fits in what is left of this one (or this page has nothing on it yet). */
function ensure(l: Layout, h: number): boolean {
  if (l.y + h <= l.bottom || l.y <= l.pageStart + 0.5) return false;
  newPage(l);
  return true;
}

function withHook<T>(l: Layout, hook: () => void, fn: () => T): T {
  l.hooks.push(hook);
  try {
    return fn();
  } finally {
    l.hooks.pop();
  }
}

/** The longest run of whole words from the start of `text` that fits in `maxH`, and the rest. */
function splitToFit(l: Layout, text: string, s: TextStyle, width: number, maxH: number): [string, string] {
  if (measure(l, text, s, width) <= maxH) return [text, ''];
  const tokens = text.match(/\s+|\S+\s*/g) ?? [];
  let lo = 0;
  let hi = tokens.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (measure(l, tokens.slice(0, mid).join('').trimEnd(), s, width) <= maxH) lo = mid;
    else hi = mid - 1;
  }
  return [tokens.slice(0, lo).join('').trimEnd(), tokens.slice(lo).join('').trimStart()];
}

/** Text that may run over a page break: split between words, continued at the top of the next page. */
function flowText(l: Layout, text: string, s: TextStyle, x: number, width: number) {
  let rest = text;
  const lh = lineHeight(l, s);
  while (rest) {
    if (l.bottom - l.y < lh) newPage(l);
    const [head, tail] = splitToFit(l, rest, s, width, l.bottom - l.y);
    if (!head) {
      if (l.y <= l.pageStart + 0.5) {
        // Not even one line fits on an empty page: draw it anyway rather than loop for ever.
        draw(l, rest, s, x, l.y, width);
        l.y += measure(l, rest, s, width);
        return;
      }
      newPage(l);
      continue;
    }
    draw(l, head, s, x, l.y, width);
    l.y += measure(l, head, s, width);
    rest = tail;
    if (rest) newPage(l);
  }
}

// ——— marks ———

function drawShape(doc: Doc, shape: Shape, x: number, cy: number, size: number, color: string) {
  const r = size / 2;
  const cx = x + r;
  doc.save();
  switch (shape) {
    case 'disc':
      doc.circle(cx, cy, r).fill(color);
      break;
    case 'ring':
      doc
        .lineWidth(size * 0.16)
        .circle(cx, cy, r - size * 0.08)
        .stroke(color);
      break;
    case 'triangle':
      doc.polygon([cx, cy - r], [x + size, cy + r * 0.86], [x, cy + r * 0.86]).fill(color);
      break;
    case 'diamond':
      doc.polygon([cx, cy - r], [x + size, cy], [cx, cy + r], [x, cy]).fill(color);
      break;
    case 'square':
      doc.rect(x + size * 0.06, cy - r * 0.88, size * 0.88, size * 0.88).fill(color);
      break;
    case 'barred':
      doc.roundedRect(x, cy - r, size, size, size * 0.15).fill(color);
      doc.rect(x + size * 0.2, cy - size * 0.09, size * 0.6, size * 0.18).fill('#FFFFFF');
      break;
    case 'octagon': {
      const pts: [number, number][] = Array.from({ length: 8 }, (_, i) => {
        const a = Math.PI / 8 + (i * Math.PI) / 4;
        return [cx + r * Math.cos(a), cy + r * Math.sin(a)];
      });
      doc.polygon(...pts).fill(color);
      doc.rect(x + size * 0.22, cy - size * 0.09, size * 0.56, size * 0.18).fill('#FFFFFF');
      break;
    }
  }
  doc.restore();
}

/** A mark followed by its word; returns the width used. */
function drawMarked(
  l: Layout,
  shape: Shape,
  color: string,
  word: string,
  s: TextStyle,
  x: number,
  y: number,
): number {
  const size = s.size * 0.95;
  const lh = l.doc.font(s.font).fontSize(s.size).currentLineHeight(false);
  drawShape(l.doc, shape, x, y + lh / 2, size, color);
  const tx = x + size + s.size * 0.45;
  setStyle(l, { ...s, color });
  l.doc.text(word, tx, y, { lineBreak: false, characterSpacing: s.spacing ?? 0 });
  return tx - x + textWidth(l, word, s);
}

// ——— page furniture ———

function drawLogo(doc: Doc, x: number, y: number, size: number) {
  doc.save();
  doc.translate(x, y).scale(size / 100);
  doc
    .path('M 22.5 65.3 A 48 48 0 0 0 77.5 65.3')
    .lineWidth(4)
    .lineCap('round')
    .dash(2, { space: 7 })
    .stroke(LOGO.arc);
  doc.undash();
  doc.moveTo(50, 26).lineTo(66.4, 64.7).lineWidth(7).lineCap('round').stroke('#FFFFFF');
  doc.save();
  doc.rotate(-23, { origin: [69.2, 70.7] });
  doc.roundedRect(58.2, 63.2, 22, 15, 4).fill(LOGO.gondola);
  doc.restore();
  doc.circle(50, 26, 10).fill('#FFFFFF');
  doc.circle(50, 26, 4).fill(C.base);
  doc.restore();
}

/** The first page's band: logo, wordmark and the issuer. Returns the band's height. */
function drawFirstHeader(l: Layout, n: NoticeDocument): number {
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

function drawRunningHeader(l: Layout) {
  const y = 26;
  const s: TextStyle = { font: 'semibold', size: 8.5, gap: 0, color: C.base };
  setStyle(l, s);
  l.doc.text('Pivotwatch', l.left, y, { lineBreak: false });
  const w = textWidth(l, 'Pivotwatch', s);
  const rest = `  ·  ${l.title} ${l.reference}  ·  ${l.rideName}`;
  drawLine(l, rest, { ...S.small, size: 8 }, l.left + w, y + 0.6, l.width - w);
  l.doc
    .moveTo(l.left, y + 15)
    .lineTo(l.right, y + 15)
    .lineWidth(0.6)
    .stroke(C.border);
}

function drawFooters(l: Layout, n: NoticeDocument) {
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
      `${titleOf(n)} ${n.reference}  ·  issued ${dateOf(n.issuedAt)}  ·  ${n.issuer.name}`,
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

// ——— blocks ———

/** A section heading's height: space above, the title, its rule and the space below. */
const headingHeight = (l: Layout) => 14 + lineHeight(l, S.heading) + 9;

/** A section heading, kept on one page with the first `keepWith` points of what follows. */
function heading(l: Layout, title: string, keepWith: number) {
  ensure(l, headingHeight(l) + keepWith);
  if (l.y > l.pageStart + 0.5) l.y += 14;
  draw(l, title, S.heading, l.left, l.y, l.width);
  l.y += lineHeight(l, S.heading) + 2;
  l.doc.moveTo(l.left, l.y).lineTo(l.right, l.y).lineWidth(0.8).stroke(C.base);
  l.y += 7;
}

type Pair = [label: string, value: string, style?: TextStyle];

const LABEL_W = 96;

function pairsHeight(l: Layout, pairs: Pair[], width: number): number {
  return pairs.reduce((sum, [label, value, s]) => {
    const lh = measure(l, label.toUpperCase(), S.label, LABEL_W - 8);
    const vh = measure(l, value, s ?? S.body, width - LABEL_W);
    return sum + Math.max(lh + 1.5, vh) + 4;
  }, 0);
}

function drawPairs(l: Layout, pairs: Pair[], x: number, y: number, width: number): number {
  let cy = y;
  for (const [label, value, s] of pairs) {
    const lh = measure(l, label.toUpperCase(), S.label, LABEL_W - 8);
    draw(l, label.toUpperCase(), S.label, x, cy + 1.5, LABEL_W - 8);
    const vh = measure(l, value, s ?? S.body, width - LABEL_W);
    draw(l, value, s ?? S.body, x + LABEL_W, cy, width - LABEL_W);
    cy += Math.max(lh + 1.5, vh) + 4;
  }
  return cy - y;
}

/** Two columns of label/value pairs, kept together on one page. */
function pairColumns(l: Layout, left: Pair[], right: Pair[]) {
  const gap = 18;
  const colW = (l.width - gap) / 2;
  const h = Math.max(pairsHeight(l, left, colW), pairsHeight(l, right, colW));
  ensure(l, h);
  drawPairs(l, left, l.left, l.y, colW);
  drawPairs(l, right, l.left + colW + gap, l.y, colW);
  l.y += h;
}

/** A label/value row whose value may run over a page break. */
function flowPair(l: Layout, label: string, value: string, s: TextStyle, x: number, width: number) {
  const labelText = label.toUpperCase();
  const lh = measure(l, labelText, S.label, LABEL_W - 8);
  const vh = measure(l, value, s, width - LABEL_W);
  ensure(l, Math.max(lh + 1.5, Math.min(vh, lineHeight(l, s) * 2)));
  draw(l, labelText, S.label, x, l.y + 1.5, LABEL_W - 8);
  const startPage = l.doc.bufferedPageRange().count;
  const startY = l.y;
  flowText(l, value, s, x + LABEL_W, width - LABEL_W);
  if (l.doc.bufferedPageRange().count === startPage) l.y = Math.max(l.y, startY + lh + 1.5);
  l.y += 4;
}

function statusBoxes(l: Layout, n: NoticeDocument) {
  const mark = rideStatusMark[n.operatingStatus.status];
  const gap = 10;
  const pad = 10;
  const leftW = Math.round(l.width * 0.6);
  const rightW = l.width - leftW - gap;
  const wordStyle: TextStyle = { font: 'bold', size: 17, gap: 0, color: mark.fg };
  const answerStyle: TextStyle = { font: 'bold', size: 15, gap: 0, color: C.text };
  const reason = n.operatingStatus.reason ?? 'No reason recorded.';
  const reReason = n.reinspection.reason ?? (n.reinspection.required ? 'See the findings.' : '');
  const leftH =
    pad +
    lineHeight(l, S.label) +
    4 +
    lineHeight(l, wordStyle) +
    4 +
    measure(l, reason, S.body, leftW - 2 * pad - 6) +
    pad;
  const rightH =
    pad +
    lineHeight(l, S.label) +
    4 +
    lineHeight(l, answerStyle) +
    4 +
    (reReason ? measure(l, reReason, S.body, rightW - 2 * pad) : 0) +
    pad;
  const h = Math.max(leftH, rightH);
  ensure(l, h);
  const { doc } = l;
  const y = l.y;

  doc.save();
  doc.roundedRect(l.left, y, leftW, h, 4).clip();
  doc.rect(l.left, y, leftW, h).fill(mark.bg);
  doc.rect(l.left, y, 6, h).fill(mark.fg);
  doc.restore();
  doc.roundedRect(l.left, y, leftW, h, 4).lineWidth(1.4).stroke(mark.fg);
  let cy = y + pad;
  const lx = l.left + pad + 6;
  draw(l, 'OPERATING STATUS', { ...S.label, color: C.text }, lx, cy, leftW - 2 * pad);
  cy += lineHeight(l, S.label) + 4;
  const shapeSize = 16;
  drawShape(doc, mark.shape, lx, cy + lineHeight(l, wordStyle) / 2 - 1, shapeSize, mark.fg);
  draw(l, mark.word, wordStyle, lx + shapeSize + 8, cy, leftW - 2 * pad - shapeSize - 8);
  cy += lineHeight(l, wordStyle) + 4;
  draw(l, reason, S.body, lx, cy, leftW - 2 * pad - 6);

  const rx = l.left + leftW + gap;
  doc.roundedRect(rx, y, rightW, h, 4).lineWidth(1).fillAndStroke(C.surface, C.border);
  cy = y + pad;
  draw(l, 'RE-INSPECTION NEEDED', { ...S.label, color: C.text }, rx + pad, cy, rightW - 2 * pad);
  cy += lineHeight(l, S.label) + 4;
  draw(l, n.reinspection.required ? 'Yes' : 'No', answerStyle, rx + pad, cy, rightW - 2 * pad);
  cy += lineHeight(l, answerStyle) + 4;
  if (reReason) draw(l, reReason, S.body, rx + pad, cy, rightW - 2 * pad);
  l.y = y + h;
}

// ——— tables ———

type Cell = { text: string; style?: TextStyle; mark?: { shape: Shape; color: string } };
type Column<R> = { title: string; share: number; align?: 'left' | 'right'; cell: (row: R) => Cell };

/** Room for a table's header row and its first two rows, kept with the heading above the table. */
const TABLE_START = 80;

const CELL_PAD_X = 5;
const CELL_PAD_Y = 4;

function cellHeight(l: Layout, c: Cell, width: number): number {
  const s = c.style ?? S.cell;
  const markW = c.mark ? s.size + 4 : 0;
  return measure(l, c.text, s, width - 2 * CELL_PAD_X - markW) + 2 * CELL_PAD_Y;
}

/** A table that breaks between rows and repeats its header row on every page it runs onto. */
function table<R>(
  l: Layout,
  columns: Column<R>[],
  rows: R[],
  opts: { keepAbove?: number; continued?: string } = {},
) {
  const total = columns.reduce((s, c) => s + c.share, 0);
  const widths = columns.map((c) => (l.width * c.share) / total);
  const xs = widths.map((_, i) => l.left + widths.slice(0, i).reduce((s, w) => s + w, 0));
  const headCells: Cell[] = columns.map((c) => ({ text: c.title.toUpperCase(), style: S.cellHead }));
  const headH = Math.max(...headCells.map((c, i) => cellHeight(l, c, widths[i])));

  const drawHead = () => {
    l.doc.rect(l.left, l.y, l.width, headH).fill(C.surfaceSunk);
    headCells.forEach((c, i) => {
      const s = c.style ?? S.cell;
      draw(
        l,
        c.text,
        { ...s, spacing: 0.4 },
        xs[i] + CELL_PAD_X,
        l.y + CELL_PAD_Y,
        widths[i] - 2 * CELL_PAD_X,
        columns[i].align ?? 'left',
      );
    });
    l.y += headH;
  };

  const cellsOf = rows.map((r) => columns.map((c) => c.cell(r)));
  const heights = cellsOf.map((cells) => Math.max(...cells.map((c, i) => cellHeight(l, c, widths[i]))));
  // Keep the header with the first two rows (and whatever the caller keeps above the table).
  ensure(l, (opts.keepAbove ?? 0) + headH + (heights[0] ?? 0) + (heights[1] ?? 0));
  drawHead();
  const continued = () => {
    if (opts.continued) {
      draw(l, `${opts.continued}, continued`, { ...S.small, font: 'semibold' }, l.left, l.y, l.width);
      l.y += lineHeight(l, S.small) + 3;
    }
    drawHead();
  };
  withHook(l, continued, () => {
    cellsOf.forEach((cells, r) => {
      ensure(l, heights[r]);
      const y = l.y;
      if (r % 2 === 1) l.doc.rect(l.left, y, l.width, heights[r]).fill('#F6F8F9');
      cells.forEach((c, i) => {
        const s = c.style ?? S.cell;
        let x = xs[i] + CELL_PAD_X;
        let w = widths[i] - 2 * CELL_PAD_X;
        if (c.mark) {
          const lh = l.doc.font(s.font).fontSize(s.size).currentLineHeight(false);
          drawShape(l.doc, c.mark.shape, x, y + CELL_PAD_Y + lh / 2, s.size * 0.95, c.mark.color);
          x += s.size + 4;
          w -= s.size + 4;
        }
        draw(l, c.text, s, x, y + CELL_PAD_Y, w, columns[i].align ?? 'left');
      });
      l.doc
        .moveTo(l.left, y + heights[r])
        .lineTo(l.right, y + heights[r])
        .lineWidth(0.5)
        .stroke(C.border);
      l.y = y + heights[r];
    });
  });
}

// ——— findings ———

type LoadedPhoto = { ok: true; data: Buffer } | { ok: false };

const THUMB_W = 116;
const THUMB_H = 87;
const THUMB_GAP = 10;

const isJpeg = (b: Buffer) => b.length > 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff;
const isPng = (b: Buffer) => b.length > 8 && b.subarray(0, 8).equals(Buffer.from('89504e470d0a1a0a', 'hex'));

async function loadPhotos(n: NoticeDocument, loadPhoto: PhotoLoader): Promise<Map<string, LoadedPhoto>> {
  const shas = [...new Set(n.findings.flatMap((f) => f.photos.map((p) => p.sha256)))];
  const loaded = await Promise.all(
    shas.map(async (sha): Promise<[string, LoadedPhoto]> => {
      try {
        const data = await loadPhoto(sha);
        // pdfkit embeds JPEG and PNG; anything else prints as not available rather than failing.
        if (data && (isJpeg(data) || isPng(data))) return [sha, { ok: true, data }];
      } catch {
        // A photo that cannot be read must not stop the notice: it prints as not available.
      }
      return [sha, { ok: false }];
    }),
  );
  return new Map(loaded);
}

function drawThumb(l: Layout, photo: LoadedPhoto | undefined, x: number, y: number): boolean {
  const { doc } = l;
  doc.rect(x, y, THUMB_W, THUMB_H).fill(C.surfaceSunk);
  let drawn = false;
  if (photo?.ok) {
    try {
      doc.image(photo.data, x + 3, y + 3, {
        fit: [THUMB_W - 6, THUMB_H - 6],
        align: 'center',
        valign: 'center',
      });
      drawn = true;
    } catch {
      drawn = false;
    }
  }
  if (!drawn) {
    const s: TextStyle = { ...S.small, font: 'semibold' };
    draw(l, 'Photo not available', s, x + 6, y + THUMB_H / 2 - 5, THUMB_W - 12, 'center');
  }
  doc.rect(x, y, THUMB_W, THUMB_H).lineWidth(0.6).stroke(C.border);
  return drawn;
}

function photoGrid(
  l: Layout,
  photos: NoticeDocument['findings'][number]['photos'],
  loaded: Map<string, LoadedPhoto>,
  x: number,
  width: number,
) {
  const perRow = Math.max(1, Math.floor((width + THUMB_GAP) / (THUMB_W + THUMB_GAP)));
  const capStyle: TextStyle = { ...S.small, size: 7.4, gap: 1.2 };
  const captions = photos.map((p) => {
    const ok = loaded.get(p.sha256)?.ok === true;
    const caption = p.caption.trim() || 'Photo';
    return ok ? caption : `${caption} (photo not available)`;
  });
  for (let start = 0; start < photos.length; start += perRow) {
    const row = photos.slice(start, start + perRow);
    const capH = Math.max(...row.map((_, i) => measure(l, captions[start + i], capStyle, THUMB_W)));
    const rowH = THUMB_H + 4 + capH + 6;
    ensure(l, rowH);
    row.forEach((p, i) => {
      const tx = x + i * (THUMB_W + THUMB_GAP);
      drawThumb(l, loaded.get(p.sha256), tx, l.y);
      draw(l, captions[start + i], capStyle, tx, l.y + THUMB_H + 4, THUMB_W);
    });
    l.y += rowH;
  }
}

function findingBlock(l: Layout, f: NoticeDocument['findings'][number], loaded: Map<string, LoadedPhoto>) {
  const info = severityInfo[f.severity];
  const mark = severityMark[f.severity];
  const bandH = 24;
  const indent = 12;
  const bodyW = l.width - indent;
  const firstRowH = Math.min(measure(l, f.description, S.body, bodyW - LABEL_W), lineHeight(l, S.body) * 2);
  ensure(l, bandH + 6 + firstRowH);

  const drawBand = (continued: boolean) => {
    const { doc } = l;
    const y = l.y;
    doc.rect(l.left, y, l.width, bandH).fill(C.surfaceSunk);
    doc.rect(l.left, y, 4, bandH).fill(mark.fg);
    const ts: TextStyle = { font: 'bold', size: 10.5, gap: 0, color: C.text };
    const ty = y + (bandH - l.doc.font(ts.font).fontSize(ts.size).currentLineHeight(false)) / 2;
    const label = continued ? `Finding ${f.number}, continued` : `Finding ${f.number}`;
    setStyle(l, ts);
    doc.text(label, l.left + indent, ty, { lineBreak: false });
    let x = l.left + indent + textWidth(l, label, ts) + 12;
    x += drawMarked(l, mark.shape, mark.fg, info.label, { ...ts, font: 'semibold' }, x, ty);
    if (f.state !== 'open') {
      setStyle(l, { ...S.small, size: 8.5 });
      doc.text(`  ·  ${stateWords[f.state]}`, x, ty + 1.5, { lineBreak: false });
    }
    const due = f.dueOn ? `Due ${formatCalendarDate(f.dueOn)}` : 'No due date';
    const dueStyle: TextStyle = f.dueOn ? { ...ts, size: 11 } : { ...S.small, size: 9 };
    const dw = textWidth(l, due, dueStyle);
    if (f.dueOn) {
      doc
        .roundedRect(l.right - dw - 18, y + 3, dw + 14, bandH - 6, 3)
        .lineWidth(1)
        .fillAndStroke(C.surface, C.text);
    }
    draw(l, due, dueStyle, l.right - dw - 11, ty - 0.5, dw + 2, 'right');
    l.y = y + bandH + 6;
  };

  drawBand(false);
  withHook(
    l,
    () => drawBand(true),
    () => {
      const x = l.left + indent;
      flowPair(l, 'Found', f.description, S.body, x, bodyW);
      flowPair(l, 'Breaches', orNot(f.ruleRef, 'Not stated'), S.body, x, bodyW);
      flowPair(l, 'Required action', orNot(f.requiredAction, 'None required'), S.bodyStrong, x, bodyW);
      if (f.photos.length > 0) {
        const capH = lineHeight(l, S.small) * 2;
        ensure(l, THUMB_H + 10 + capH);
        draw(l, 'PHOTOS', S.label, x, l.y + 1.5, LABEL_W - 8);
        photoGrid(l, f.photos, loaded, x + LABEL_W, bodyW - LABEL_W);
      }
    },
  );
  l.y += 10;
}

// ——— the document ———

function ridePairs(n: NoticeDocument): { left: Pair[]; right: Pair[] } {
  const r = n.ride;
  return {
    left: [
      ['Ride', r.name, S.bodyStrong],
      ['Class', classWords(r.rideClass)],
      ['Maker', orNot(r.maker)],
      ['Model', orNot(r.model)],
      ['Serial number', orNot(r.serial), S.figure],
      ['Year built', orNot(r.year), S.figure],
    ],
    right: [
      ['Site', n.site ? n.site.name : 'No site recorded', S.bodyStrong],
      ...(n.site?.address ? ([['Site address', n.site.address]] as Pair[]) : []),
      ['Operator', n.operator.name, S.bodyStrong],
      ...(n.operator.address ? ([['Operator address', n.operator.address]] as Pair[]) : []),
    ],
  };
}

function inspectionPairs(n: NoticeDocument): { left: Pair[]; right: Pair[] } | null {
  const i = n.inspection;
  if (!i) return null;
  const checklist = n.checklist
    ? `${n.checklist.total} items checked, ${n.checklist.failed} failed`
    : 'No checklist recorded';
  return {
    left: [
      ['Date', formatWhen(i.date), S.bodyStrong],
      ['Type', i.typeLabel],
      ['Inspector', i.inspectorName],
      ['Credential', orNot(i.inspectorCredential)],
    ],
    right: [
      ['Design data', i.designVersion === null ? 'Not recorded' : `Version ${i.designVersion}`],
      ['Load engine', i.engineVersion === null ? 'Not recorded' : `Version ${i.engineVersion}`],
      ['Checklist', checklist],
    ],
  };
}

function titleBlock(l: Layout, n: NoticeDocument, band: number) {
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
  draw(l, formatWhen(n.issuedAt), { ...S.body, font: 'semibold' }, rx, ry, refW, 'right');
  ry += lineHeight(l, S.body);

  l.y = Math.max(y + leftH, ry) + 10;
  l.doc.moveTo(l.left, l.y).lineTo(l.right, l.y).lineWidth(2).stroke(C.accent);
  l.y += 12;
}

function findingsSection(l: Layout, n: NoticeDocument, loaded: Map<string, LoadedPhoto>) {
  heading(l, n.findings.length > 0 ? `Findings (${n.findings.length})` : 'Findings', 24 + 40);
  if (n.findings.length === 0) {
    flowText(l, 'No findings were recorded.', S.body, l.left, l.width);
    return;
  }
  const counts = [...findingSeverities]
    .reverse()
    .map((s) => [s, n.findings.filter((f) => f.severity === s).length] as const)
    .filter(([, c]) => c > 0);
  let x = l.left;
  const s: TextStyle = { ...S.body, font: 'semibold', size: 9 };
  for (const [sev, count] of counts) {
    const w = drawMarked(
      l,
      severityMark[sev].shape,
      severityMark[sev].fg,
      `${count} ${severityInfo[sev].label}`,
      s,
      x,
      l.y,
    );
    x += w + 16;
  }
  l.y += lineHeight(l, s) + 8;
  for (const f of n.findings) findingBlock(l, f, loaded);
}

function severityLegend(l: Layout) {
  heading(l, 'What the severities mean', TABLE_START);
  table(
    l,
    [
      {
        title: 'Severity',
        share: 1.35,
        cell: (s: FindingSeverity) => ({
          text: severityInfo[s].label,
          style: { ...S.cell, font: 'semibold', color: severityMark[s].fg },
          mark: { shape: severityMark[s].shape, color: severityMark[s].fg },
        }),
      },
      { title: 'Meaning', share: 3.4, cell: (s) => ({ text: severityInfo[s].description }) },
      {
        title: 'Ride may run',
        share: 1,
        cell: (s) => ({
          text: severityInfo[s].mayOperate ? 'Yes' : 'No',
          style: { ...S.cell, font: 'semibold' },
        }),
      },
    ],
    [...findingSeverities].reverse(),
    { continued: 'What the severities mean' },
  );
}

function resultsSection(l: Layout, n: NoticeDocument) {
  heading(l, 'Readings and computed values', TABLE_START + 18);
  if (n.results.length === 0) {
    flowText(l, 'This notice carries no readings or computed values.', S.body, l.left, l.width);
    return;
  }
  flowText(
    l,
    'Each value against its design limit. Ratio is the share of the allowance used: 100 % is at the limit.',
    S.small,
    l.left,
    l.width,
  );
  l.y += 5;
  table(
    l,
    [
      {
        title: 'Value checked',
        share: 3.5,
        cell: (r: NoticeDocument['results'][number]) => ({ text: r.label }),
      },
      { title: 'Value', share: 1.3, align: 'right', cell: (r) => ({ text: r.value, style: S.figure }) },
      { title: 'Limit', share: 2, cell: (r) => ({ text: r.limit, style: S.figure }) },
      {
        title: 'Ratio',
        share: 1.05,
        align: 'right',
        cell: (r) => ({ text: formatRatio(r.ratio), style: S.figure }),
      },
      {
        title: 'Status',
        share: 1.45,
        cell: (r) => ({
          text: ENVELOPE_STATUS_LABEL[r.status],
          style: { ...S.cell, font: 'semibold', color: envelopeMark[r.status].fg },
          mark: { shape: envelopeMark[r.status].shape, color: envelopeMark[r.status].fg },
        }),
      },
    ],
    n.results,
    { continued: 'Readings and computed values' },
  );
}

/** The load summary, then the full caution (always printed, with or without a load summary). */
function loadSection(l: Layout, n: NoticeDocument, opts: { showEmpty: boolean }) {
  if (n.loadSummary.length === 0 && opts.showEmpty) {
    heading(l, 'Load summary', 40);
    flowText(l, 'This notice carries no load check.', S.body, l.left, l.width);
  } else if (n.loadSummary.length > 0) {
    heading(l, 'Load summary', TABLE_START + 18);
    flowText(
      l,
      'Peak force at each pivot over one ride cycle, from the load check.',
      S.small,
      l.left,
      l.width,
    );
    l.y += 5;
    table(
      l,
      [
        { title: 'Pivot', share: 3, cell: (r: NoticeDocument['loadSummary'][number]) => ({ text: r.pivot }) },
        {
          title: 'Peak force',
          share: 1.4,
          align: 'right',
          cell: (r) => ({ text: r.peakForce, style: S.figure }),
        },
        {
          title: 'Limit',
          share: 1.6,
          align: 'right',
          cell: (r) =>
            r.limit === null
              ? { text: 'No limit in the design data', style: { ...S.cell, color: C.textMuted, size: 8 } }
              : { text: r.limit, style: S.figure },
        },
      ],
      n.loadSummary,
      { continued: 'Load summary' },
    );
  }
  l.y += 12;
  cautionBox(l, n.caution.trim() || CAUTION_FULL);
}

function cautionBox(l: Layout, text: string) {
  const pad = 11;
  const innerW = l.width - 2 * pad - 6;
  const labelH = lineHeight(l, S.label) + 3;
  const h = pad + labelH + measure(l, text, S.caution, innerW) + pad;
  ensure(l, h);
  const { doc } = l;
  doc.rect(l.left, l.y, l.width, h).fill(C.accentSoft);
  doc.rect(l.left, l.y, l.width, h).lineWidth(1).stroke(C.accent);
  doc.rect(l.left, l.y, 5, h).fill(C.accent);
  draw(l, 'SAFETY CAUTION', { ...S.label, color: C.accent, size: 7.8 }, l.left + pad + 6, l.y + pad, innerW);
  draw(l, text, S.caution, l.left + pad + 6, l.y + pad + labelH, innerW);
  l.y += h;
}

/**
 * A heading and its text. `keepWithNext` is the height of what follows: when the text and that fit on
 * one page together they stay together (so the signatures never stand alone on the last page).
 */
function paragraphSection(l: Layout, title: string, text: string, keepWithNext = 0) {
  const textH = measure(l, text, S.body, l.width);
  const together = headingHeight(l) + textH + keepWithNext <= l.bottom - RUNNING_TOP;
  heading(l, title, together ? textH + keepWithNext : lineHeight(l, S.body) * 2);
  flowText(l, text, S.body, l.left, l.width);
}

function signatureParts(l: Layout, n: NoticeDocument) {
  const gap = 18;
  const colW = (l.width - gap) / 2;
  const pad = 9;
  const sig = n.signature;
  const leftPairs: Pair[] = [
    ['Name', sig.name, S.bodyStrong],
    ['Role', sig.role],
    ['Date', formatWhen(sig.signedAt)],
  ];
  const rows = ['Name', 'Role', 'Date'];
  const introL = `Issued for ${n.issuer.name}`;
  const introR = `Received for ${n.operator.name}`;
  const introH = Math.max(
    measure(l, introL, S.small, colW - 2 * pad),
    measure(l, introR, S.small, colW - 2 * pad),
  );
  const lineRowH = 19;
  const pairsH = Math.max(pairsHeight(l, leftPairs, colW - 2 * pad), rows.length * lineRowH);
  const h = pad + introH + 6 + pairsH + 24 + pad;
  return { gap, colW, pad, leftPairs, rows, introL, introR, introH, lineRowH, h };
}

/** The signature block with its heading, as tall as it will be drawn. */
const signatureHeight = (l: Layout, n: NoticeDocument) => headingHeight(l) + signatureParts(l, n).h;

function signatureBlock(l: Layout, n: NoticeDocument) {
  const { gap, colW, pad, leftPairs, rows, introL, introR, introH, lineRowH, h } = signatureParts(l, n);
  heading(l, 'Signatures', h);
  const { doc } = l;
  const y = l.y;
  for (const x of [l.left, l.left + colW + gap])
    doc.roundedRect(x, y, colW, h, 4).lineWidth(0.8).stroke(C.border);

  // Issuer's side.
  let lx = l.left + pad;
  draw(l, introL, S.small, lx, y + pad, colW - 2 * pad);
  const py = y + pad + introH + 6;
  drawPairs(l, leftPairs, lx, py, colW - 2 * pad);
  const lineY = y + h - pad - 12;
  doc
    .moveTo(lx + LABEL_W, lineY)
    .lineTo(l.left + colW - pad, lineY)
    .lineWidth(0.8)
    .stroke(C.text);
  draw(l, 'SIGNATURE', S.label, lx, lineY - 8, LABEL_W - 8);

  // Operator's side: blank lines to fill in on paper; the app records the acknowledgement itself.
  lx = l.left + colW + gap + pad;
  draw(l, introR, S.small, lx, y + pad, colW - 2 * pad);
  rows.forEach((label, i) => {
    const ry = py + i * lineRowH;
    draw(l, label.toUpperCase(), S.label, lx, ry + 1.5, LABEL_W - 8);
    doc
      .moveTo(lx + LABEL_W, ry + 12)
      .lineTo(l.right - pad, ry + 12)
      .lineWidth(0.5)
      .stroke(C.border);
  });
  doc
    .moveTo(lx + LABEL_W, lineY)
    .lineTo(l.right - pad, lineY)
    .lineWidth(0.8)
    .stroke(C.text);
  draw(l, 'SIGNATURE', S.label, lx, lineY - 8, LABEL_W - 8);
  l.y = y + h;
}

/** Renders a notice to PDF bytes. Photos that cannot be loaded print as "photo not available". */
export async function renderNoticePdf(n: NoticeDocument, opts: NoticePdfOptions): Promise<Buffer> {
  const loaded = await loadPhotos(n, opts.loadPhoto);
  const issued = new Date(n.issuedAt);
  const title = titleOf(n);
  const doc = new PDFDocument({
    size: opts.pageSize,
    margins: { top: 0, bottom: 0, left: 0, right: 0 },
    bufferPages: true,
    autoFirstPage: false,
    font: path.join(fontDir, FONT_FILES.regular),
    lang: 'en',
    displayTitle: true,
    info: {
      Title: `${title} ${n.reference} — ${n.ride.name}`,
      Author: n.issuer.name,
      Subject: `${title} for ${n.operator.name}`,
      Creator: 'Pivotwatch',
      Producer: 'Pivotwatch',
      ...(Number.isNaN(issued.getTime()) ? {} : { CreationDate: issued }),
    },
  });
  for (const [name, data] of Object.entries(fonts())) doc.registerFont(name, data);

  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  doc.addPage();
  const l: Layout = {
    doc,
    pageW: doc.page.width,
    pageH: doc.page.height,
    left: MARGIN_X,
    width: doc.page.width - 2 * MARGIN_X,
    right: doc.page.width - MARGIN_X,
    bottom: doc.page.height - FOOTER_SPACE,
    y: 0,
    pageStart: 0,
    hooks: [],
    title,
    reference: n.reference,
    rideName: n.ride.name,
  };

  titleBlock(l, n, drawFirstHeader(l, n));
  l.pageStart = l.y;
  statusBoxes(l, n);

  heading(l, 'Ride, site and operator', 60);
  const rp = ridePairs(n);
  pairColumns(l, rp.left, rp.right);

  heading(l, 'Inspection', 40);
  const ip = inspectionPairs(n);
  if (ip) pairColumns(l, ip.left, ip.right);
  else
    flowText(
      l,
      'This notice records a change of the ride’s status made outside an inspection. Open findings from earlier inspections are listed below.',
      S.body,
      l.left,
      l.width,
    );

  findingsSection(l, n, loaded);
  if (n.findings.length > 0) severityLegend(l);
  // A status notice made outside an inspection has no readings or load check: leave those sections out.
  if (n.inspection || n.results.length > 0) resultsSection(l, n);
  loadSection(l, n, { showEmpty: n.inspection !== null });
  if (n.note) paragraphSection(l, 'Supervisor’s note', n.note);
  paragraphSection(l, 'How to appeal', n.appeal, signatureHeight(l, n));
  signatureBlock(l, n);

  drawFooters(l, n);
  doc.flushPages();
  doc.end();
  return finished;
}
