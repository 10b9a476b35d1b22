import { keepPreviousData, useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { logbookPageSchema, type LogbookFilter } from '@/features/logbook/schema';
import { clean, toSearch } from '@/lib/list-params';

export const logbookKeys = {
  all: ['logbook'] as const,
  ride: (rideId: string) => [...logbookKeys.all, rideId] as const,
  page: (rideId: string, query: LogbookFilter & { page: number }) =>
    [...logbookKeys.ride(rideId), clean(query)] as const,
};

/** Entries arrive with every decision, notice and report: a short stale time keeps the list near now. */
const LOGBOOK_STALE_MS = 15 * 1000;

const enc = encodeURIComponent;

/** The filter as the API's query string (the page, the CSV and the PDF share it). */
export const logbookSearch = (f: LogbookFilter, extra: Record<string, string | number | undefined> = {}) =>
  toSearch({ kinds: f.kinds, from: f.from, to: f.to, q: f.q, ...extra });

export const logbookCsvPath = (rideId: string, f: LogbookFilter) =>
  `/api/rides/${enc(rideId)}/logbook.csv${logbookSearch(f)}`;
export const logbookPdfPath = (rideId: string, f: LogbookFilter, size: 'A4' | 'LETTER') =>
  `/api/rides/${enc(rideId)}/logbook.pdf${logbookSearch(f, { size })}`;

export function useLogbookQuery(rideId: string, query: LogbookFilter & { page: number }) {
  return useQuery({
    queryKey: logbookKeys.page(rideId, query),
    queryFn: () =>
      apiFetch(
        `/api/rides/${enc(rideId)}/logbook${logbookSearch(query, { page: query.page > 1 ? query.page : undefined })}`,
        {
          schema: logbookPageSchema,
        },
      ),
    staleTime: LOGBOOK_STALE_MS,
    placeholderData: keepPreviousData,
  });
}
