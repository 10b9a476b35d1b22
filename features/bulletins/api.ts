import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import {
  type BulletinDoneInput,
  type BulletinInput,
  type BulletinListQuery,
  bulletinListResponseSchema,
  bulletinResponseSchema,
  rideBulletinSchema,
  rideBulletinsResponseSchema,
} from '@/features/bulletins/schema';
import { bulletinSchema } from '@/features/bulletins/schema';
import { type QueryParams, clean, toSearch } from '@/lib/list-params';
import { z } from 'zod';

export const bulletinKeys = {
  all: ['bulletins'] as const,
  list: (q: QueryParams) => [...bulletinKeys.all, 'list', clean(q)] as const,
  one: (id: string) => [...bulletinKeys.all, 'one', id] as const,
  ride: (rideId: string) => [...bulletinKeys.all, 'ride', rideId] as const,
};

/** The register is edited by few people; a minute keeps pages quick. */
const BULLETINS_STALE_MS = 60 * 1000;
const enc = encodeURIComponent;

export function useBulletinListQuery(query: Partial<BulletinListQuery>) {
  const params = query as QueryParams;
  return useQuery({
    queryKey: bulletinKeys.list(params),
    queryFn: () => apiFetch(`/api/bulletins${toSearch(params)}`, { schema: bulletinListResponseSchema }),
    placeholderData: keepPreviousData,
    // Read anew on each visit: a bulletin deleted through the register's DeleteAction leaves this list.
    refetchOnMount: 'always',
    staleTime: BULLETINS_STALE_MS,
  });
}

export function useBulletinQuery(id: string | null) {
  return useQuery({
    queryKey: bulletinKeys.one(id ?? ''),
    enabled: !!id,
    queryFn: () => apiFetch(`/api/bulletins/${enc(id ?? '')}`, { schema: bulletinResponseSchema }),
    staleTime: BULLETINS_STALE_MS,
  });
}

export function useRideBulletinsQuery(rideId: string) {
  return useQuery({
    queryKey: bulletinKeys.ride(rideId),
    queryFn: async () =>
      (await apiFetch(`/api/rides/${enc(rideId)}/bulletins`, { schema: rideBulletinsResponseSchema }))
        .bulletins,
    staleTime: BULLETINS_STALE_MS,
  });
}

const savedSchema = z.object({ bulletin: bulletinSchema });

/** Adds (`id` null) or changes a bulletin; every bulletin view is read again after. */
export function useBulletinSaveMutation(id: string | null) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: BulletinInput) =>
      id
        ? apiFetch(`/api/bulletins/${enc(id)}`, { method: 'PATCH', body, schema: savedSchema })
        : apiFetch('/api/bulletins', { body, schema: savedSchema }),
    onSuccess: () => client.invalidateQueries({ queryKey: bulletinKeys.all }),
  });
}

/** A supervisor records a bulletin done on a ride. */
export function useBulletinDoneMutation(rideId: string, bulletinId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: BulletinDoneInput) =>
      apiFetch(`/api/rides/${enc(rideId)}/bulletins/${enc(bulletinId)}/done`, {
        body,
        schema: z.object({ bulletin: rideBulletinSchema }),
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: bulletinKeys.all }),
  });
}
