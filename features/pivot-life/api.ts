import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import {
  runningLogImportResponseSchema,
  runningLogResponseSchema,
  runningLogSaveResponseSchema,
} from '@/features/pivot-life/running-log-schema';
import { rideLifeSchema, type RunningLogEntry } from '@/features/pivot-life/schema';

export const pivotLifeKeys = {
  all: ['pivot-life'] as const,
  ride: (rideId: string) => [...pivotLifeKeys.all, 'ride', rideId] as const,
  life: (rideId: string) => [...pivotLifeKeys.ride(rideId), 'life'] as const,
  runningLog: (rideId: string) => [...pivotLifeKeys.ride(rideId), 'running-log'] as const,
};

/** The life moves only with the log, an analysis or an NDT record: a minute is fresh enough. */
const LIFE_STALE_MS = 60 * 1000;

const enc = encodeURIComponent;

export function useRideLifeQuery(rideId: string, enabled = true) {
  return useQuery({
    queryKey: pivotLifeKeys.life(rideId),
    queryFn: () => apiFetch(`/api/rides/${enc(rideId)}/life`, { schema: rideLifeSchema }),
    staleTime: LIFE_STALE_MS,
    enabled,
  });
}

export function useRunningLogQuery(rideId: string) {
  return useQuery({
    queryKey: pivotLifeKeys.runningLog(rideId),
    queryFn: () => apiFetch(`/api/rides/${enc(rideId)}/running-log`, { schema: runningLogResponseSchema }),
    staleTime: LIFE_STALE_MS,
  });
}

/** A log write moves the ride's life (damage, rate, wear by cycles) as well as the log. */
function useInvalidateRide(rideId: string) {
  const client = useQueryClient();
  return () => client.invalidateQueries({ queryKey: pivotLifeKeys.ride(rideId) });
}

export function useLogDayMutation(rideId: string) {
  const invalidate = useInvalidateRide(rideId);
  return useMutation({
    mutationFn: (body: RunningLogEntry) =>
      apiFetch(`/api/rides/${enc(rideId)}/running-log`, { body, schema: runningLogSaveResponseSchema }),
    onSuccess: invalidate,
  });
}

export function useLogImportMutation(rideId: string) {
  const invalidate = useInvalidateRide(rideId);
  return useMutation({
    mutationFn: (csv: string) =>
      apiFetch(`/api/rides/${enc(rideId)}/running-log/import`, {
        body: { csv },
        schema: runningLogImportResponseSchema,
      }),
    onSuccess: invalidate,
  });
}
