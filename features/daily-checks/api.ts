/** The daily checks' hooks: the server's view (online) and the phone's own (device database, offline). */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { randomUUID } from 'expo-crypto';

import { apiFetch } from '@/features/api';
import {
  readDailyRides,
  sentDailyChecks,
  startDailyCheck,
  submitDailyCheck,
} from '@/features/daily-checks/device';
import { dailyOverviewResponseSchema, rideDailyChecksResponseSchema } from '@/features/daily-checks/schema';
import { fieldKeys } from '@/features/device-db';
import { useDeviceDb } from '@/features/device-db/ui';
import type { Draft } from '@/features/records';
import type { Declaration } from '@/features/records/schema';
import type { ChecklistTemplate } from '@/features/registry/schema';

const enc = encodeURIComponent;

export const dailyKeys = {
  all: ['daily-checks'] as const,
  overview: () => [...dailyKeys.all, 'overview'] as const,
  ride: (id: string) => [...dailyKeys.all, 'ride', id] as const,
  /** The phone's own: rides with a checklist and checks in progress, and what was sent. */
  phoneRides: () => [...fieldKeys.all, 'daily-rides'] as const,
  phoneSent: () => [...fieldKeys.all, 'daily-sent'] as const,
};

export function useDailyOverviewQuery() {
  return useQuery({
    queryKey: dailyKeys.overview(),
    queryFn: ({ signal }) =>
      apiFetch('/api/daily-checks/overview', { schema: dailyOverviewResponseSchema, signal }),
    staleTime: 30_000,
  });
}

export function useRideDailyChecksQuery(rideId: string) {
  return useQuery({
    queryKey: dailyKeys.ride(rideId),
    queryFn: ({ signal }) =>
      apiFetch(`/api/rides/${enc(rideId)}/daily-checks`, { schema: rideDailyChecksResponseSchema, signal }),
    staleTime: 30_000,
  });
}

export function usePhoneDailyRidesQuery() {
  const dev = useDeviceDb();
  return useQuery({ queryKey: dailyKeys.phoneRides(), staleTime: 0, queryFn: () => readDailyRides(dev) });
}

export function usePhoneSentDailyQuery() {
  const dev = useDeviceDb();
  return useQuery({ queryKey: dailyKeys.phoneSent(), staleTime: 0, queryFn: () => sentDailyChecks(dev) });
}

export function useStartDailyCheckMutation() {
  const dev = useDeviceDb();
  const client = useQueryClient();
  return useMutation({
    mutationFn: (rideId: string) => startDailyCheck(dev, rideId, randomUUID(), new Date()),
    onSuccess: (draft) => {
      client.setQueryData(fieldKeys.draft(draft.id), draft);
      void client.invalidateQueries({ queryKey: dailyKeys.phoneRides() });
    },
  });
}

export function useSubmitDailyCheckMutation() {
  const dev = useDeviceDb();
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({
      draft,
      template,
      declaration,
    }: {
      draft: Draft;
      template: ChecklistTemplate | null;
      declaration: Declaration;
    }) => submitDailyCheck(dev, draft, template, declaration, new Date()),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: dailyKeys.phoneRides() }),
        client.invalidateQueries({ queryKey: dailyKeys.phoneSent() }),
      ]),
  });
}
