import { useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { rideListResponseSchema } from '@/features/rides/schema';

export const rideKeys = {
  all: ['rides'] as const,
  list: () => [...rideKeys.all, 'list'] as const,
  /** One page of the register's ride list, keyed by its (cleaned) query. */
  page: (query: Record<string, unknown>) => [...rideKeys.all, 'page', query] as const,
  detail: (id: string) => [...rideKeys.all, 'detail', id] as const,
};

export const RIDES_STALE_MS = 60 * 1000;

export function useRidesQuery() {
  return useQuery({
    queryKey: rideKeys.list(),
    queryFn: async () => (await apiFetch('/api/rides', { schema: rideListResponseSchema })).rides,
    staleTime: RIDES_STALE_MS,
  });
}
