import { useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api/client';
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
