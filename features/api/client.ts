import type { z } from 'zod';

import { reportServerReached } from '@/features/api/reachability';
import { tokenStore } from '@/features/session';
import { ApiRequestError, OfflineError, apiErrorSchema } from '@/lib/api-errors';

/** Same origin on the web (the server serves the app); configurable for native builds. */
export const API_BASE = process.env.EXPO_PUBLIC_API_URL ?? '';

type Options<T> = {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  schema?: z.ZodType<T>;
  /** Skip the stored token (sign-in). */
  anonymous?: boolean;
  signal?: AbortSignal;
};

export type ApiFetch = <T = unknown>(path: string, opts?: Options<T>) => Promise<T>;

type ApiClientConfig = {
  /** Prefix of every path: '' for the page's own origin, or `http://host:port`. */
  baseUrl: string;
  /** The session token to send, or null when signed out. */
  getToken: () => Promise<string | null>;
  /** Told whether each request reached the server (for the connection banner). */
  onReached?: (reached: boolean) => void;
  /** The fetch to use; the global one by default (tests may hand a faulty one). */
  fetchImpl?: typeof fetch;
};

/** Builds an API client: fetches JSON, attaches the token and turns error bodies into ApiRequestError. */
export function createApiClient({ baseUrl, getToken, onReached, fetchImpl }: ApiClientConfig): ApiFetch {
  return async function apiFetch<T = unknown>(path: string, opts: Options<T> = {}): Promise<T> {
    const headers: Record<string, string> = { Accept: 'application/json' };
    if (opts.body !== undefined) headers['Content-Type'] = 'application/json';
    if (!opts.anonymous) {
      const token = await getToken();
      if (token) headers.Authorization = `Bearer ${token}`;
    }
    let res: Response;
    try {
      res = await (fetchImpl ?? fetch)(`${baseUrl}${path}`, {
        method: opts.method ?? (opts.body === undefined ? 'GET' : 'POST'),
        headers,
        body: opts.body === undefined ? undefined : JSON.stringify(opts.body),
        signal: opts.signal,
      });
    } catch (err) {
      if ((err as Error)?.name === 'AbortError') throw err;
      onReached?.(false);
      throw new OfflineError(err);
    }
    // Any answer at all, even an error, means the server was reached: the connection banner can go.
    onReached?.(true);
    const text = await res.text();
    let json: unknown = undefined;
    try {
      json = text ? JSON.parse(text) : undefined;
    } catch {
      // A proxy or captive portal answered with something that is not our JSON.
      throw new ApiRequestError(
        res.status,
        'bad_response',
        `Unexpected answer from the server (${res.status}).`,
      );
    }
    if (!res.ok) {
      const parsed = apiErrorSchema.safeParse(json);
      if (parsed.success) {
        const e = parsed.data.error;
        throw new ApiRequestError(res.status, e.code, e.message, e.issues);
      }
      throw new ApiRequestError(res.status, 'http_error', `Request failed (${res.status}).`);
    }
    return opts.schema ? opts.schema.parse(json) : (json as T);
  };
}

/** The app's client: the page's own origin (or the configured URL), the stored session's token. */
export const apiFetch: ApiFetch = createApiClient({
  baseUrl: API_BASE,
  getToken: async () => (await tokenStore.get())?.token ?? null,
  onReached: reportServerReached,
});
