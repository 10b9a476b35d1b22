/**
 * Today's snapshot (today-snapshot.ts) in the query cache: seeded before Today renders, and dropped as soon
 * as what it copies changes on the phone.
 */
import type { QueryClient } from '@tanstack/react-query';

import { fieldKeys } from '@/features/device-db/field-keys';
import { clearTodaySnapshot, readTodaySnapshot } from '@/features/device-db/today-snapshot';

/** The update time given to seeded data: long out of date, so every reader reads the database at once. */
export const SEEDED_AT = 1;

/**
 * Puts `userId`'s snapshot into the query cache where nothing is cached yet. Returns whether there was
 * one: then Today can be drawn before the database opens (signed-in-frame.tsx).
 */
export function seedTodayFromSnapshot(client: QueryClient, userId: string): boolean {
  const snap = readTodaySnapshot(userId);
  if (!snap) return false;
  for (const [key, data] of [
    [fieldKeys.rides(), snap.rides],
    [fieldKeys.sent(), snap.sent],
  ] as const)
    if (client.getQueryData(key) === undefined) client.setQueryData(key, data, { updatedAt: SEEDED_AT });
  return true;
}

/**
 * Drops the snapshot as soon as anything read from the phone is marked out of date (every write to drafts,
 * the outbox, rides or assignments invalidates the field queries) or thrown away (another person bound).
 * Returns the unsubscribe.
 */
export function followTodaySnapshot(client: QueryClient): () => void {
  return client.getQueryCache().subscribe((event) => {
    if (event.query.queryKey[0] !== fieldKeys.all[0]) return;
    if (event.type === 'removed' || (event.type === 'updated' && event.action.type === 'invalidate'))
      clearTodaySnapshot();
  });
}
