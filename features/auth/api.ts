import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { labelsOf, roleVocabulary } from '@/lib/vocabulary';
import { type SignInBody, meResponseSchema, signInResponseSchema } from '@/features/auth/schema';
import type { SessionUser } from '@/features/session/schema';
import { tokenStore } from '@/features/session';

export const authKeys = {
  all: ['auth'] as const,
  session: () => [...authKeys.all, 'session'] as const,
};

type Session = { user: SessionUser; offline: boolean } | null;

/**
 * Resolves the stored session. Online, the server confirms the user (and a revoked or expired
 * token signs the device out). Offline, the last known user is trusted so field work can go on;
 * the server checks the token again at the next sync.
 */
async function loadSession(): Promise<Session> {
  const stored = await tokenStore.get();
  if (!stored) return null;
  try {
    const { user } = await apiFetch('/api/me', { schema: meResponseSchema });
    await tokenStore.set({ ...stored, user });
    return { user, offline: false };
  } catch (err) {
    if (err instanceof OfflineError) return { user: stored.user, offline: true };
    if (err instanceof ApiRequestError && err.status === 401) {
      await tokenStore.clear();
      return null;
    }
    // Server trouble (5xx): keep the user signed in on the cached identity.
    return { user: stored.user, offline: true };
  }
}

export function useSession() {
  return useQuery({ queryKey: authKeys.session(), queryFn: loadSession, staleTime: SESSION_STALE_MS });
}

const SESSION_STALE_MS = 5 * 60 * 1000;

export function useSignInMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (body: SignInBody) => {
      const res = await apiFetch('/api/auth/sign-in', {
        body,
        schema: signInResponseSchema,
        anonymous: true,
      });
      await tokenStore.set({ token: res.token, expiresAt: res.expiresAt, user: res.user });
      return res.user;
    },
    onSuccess: (user) => {
      const session: Session = { user, offline: false };
      // Whatever the last person left in memory (their token may simply have run out) is not this one's.
      client.clear();
      client.setQueryData(authKeys.session(), session);
    },
  });
}

/** How long sign-out waits for the server to end the session before going on without it. */
const SIGN_OUT_SERVER_WAIT_MS = 5000;

/**
 * Ends the session on the server too (best effort: offline, or with the server away, the token just
 * stays unused until it runs out), so a copied token stops working at once.
 */
async function endServerSession(): Promise<void> {
  const abort = new AbortController();
  const timer = setTimeout(() => abort.abort(), SIGN_OUT_SERVER_WAIT_MS);
  try {
    await apiFetch('/api/auth/sign-out', { method: 'POST', signal: abort.signal });
  } catch {
    // Offline, timed out or already ended: signing out on this phone goes on regardless.
  } finally {
    clearTimeout(timer);
  }
}

type SignOutOptions = {
  /**
   * Runs after the server was told and before the token is removed, e.g. to wipe this person's data from
   * the phone. A failure there does not keep the person signed in.
   */
  beforeClear?: () => Promise<void>;
};

export function useSignOutMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (options: SignOutOptions | void) => {
      await endServerSession();
      try {
        await options?.beforeClear?.();
      } catch {
        // The phone stays bound to this person, so the next person's sign-in wipes it before anything shows.
      }
      await tokenStore.clear();
    },
    onSettled: () => {
      client.clear();
      client.setQueryData(authKeys.session(), null as Session);
    },
  });
}

export const roleLabel = labelsOf(roleVocabulary);
