import { useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api/client';
import { rideDetailResponseSchema } from '@/features/rides/detail-schema';
import { rideListResponseSchema } from '@/features/rides/schema';

export const rideKeys = {
  all: ['rides'] as const,
  list: () => [...rideKeys.all, 'list'] as const,
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

export function useRideQuery(id: string | null) {
  return useQuery({
    queryKey: rideKeys.detail(id ?? ''),
    queryFn: () => apiFetch(`/api/rides/${encodeURIComponent(id ?? '')}`, { schema: rideDetailResponseSchema }),
    enabled: !!id,
    staleTime: RIDES_STALE_MS,
  });
}
