/**
 * The notice's sections other than the findings: the operating-status boxes, the ride and inspection facts,
 * the readings against their limits, the load summary with the caution, and plain paragraphs.
 */
import { colors as C } from '@/lib/colors';
import { CAUTION_FULL } from '@/lib/caution-text';
import { formatWhen } from '@/lib/dates';
import {
  envelopeStatusVocabulary,
  rideClasses,
  rideClassVocabulary,
  rideStatusVocabulary,
  type RideClass,
} from '@/lib/vocabulary';
import { formatRatio } from '@/features/loads/format';
import { noticeUnitsText, type NoticeDocument } from '@/features/notices/schema';
import { orNot } from '@/server/notices/words';
import {
  draw,
  ensure,
  flowText,
  heading,
  headingHeight,
  lineHeight,
  measure,
  RUNNING_TOP,
  S,
  type Layout,
  type Pair,
  type TextStyle,
} from '@/server/pdf/layout';
import { drawMarkIcon, markInk } from '@/server/pdf/marks';
import { table, TABLE_START } from '@/server/pdf/table';

/** A ride class's words; a class this server does not know (an older record) prints as stored. */
const classWords = (c: string) =>
  (rideClasses as readonly string[]).includes(c) ? rideClassVocabulary[c as RideClass].label : c;

export function statusBoxes(l: Layout, n: NoticeDocument) {
  const status = rideStatusVocabulary[n.operatingStatus.status];
  const mark = markInk(status.mark);
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
  drawMarkIcon(doc, status.mark, lx, cy + lineHeight(l, wordStyle) / 2 - 1, shapeSize);
  draw(l, status.label, wordStyle, lx + shapeSize + 8, cy, leftW - 2 * pad - shapeSize - 8);
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

export function ridePairs(n: NoticeDocument): { left: Pair[]; right: Pair[] } {
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

export function inspectionPairs(n: NoticeDocument): { left: Pair[]; right: Pair[] } | null {
  const i = n.inspection;
  if (!i) return null;
  const checklist = n.checklist
    ? `${n.checklist.total} items checked, ${n.checklist.failed} failed`
    : 'No checklist recorded';
  return {
    left: [
      ['Date', formatWhen(i.date, n.timeZone), S.bodyStrong],
      ['Type', i.typeLabel],
      ['Inspector', i.inspectorName],
      ['Credential', orNot(i.inspectorCredential)],
    ],
    right: [
      ['Design data', i.designVersion === null ? 'Not recorded' : `Version ${i.designVersion}`],
      ['Load engine', i.engineVersion === null ? 'Not recorded' : `Version ${i.engineVersion}`],
      ...(i.governingCase ? ([['Governing case', i.governingCase]] as Pair[]) : []),
      ['Checklist', checklist],
    ],
  };
}

export function resultsSection(l: Layout, n: NoticeDocument) {
  heading(l, 'Readings and computed values', TABLE_START + 18);
  if (n.results.length === 0) {
    flowText(l, 'This notice carries no readings or computed values.', S.body, l.left, l.width);
    return;
  }
  flowText(
    l,
    `Each value against its design limit. Ratio is the share of the allowance used: 100 % is at the limit. ${noticeUnitsText(n)}`,
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
          text: envelopeStatusVocabulary[r.status].label,
          style: { ...S.cell, font: 'semibold', color: markInk(envelopeStatusVocabulary[r.status].mark).fg },
          mark: envelopeStatusVocabulary[r.status].mark,
        }),
      },
    ],
    n.results,
    { continued: 'Readings and computed values' },
  );
}

/** The load summary, then the full caution (always printed, with or without a load summary). */
export function loadSection(l: Layout, n: NoticeDocument, opts: { showEmpty: boolean }) {
  if (n.loadSummary.length === 0 && opts.showEmpty) {
    heading(l, 'Load summary', 40);
    flowText(l, 'This notice carries no load check.', S.body, l.left, l.width);
  } else if (n.loadSummary.length > 0) {
    heading(l, 'Load summary', TABLE_START + 18);
    flowText(
      l,
      `Peak force at each pivot over one ride cycle, from the load check. ${noticeUnitsText(n)}`,
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
export function paragraphSection(l: Layout, title: string, text: string, keepWithNext = 0) {
  const textH = measure(l, text, S.body, l.width);
  const together = headingHeight(l) + textH + keepWithNext <= l.bottom - RUNNING_TOP;
  heading(l, title, together ? textH + keepWithNext : lineHeight(l, S.body) * 2);
  flowText(l, text, S.body, l.left, l.width);
}
