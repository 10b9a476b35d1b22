/**
 * The logbook as a PDF, on our layout engine (server/pdf): a title block with the ride and the filter, a
 * table of the entries newest first (its header repeated on every page), the full caution, and on every
 * page a running header and "Page n of m".
 */
import { logbookKindWords } from '@/features/logbook/schema';
import { filterWords } from '@/features/logbook';
import type { LogbookFilter } from '@/features/logbook/schema';
import { CAUTION_FULL } from '@/lib/caution-text';
import { colors as C } from '@/lib/colors';
import { formatDateTime, formatWhen } from '@/lib/dates';
import type { LogbookRead } from '@/server/logbook/logbook';
import { startPdf } from '@/server/pdf/document';
import {
  draw,
  drawLine,
  flowText,
  heading,
  lineHeight,
  measure,
  S,
  textWidth,
  type Layout,
  type TextStyle,
} from '@/server/pdf/layout';
import { table, TABLE_START } from '@/server/pdf/table';

const MARGIN_X = 50;
const FOOTER_SPACE = 60;

export type LogbookPdfInput = LogbookRead & {
  filter: LogbookFilter;
  printedFor: string;
  printedAt: string;
  size: 'A4' | 'LETTER';
};

function runningHeader(r: LogbookPdfInput) {
  return (l: Layout) => {
    const y = 26;
    drawLine(
      l,
      `Pivotwatch  ·  Ride logbook  ·  ${r.ride.name}`,
      { ...S.small, font: 'semibold', color: C.base },
      l.left,
      y,
      l.width,
    );
    l.doc
      .moveTo(l.left, y + 15)
      .lineTo(l.right, y + 15)
      .lineWidth(0.6)
      .stroke(C.border);
  };
}

function titleBlock(l: Layout, r: LogbookPdfInput) {
  const title: TextStyle = { font: 'bold', size: 21, gap: 0, color: C.text };
  draw(l, 'Ride logbook', title, l.left, l.y, l.width);
  l.y += lineHeight(l, title) + 2;
  const sub = [r.ride.name, r.ride.siteName ?? 'No site', r.ride.operatorName].join(' · ');
  const subStyle: TextStyle = { font: 'semibold', size: 11, gap: 1, color: C.text };
  draw(l, sub, subStyle, l.left, l.y, l.width);
  l.y += measure(l, sub, subStyle, l.width) + 6;
  for (const line of [
    `Entries: ${filterWords(r.filter)} — ${r.events.length} ${r.events.length === 1 ? 'entry' : 'entries'}, newest first.`,
    `Times on the site’s clock (${r.ride.timeZone}).`,
    `Printed for ${r.printedFor}, ${formatWhen(r.printedAt, r.ride.timeZone)}.`,
  ]) {
    draw(l, line, S.body, l.left, l.y, l.width);
    l.y += measure(l, line, S.body, l.width) + 1;
  }
  l.y += 6;
}

function drawFooters(l: Layout, r: LogbookPdfInput) {
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
      `Ride logbook  ·  ${r.ride.name}  ·  a decision aid; see the caution`,
      s,
      l.left,
      y + 7,
      l.width - pw - 12,
    );
    draw(l, pageWord, { ...s, font: 'semibold' }, l.right - pw - 1, y + 7, pw + 2, 'right');
  }
}

export function renderLogbookPdf(r: LogbookPdfInput): Promise<Buffer> {
  const { doc, finished } = startPdf({
    size: r.size,
    margins: 0,
    autoFirstPage: false,
    title: `Ride logbook — ${r.ride.name}`,
    author: 'Pivotwatch',
    subject: `Logbook of ${r.ride.name}: ${filterWords(r.filter)}`,
    createdAt: r.printedAt,
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
    y: 50,
    pageStart: 0,
    hooks: [],
    runningHeader: runningHeader(r),
  };
  titleBlock(l, r);
  l.pageStart = l.y;

  heading(l, 'Entries', TABLE_START);
  if (r.events.length === 0) flowText(l, 'No entries match this filter.', S.body, l.left, l.width);
  else
    table(
      l,
      [
        {
          title: 'When',
          share: 1.35,
          cell: (e) => ({ text: formatDateTime(e.at, r.ride.timeZone), style: S.figure }),
        },
        { title: 'Kind', share: 1.05, cell: (e) => ({ text: logbookKindWords[e.kind].label }) },
        {
          title: 'Entry',
          share: 4,
          cell: (e) => ({
            text: [e.title, ...e.detail, ...e.documents.map((d) => `Document: ${d.label}`)].join('\n'),
          }),
        },
        { title: 'Who', share: 1.3, cell: (e) => ({ text: e.who ?? '—' }) },
      ],
      r.events,
      { continued: 'Entries' },
    );

  heading(l, 'Caution', 40);
  flowText(l, CAUTION_FULL, S.caution, l.left, l.width);

  drawFooters(l, r);
  doc.flushPages();
  doc.end();
  return finished;
}
