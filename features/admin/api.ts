import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';

import { apiFetch } from '@/features/api';
import { deviceKeySchema } from '@/features/ledger/schema';
import {
  adminUserListSchema,
  adminUserSchema,
  createPersonResponseSchema,
  personResponseSchema,
  type CreatePersonBody,
  type UpdatePersonBody,
} from '@/features/admin/schema';

const adminKeys = {
  all: ['admin'] as const,
  people: () => [...adminKeys.all, 'users'] as const,
  person: (id: string) => [...adminKeys.all, 'users', id] as const,
};

function usePeopleQuery() {
  return useQuery({
    queryKey: adminKeys.people(),
    queryFn: () => apiFetch('/api/admin/users', { schema: adminUserListSchema }),
  });
}

/** Everyone who has an account (the administrator's home counts them). */
export function useAdminUsersQuery() {
  const query = usePeopleQuery();
  return { ...query, data: query.data?.users };
}

/** Everyone, and the operator companies an operator may belong to. */
export { usePeopleQuery };

export function usePersonQuery(id: string) {
  return useQuery({
    queryKey: adminKeys.person(id),
    queryFn: async () =>
      (await apiFetch(`/api/admin/users/${encodeURIComponent(id)}`, { schema: personResponseSchema })).person,
  });
}

const userAnswer = z.object({ user: adminUserSchema });

/** After any change the list and the person's page are read again (state, last change, history). */
function useInvalidatePeople() {
  const client = useQueryClient();
  return () => client.invalidateQueries({ queryKey: adminKeys.people() });
}

export function useCreatePersonMutation() {
  const invalidate = useInvalidatePeople();
  return useMutation({
    mutationFn: (body: CreatePersonBody) =>
      apiFetch('/api/admin/users', { body, schema: createPersonResponseSchema }),
    onSuccess: invalidate,
  });
}

export function useUpdatePersonMutation(id: string) {
  const invalidate = useInvalidatePeople();
  return useMutation({
    mutationFn: async (body: UpdatePersonBody) =>
      (
        await apiFetch(`/api/admin/users/${encodeURIComponent(id)}`, {
          method: 'PATCH',
          body,
          schema: userAnswer,
        })
      ).user,
    onSuccess: invalidate,
  });
}

/** Disable, enable, or send a reset link (a fresh invitation for someone who never chose a password). */
export function usePersonActionMutation(id: string) {
  const invalidate = useInvalidatePeople();
  return useMutation({
    mutationFn: async (action: 'disable' | 'enable' | 'reset') =>
      (
        await apiFetch(`/api/admin/users/${encodeURIComponent(id)}/${action}`, {
          method: 'POST',
          schema: userAnswer,
        })
      ).user,
    onSuccess: invalidate,
  });
}

const phoneKeysKey = (userId: string) => [...adminKeys.all, 'users', userId, 'phone-keys'] as const;

/** A person's phone keys (GET /api/devices/keys?userId=), newest first. */
export function usePhoneKeysQuery(userId: string) {
  return useQuery({
    queryKey: phoneKeysKey(userId),
    queryFn: () =>
      apiFetch(`/api/devices/keys?userId=${encodeURIComponent(userId)}`, {
        schema: z.array(deviceKeySchema),
      }),
  });
}

/** Withdraws one of a person's phone keys; their keys and the page's history are read again. */
export function useRevokePhoneKeyMutation(userId: string) {
  const client = useQueryClient();
  const invalidate = useInvalidatePeople();
  return useMutation({
    mutationFn: (keyId: string) =>
      apiFetch(`/api/devices/keys/${encodeURIComponent(keyId)}/revoke`, {
        method: 'POST',
        schema: z.object({ key: deviceKeySchema }),
      }),
    onSuccess: () =>
      Promise.all([client.invalidateQueries({ queryKey: phoneKeysKey(userId) }), invalidate()]),
  });
}
