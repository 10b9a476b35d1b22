/**
 * The notice e-mail's lines about the ride's pivot life: per pivot the frozen lines of the notice (life
 * used and projected limit, NDT due, flagged wear), with the basis. The assumptions and standards are in
 * the attached PDF; the e-mail's caution closes it as for every computed result.
 */
import type { NoticeDocument } from '@/features/notices/schema';
import { formatCalendarDate } from '@/lib/dates';
import { escapeHtml } from '@/server/notices/words';

export function pivotLifeTextLines(doc: NoticeDocument): string[] {
  const life = doc.pivotLife;
  if (!life) return [];
  return [
    '',
    `Pivot life as of ${formatCalendarDate(life.asOf)}:`,
    ...life.pivots.flatMap((p) => [`${p.name}`, ...p.lines.map((line) => `- ${line}`)]),
    `${life.basis} ${life.log} The assumptions are set out in the attached notice.`,
  ];
}

export function pivotLifeHtml(doc: NoticeDocument): string {
  const life = doc.pivotLife;
  if (!life) return '';
  const h = escapeHtml;
  const pivots = life.pivots
    .map(
      (p) =>
        `<p><strong>${h(p.name)}</strong></p><ul>${p.lines.map((x) => `<li>${h(x)}</li>`).join('')}</ul>`,
    )
    .join('');
  return (
    `<h3>Pivot life as of ${h(formatCalendarDate(life.asOf))}</h3>${pivots}` +
    `<p style="font-size: 90%">${h(life.basis)} ${h(life.log)} The assumptions are set out in the attached notice.</p>`
  );
}
