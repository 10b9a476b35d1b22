import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { registryKeys } from '@/features/registry/api';
import {
  roundWeekSchema,
  setupListResponseSchema,
  setupResponseSchema,
  siteEventListResponseSchema,
  siteEventResponseSchema,
  type RoundItemInput,
  type RoundOrderInput,
  type SetupInput,
  type SetupStateInput,
  type SiteEventInput,
} from '@/features/registry/schema';
import { rideKeys } from '@/features/rides';

const enc = encodeURIComponent;
const FRESH_MS = 30 * 1000;

/** A ride's set-ups, oldest build-up first (operators: their own rides' only; the server answers 404). */
export function useRideSetupsQuery(rideId: string) {
  return useQuery({
    queryKey: registryKeys.rideSetups(rideId),
    queryFn: async () =>
      (await apiFetch(`/api/rides/${enc(rideId)}/setups`, { schema: setupListResponseSchema })).setups,
    staleTime: FRESH_MS,
  });
}

export function useSiteEventsQuery(enabled = true) {
  return useQuery({
    queryKey: registryKeys.siteEvents(),
    queryFn: async () => (await apiFetch('/api/site-events', { schema: siteEventListResponseSchema })).events,
    staleTime: FRESH_MS,
    enabled,
  });
}

/** A set-up moves the ride, its status, its schedule and the rounds: all of them read anew. */
function useInvalidateAfterSetup() {
  const client = useQueryClient();
  return () =>
    Promise.all([
      client.invalidateQueries({ queryKey: rideKeys.all }),
      client.invalidateQueries({ queryKey: registryKeys.all }),
    ]);
}

export function useSetupCreateMutation() {
  const invalidate = useInvalidateAfterSetup();
  return useMutation({
    mutationFn: (body: SetupInput) => apiFetch('/api/setups', { body, schema: setupResponseSchema }),
    onSuccess: invalidate,
  });
}

export function useSetupStateMutation() {
  const invalidate = useInvalidateAfterSetup();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: SetupStateInput }) =>
      apiFetch(`/api/setups/${enc(id)}/state`, { body, schema: setupResponseSchema }),
    onSuccess: invalidate,
  });
}

/** The planner's week holding `day` (Monday to Sunday). */
export function useRoundWeekQuery(day: string) {
  return useQuery({
    queryKey: registryKeys.roundWeek(day),
    queryFn: () => apiFetch(`/api/rounds?week=${enc(day)}`, { schema: roundWeekSchema }),
    staleTime: FRESH_MS,
  });
}

export function useRoundItemMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ scheduleId, body }: { scheduleId: string; body: RoundItemInput }) =>
      apiFetch(`/api/rounds/items/${enc(scheduleId)}`, { method: 'PUT', body }),
    onSuccess: () => client.invalidateQueries({ queryKey: registryKeys.schedules() }),
  });
}

export function useRoundOrderMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: RoundOrderInput) => apiFetch('/api/rounds/order', { method: 'PUT', body }),
    onSuccess: () => client.invalidateQueries({ queryKey: registryKeys.rounds() }),
  });
}

export function useSiteEventCreateMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: SiteEventInput) =>
      apiFetch('/api/site-events', { body, schema: siteEventResponseSchema }),
    onSuccess: () => client.invalidateQueries({ queryKey: registryKeys.setups() }),
  });
}
