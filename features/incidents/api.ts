import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import {
  incidentCreatedSchema,
  incidentSchema,
  rideIncidentsResponseSchema,
  type IncidentInput,
} from '@/features/incidents/schema';
import { rideKeys } from '@/features/rides';

/** Query keys of incident reports; every query and mutation of the feature keys through these. */
export const incidentKeys = {
  all: ['incidents'] as const,
  ride: (rideId: string) => [...incidentKeys.all, 'ride', rideId] as const,
  detail: (id: string) => [...incidentKeys.all, 'detail', id] as const,
};

const enc = encodeURIComponent;

export function useRideIncidents(rideId: string) {
  return useQuery({
    queryKey: incidentKeys.ride(rideId),
    queryFn: ({ signal }) =>
      apiFetch(`/api/rides/${enc(rideId)}/incidents`, { schema: rideIncidentsResponseSchema, signal }),
    staleTime: 15 * 1000,
  });
}

export function useIncident(id: string) {
  return useQuery({
    queryKey: incidentKeys.detail(id),
    queryFn: ({ signal }) => apiFetch(`/api/incidents/${enc(id)}`, { schema: incidentSchema, signal }),
  });
}

/** Sends a report; a stop with it changes the ride, so the ride's own queries are read again too. */
export function useReportIncident(rideId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: IncidentInput) =>
      apiFetch(`/api/rides/${enc(rideId)}/incidents`, { body, schema: incidentCreatedSchema }),
    onSuccess: async () => {
      await Promise.all([
        client.invalidateQueries({ queryKey: incidentKeys.ride(rideId) }),
        client.invalidateQueries({ queryKey: rideKeys.all }),
      ]);
    },
  });
}

export function useReviewIncident(id: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (note: string) =>
      apiFetch(`/api/incidents/${enc(id)}/review`, { body: { note }, schema: incidentSchema }),
    onSuccess: (incident) => {
      client.setQueryData(incidentKeys.detail(id), incident);
      return client.invalidateQueries({ queryKey: incidentKeys.ride(incident.rideId) });
    },
  });
}
