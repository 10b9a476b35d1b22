import { useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import type { CycleResolution } from '@/features/loads/cycle-resolution-schema';
import {
  inspectionCycleSchema,
  inspectionResponseSchema,
  inspectionTrailSchema,
} from '@/features/review/inspection-schema';
import { reviewKeys } from '@/features/review/keys';
import { trendsResponseSchema } from '@/features/review/schema';

const enc = encodeURIComponent;

/** A submitted record never changes; only its review state and analysis do, so a short freshness will do. */
const INSPECTION_STALE_MS = 30 * 1000;
/** The recomputed cycle depends only on the immutable record and its design version. */
const CYCLE_STALE_MS = 10 * 60 * 1000;
const TRENDS_STALE_MS = 60 * 1000;

/**
 * One inspection with everything the desk shows: `GET /api/inspections/:id`. The cache entry holds the
 * whole answer, `{ inspection }`, because the decision panel updates its review state in place there.
 */
export function useInspectionReview(id: string) {
  return useQuery({
    queryKey: reviewKeys.inspection(id),
    queryFn: ({ signal }) =>
      apiFetch(`/api/inspections/${enc(id)}`, { schema: inspectionResponseSchema, signal }),
    enabled: !!id,
    staleTime: INSPECTION_STALE_MS,
  });
}

/**
 * The inspection's ride cycle as the server recomputes it for the charts (`GET /api/inspections/:id/cycle`),
 * bounded (every peak kept) unless every sample is asked for. A 404 means there is no design data to run
 * the engine on; the screen says so instead of retrying.
 */
export function useInspectionCycle(id: string, enabled = true, resolution: CycleResolution = 'bounded') {
  return useQuery({
    queryKey: reviewKeys.cycle(id, resolution),
    queryFn: ({ signal }) =>
      apiFetch(`/api/inspections/${enc(id)}/cycle${resolution === 'full' ? '?resolution=full' : ''}`, {
        schema: inspectionCycleSchema,
        signal,
      }),
    enabled: enabled && !!id,
    staleTime: CYCLE_STALE_MS,
    // The chain drawing and the charts both read it; the second must not ask again after a 404.
    retryOnMount: false,
  });
}

/** The ride's inspections oldest first with what drifts (`GET /api/rides/:id/trends`). */
export function useRideTrends(rideId: string, enabled = true) {
  return useQuery({
    queryKey: reviewKeys.trends(rideId),
    queryFn: ({ signal }) =>
      apiFetch(`/api/rides/${enc(rideId)}/trends`, { schema: trendsResponseSchema, signal }),
    enabled: enabled && !!rideId,
    staleTime: TRENDS_STALE_MS,
  });
}

/** Who did what to the inspection (`GET /api/inspections/:id/trail`), newest first. */
export function useInspectionTrail(id: string) {
  return useQuery({
    queryKey: reviewKeys.trail(id),
    queryFn: async ({ signal }) =>
      (await apiFetch(`/api/inspections/${enc(id)}/trail`, { schema: inspectionTrailSchema, signal }))
        .entries,
    enabled: !!id,
    staleTime: INSPECTION_STALE_MS,
  });
}
