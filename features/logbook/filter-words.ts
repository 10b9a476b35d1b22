/** The filter in words, as the PDF states it and the page sums it up: "Findings, Notices · from 1 May 2026". */
import { logbookKinds, logbookKindWords, type LogbookFilter } from '@/features/logbook/schema';
import { formatDate } from '@/lib/dates';

export function filterWords(f: LogbookFilter): string {
  const kinds =
    f.kinds && f.kinds.length > 0 && f.kinds.length < logbookKinds.length
      ? logbookKinds
          .filter((k) => f.kinds?.includes(k))
          .map((k) => logbookKindWords[k].chip)
          .join(', ')
      : 'Every kind of entry';
  const dates =
    f.from && f.to
      ? `${formatDate(f.from)} to ${formatDate(f.to)}`
      : f.from
        ? `from ${formatDate(f.from)}`
        : f.to
          ? `up to ${formatDate(f.to)}`
          : 'all dates';
  return [kinds, dates, f.q ? `containing “${f.q}”` : null].filter(Boolean).join(' · ');
}
