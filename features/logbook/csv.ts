/**
 * The logbook as a CSV file (RFC 4180: a header row, commas between cells, CRLF between records, a cell
 * holding a comma, quote or line break in double quotes with "" for a quote). Detail lines go into one
 * cell, separated by line breaks inside its quotes; documents as their API paths.
 */
import { logbookKindWords, type LogbookEvent } from '@/features/logbook/schema';
import { csvCell } from '@/features/registry';

export const LOGBOOK_CSV_COLUMNS = [
  'at',
  'site_day',
  'kind',
  'title',
  'detail',
  'who',
  'link',
  'documents',
] as const;

export function logbookToCsv(events: readonly LogbookEvent[]): string {
  const rows = [LOGBOOK_CSV_COLUMNS.join(',')];
  for (const e of events)
    rows.push(
      [
        e.at,
        e.day,
        logbookKindWords[e.kind].label,
        e.title,
        e.detail.join('\n'),
        e.who ?? '',
        e.link?.href ?? '',
        e.documents.map((d) => d.apiPath).join(' '),
      ]
        .map(csvCell)
        .join(','),
    );
  return `${rows.join('\r\n')}\r\n`;
}
