import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { authKeys } from '@/features/auth/api';
import {
  passwordChangeResponseSchema,
  passwordLinkInfoSchema,
  passwordLinkResponseSchema,
  type PasswordChangeBody,
} from '@/features/auth/password-schema';
import type { SignInResponse } from '@/features/auth/schema';
import { tokenStore } from '@/features/session';

const linkPath = (token: string) => `/api/auth/password-links/${encodeURIComponent(token)}`;

/**
 * Keeps the fresh session the server answered with, so this device stays (or becomes) signed in. A link
 * may sign in someone other than whoever used the device last: then, as at sign-in, nothing the last
 * person left in memory is kept (`fresh`).
 */
function useKeepSession(fresh: boolean) {
  const client = useQueryClient();
  return async (res: SignInResponse) => {
    await tokenStore.set({ token: res.token, expiresAt: res.expiresAt, user: res.user });
    if (fresh) client.clear();
    client.setQueryData(authKeys.session(), { user: res.user, offline: false });
    return res.user;
  };
}

/** The person's own change; the server ends their other sessions and answers a new one for this device. */
export function usePasswordChangeMutation() {
  const keep = useKeepSession(false);
  return useMutation({
    mutationFn: async (body: PasswordChangeBody) =>
      keep(await apiFetch('/api/auth/password', { body, schema: passwordChangeResponseSchema })),
  });
}

/** Who a set-password link is for and whether it still works (no session needed). */
export function usePasswordLinkQuery(token: string | null) {
  return useQuery({
    queryKey: [...authKeys.all, 'password-link', token ?? ''] as const,
    queryFn: () => apiFetch(linkPath(token ?? ''), { schema: passwordLinkInfoSchema, anonymous: true }),
    enabled: token !== null,
    retry: false,
  });
}

/** Sets the password from a link and signs this device in as its owner. */
export function useSetPasswordMutation(token: string) {
  const keep = useKeepSession(true);
  return useMutation({
    mutationFn: async (password: string) =>
      keep(
        await apiFetch(linkPath(token), {
          body: { password },
          schema: passwordLinkResponseSchema,
          anonymous: true,
        }),
      ),
  });
}
