/**
 * A small layout engine over pdfkit for documents laid out on a fixed grid (the notice): text styles,
 * measuring, a cursor that starts a new page when a block does not fit, text that flows over a page break
 * between words, headings kept with what follows, and label/value pairs. Page furniture (the running
 * header drawn on every new page) is the document's own, passed in as `runningHeader`.
 */
import { colors as C } from '@/lib/colors';
import type { FontName } from '@/server/pdf/fonts';

export type Doc = PDFKit.PDFDocument;

export type TextStyle = { font: FontName; size: number; gap: number; color: string; spacing?: number };
export const S = {
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

// ——— the page and its cursor ———

/** Where content starts on a page after the first (below the running header). */
export const RUNNING_TOP = 58;

export type Layout = {
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
  /** Draws the document's header at the top of every page after the first. */
  runningHeader: (l: Layout) => void;
};

export function setStyle(l: Layout, s: TextStyle) {
  l.doc.font(s.font).fontSize(s.size).fillColor(s.color);
}

export function measure(l: Layout, text: string, s: TextStyle, width: number): number {
  setStyle(l, s);
  return l.doc.heightOfString(text, { width, lineGap: s.gap, characterSpacing: s.spacing ?? 0 });
}

export function lineHeight(l: Layout, s: TextStyle): number {
  setStyle(l, s);
  return l.doc.currentLineHeight(true) + s.gap;
}

export function textWidth(l: Layout, text: string, s: TextStyle): number {
  setStyle(l, s);
  return l.doc.widthOfString(text, { characterSpacing: s.spacing ?? 0 });
}

export function draw(
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
export function drawLine(
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
  l.runningHeader(l);
  l.y = RUNNING_TOP;
  for (const hook of l.hooks) hook();
  l.pageStart = l.y;
}

/** Starts a new page unless `h` fits in what is left of this one (or this page has nothing on it yet). */
export function ensure(l: Layout, h: number): boolean {
  if (l.y + h <= l.bottom || l.y <= l.pageStart + 0.5) return false;
  newPage(l);
  return true;
}

export function withHook<T>(l: Layout, hook: () => void, fn: () => T): T {
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
export function flowText(l: Layout, text: string, s: TextStyle, x: number, width: number) {
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

// ——— headings and label/value pairs ———

/** A section heading's height: space above, the title, its rule and the space below. */
export const headingHeight = (l: Layout) => 14 + lineHeight(l, S.heading) + 9;

/** A section heading, kept on one page with the first `keepWith` points of what follows. */
export function heading(l: Layout, title: string, keepWith: number) {
  ensure(l, headingHeight(l) + keepWith);
  if (l.y > l.pageStart + 0.5) l.y += 14;
  draw(l, title, S.heading, l.left, l.y, l.width);
  l.y += lineHeight(l, S.heading) + 2;
  l.doc.moveTo(l.left, l.y).lineTo(l.right, l.y).lineWidth(0.8).stroke(C.base);
  l.y += 7;
}

export type Pair = [label: string, value: string, style?: TextStyle];

export const LABEL_W = 96;

export function pairsHeight(l: Layout, pairs: Pair[], width: number): number {
  return pairs.reduce((sum, [label, value, s]) => {
    const lh = measure(l, label.toUpperCase(), S.label, LABEL_W - 8);
    const vh = measure(l, value, s ?? S.body, width - LABEL_W);
    return sum + Math.max(lh + 1.5, vh) + 4;
  }, 0);
}

export function drawPairs(l: Layout, pairs: Pair[], x: number, y: number, width: number): number {
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
export function pairColumns(l: Layout, left: Pair[], right: Pair[]) {
  const gap = 18;
  const colW = (l.width - gap) / 2;
  const h = Math.max(pairsHeight(l, left, colW), pairsHeight(l, right, colW));
  ensure(l, h);
  drawPairs(l, left, l.left, l.y, colW);
  drawPairs(l, right, l.left + colW + gap, l.y, colW);
  l.y += h;
}

/** A label/value row whose value may run over a page break. */
export function flowPair(l: Layout, label: string, value: string, s: TextStyle, x: number, width: number) {
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
