import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import {
  type InstrumentInput,
  type InstrumentPatch,
  declarationSettingResponseSchema,
  instrumentListResponseSchema,
  instrumentResponseSchema,
} from '@/features/instruments/schema';

export const instrumentKeys = {
  all: ['instruments'] as const,
  list: () => [...instrumentKeys.all, 'list'] as const,
  declaration: () => [...instrumentKeys.all, 'declaration'] as const,
};

/** The register changes rarely and only by admins on this screen, which invalidates on save. */
const STALE_MS = 60_000;

export function useInstrumentListQuery() {
  return useQuery({
    queryKey: instrumentKeys.list(),
    queryFn: async () =>
      (await apiFetch('/api/instruments', { schema: instrumentListResponseSchema })).instruments,
    staleTime: STALE_MS,
  });
}

/** Create (id null) or change an instrument; a create takes the full input, a change any part of it. */
export function useInstrumentSaveMutation(id: string | null) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: Partial<InstrumentInput> | InstrumentPatch) =>
      id
        ? apiFetch(`/api/instruments/${encodeURIComponent(id)}`, {
            method: 'PATCH',
            body,
            schema: instrumentResponseSchema,
          })
        : apiFetch('/api/instruments', { body, schema: instrumentResponseSchema }),
    onSuccess: () => client.invalidateQueries({ queryKey: instrumentKeys.all }),
  });
}

export function useDeclarationSettingQuery() {
  return useQuery({
    queryKey: instrumentKeys.declaration(),
    queryFn: async () =>
      (await apiFetch('/api/settings/declaration', { schema: declarationSettingResponseSchema })).declaration,
    staleTime: STALE_MS,
  });
}

export function useDeclarationSaveMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (text: string) =>
      apiFetch('/api/settings/declaration', {
        method: 'PUT',
        body: { text },
        schema: declarationSettingResponseSchema,
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: instrumentKeys.declaration() }),
  });
}
