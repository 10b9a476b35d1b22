import type { z } from 'zod';

import { apiErrorSchema } from '@/features/api/errors';
import { tokenStore } from '@/features/auth/token-store';
import { reportServerReached } from '@/features/sync/reachability';

/** Same origin on the web (the server serves the app); configurable for native builds. */
export const API_BASE = process.env.EXPO_PUBLIC_API_URL ?? '';

export class ApiRequestError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues: { path: string; message: string }[] = [],
  ) {
    super(message);
    this.name = 'ApiRequestError';
  }
}

/** Thrown when the server cannot be reached at all (offline, DNS, connection reset). */
export class OfflineError extends Error {
  constructor(cause: unknown) {
    super('No connection to the Pivotwatch server.');
    this.name = 'OfflineError';
    this.cause = cause;
  }
}

type Options<T> = {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  schema?: z.ZodType<T>;
  /** Skip the stored token (sign-in). */
  anonymous?: boolean;
  signal?: AbortSignal;
};

/** Fetches JSON from the API, attaching the session token and turning error bodies into ApiRequestError. */
export async function apiFetch<T = unknown>(path: string, opts: Options<T> = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (opts.body !== undefined) headers['Content-Type'] = 'application/json';
  if (!opts.anonymous) {
    const stored = await tokenStore.get();
    if (stored) headers.Authorization = `Bearer ${stored.token}`;
  }
  let res: Response;
  try {
    res = await fetch(`${API_BASE}${path}`, {
      method: opts.method ?? (opts.body === undefined ? 'GET' : 'POST'),
      headers,
      body: opts.body === undefined ? undefined : JSON.stringify(opts.body),
      signal: opts.signal,
    });
  } catch (err) {
    if ((err as Error)?.name === 'AbortError') throw err;
    reportServerReached(false);
    throw new OfflineError(err);
  }
  // Any answer at all, even an error, means the server was reached: the connection banner can go.
  reportServerReached(true);
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
}
