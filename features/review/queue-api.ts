import { keepPreviousData, useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { type QueryParams, toSearch } from '@/lib/list-params';
import { reviewKeys } from '@/features/review/keys';
import { type QueueQuery, queueResponseSchema } from '@/features/review/schema';

/** The queue moves as inspections arrive and decisions are made; a supervisor leaves it open all day. */
const QUEUE_STALE_MS = 15 * 1000;
const QUEUE_REFRESH_MS = 60 * 1000;

/** Drops empty values, so the same filters spelt differently share one cache entry. */
function cleanQuery(query: Partial<QueueQuery>): Record<string, string | number | string[]> {
  const out: Record<string, string | number | string[]> = {};
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    if (Array.isArray(value)) {
      if (value.length > 0) out[key] = [...value];
    } else out[key] = value;
  }
  return out;
}

/** The URL of one page of the queue (`GET /api/review/queue`), lists as comma lists. */
function queueUrl(query: Partial<QueueQuery>): string {
  return `/api/review/queue${toSearch(cleanQuery(query) as QueryParams)}`;
}

/**
 * One page of the supervisors' queue: filtered, searched, sorted and paged by the server. While the next
 * page or filter loads, the previous answer stays on screen (`isPlaceholderData` says so).
 */
export function useReviewQueue(query: Partial<QueueQuery>) {
  const cleaned = cleanQuery(query);
  return useQuery({
    queryKey: reviewKeys.queue(cleaned),
    queryFn: ({ signal }) => apiFetch(queueUrl(query), { schema: queueResponseSchema, signal }),
    staleTime: QUEUE_STALE_MS,
    refetchInterval: QUEUE_REFRESH_MS,
    placeholderData: keepPreviousData,
  });
}
