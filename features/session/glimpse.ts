/**
 * A glimpse: a copy of some of one person's query results, kept in the browser's localStorage so a reload
 * with no signal draws their last Today at once, while the phone's database (a worker, its .wasm and the
 * migration check) is still opening; the screens then read the database itself and replace it. Where
 * there is no localStorage (a phone's native app, whose database opens in moments) there is no glimpse.
 *
 * It holds only what the same person's screens showed on this device (their rides, drafts in progress
 * and sent inspections, all also in the device database), under their own user id; signing out forgets
 * every glimpse (token-store.web.ts). Written with TanStack Query's own `dehydrate` / `hydrate`.
 */
import { type QueryClient, type QueryKey, dehydrate, hydrate } from '@tanstack/react-query';

const PREFIX = 'pivotwatch.glimpse.';
/** Larger than this, no glimpse is kept: a reload would spend longer parsing it than it saves. */
export const GLIMPSE_MAX_CHARS = 200_000;

const storage = (): Storage | null => {
  try {
    return globalThis.localStorage ?? null;
  } catch {
    return null;
  }
};

const sameKey = (a: QueryKey, b: QueryKey) => JSON.stringify(a) === JSON.stringify(b);

/** Keeps the person's current results of `keys` (those that have data) as their glimpse. */
export function saveGlimpse(client: QueryClient, userId: string, keys: readonly QueryKey[]): void {
  const store = storage();
  if (!store) return;
  const state = dehydrate(client, {
    shouldDehydrateQuery: (q) => q.state.status === 'success' && keys.some((k) => sameKey(k, q.queryKey)),
  });
  try {
    const text = JSON.stringify(state);
    if (state.queries.length === 0 || text.length > GLIMPSE_MAX_CHARS) store.removeItem(PREFIX + userId);
    else store.setItem(PREFIX + userId, text);
  } catch {
    // Storage full or refused: the next reload just waits for the database, as without a glimpse.
    store.removeItem(PREFIX + userId);
  }
}

/**
 * Puts the person's glimpse into the query cache (never over newer results already there); true when
 * there was one to put.
 */
export function restoreGlimpse(client: QueryClient, userId: string): boolean {
  const text = storage()?.getItem(PREFIX + userId);
  if (!text) return false;
  try {
    const state = JSON.parse(text) as Parameters<typeof hydrate>[1];
    if (!state || !Array.isArray(state.queries) || state.queries.length === 0) return false;
    hydrate(client, state);
    return true;
  } catch {
    storage()?.removeItem(PREFIX + userId);
    return false;
  }
}

/** Forgets every person's glimpse (signing out). */
export function forgetGlimpses(): void {
  const store = storage();
  if (!store) return;
  const keys: string[] = [];
  for (let i = 0; i < store.length; i += 1) {
    const key = store.key(i);
    if (key?.startsWith(PREFIX)) keys.push(key);
  }
  for (const key of keys) store.removeItem(key);
}
