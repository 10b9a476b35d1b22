/**
 * The notice's "Pivot life" section: per pivot, each fatigue detail's life used and projected limit date,
 * the NDT due dates and the wear projections flagged, then the basis, the running log, the assumptions and
 * the standards, in the words frozen into the notice (features/pivot-life/life-words.ts).
 */
import type { NoticeDocument } from '@/features/notices/schema';
import { formatCalendarDate } from '@/lib/dates';
import { ensure, flowText, heading, lineHeight, S, type Layout } from '@/server/pdf/layout';

const INDENT = 10;

export function pivotLifeSection(l: Layout, n: NoticeDocument) {
  const life = n.pivotLife;
  if (!life) return;
  heading(l, 'Pivot life', lineHeight(l, S.body) * 4);
  flowText(l, `As of ${formatCalendarDate(life.asOf)}. ${life.basis} ${life.log}`, S.small, l.left, l.width);
  for (const pivot of life.pivots) {
    l.y += 6;
    // Keep a pivot's name with its first line.
    ensure(l, lineHeight(l, S.bodyStrong) + lineHeight(l, S.body) * 2);
    flowText(l, pivot.name, S.bodyStrong, l.left, l.width);
    for (const line of pivot.lines) flowText(l, `• ${line}`, S.body, l.left + INDENT, l.width - INDENT);
  }
  l.y += 6;
  flowText(l, 'Assumptions', { ...S.label, size: 7.8 }, l.left, l.width);
  for (const a of life.assumptions) flowText(l, `• ${a}`, S.small, l.left + INDENT, l.width - INDENT);
  l.y += 3;
  for (const s of life.standards) flowText(l, s, S.small, l.left, l.width);
}
