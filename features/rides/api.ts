import { useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api/client';
import { rideDetailResponseSchema } from '@/features/registry/schema';
import { rideListResponseSchema } from '@/features/rides/schema';

export const rideKeys = {
  all: ['rides'] as const,
  list: () => [...rideKeys.all, 'list'] as const,
  /** One page of the register's ride list, keyed by its (cleaned) query. */
  page: (query: Record<string, unknown>) => [...rideKeys.all, 'page', query] as const,
  detail: (id: string) => [...rideKeys.all, 'detail', id] as const,
};

const RIDES_STALE_MS = 60 * 1000;

export function useRidesQuery() {
  return useQuery({
    queryKey: rideKeys.list(),
    queryFn: async () => (await apiFetch('/api/rides', { schema: rideListResponseSchema })).rides,
    staleTime: RIDES_STALE_MS,
  });
}

/**
 * The ride with its current design data. Parsed with the register's schema (which also carries the
 * version's origin) so every screen that shares this cache entry sees the same shape.
 */
export function useRideQuery(id: string | null) {
  return useQuery({
    queryKey: rideKeys.detail(id ?? ''),
    queryFn: () =>
      apiFetch(`/api/rides/${encodeURIComponent(id ?? '')}`, { schema: rideDetailResponseSchema }),
    enabled: !!id,
    staleTime: RIDES_STALE_MS,
  });
}
