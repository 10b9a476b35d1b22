/**
 * What Today shows — the rides with their drafts, what was sent, and the sync panel's counts — read from
 * the device database, with the last snapshot of them (features/device-db/today-snapshot.ts) drawn
 * meanwhile on a reload: the signed-in frame seeds the snapshot into the query cache before Today renders, marked out of date so
 * that Today reads the database at once and replaces it, and saves a new snapshot whenever Today has read.
 */
import { useEffect, useState } from 'react';

import { useSession } from '@/features/auth';
import { SEEDED_AT, readTodaySnapshot, writeTodaySnapshot } from '@/features/device-db';
import { useFieldRidesQuery, useSentInspectionsQuery } from '@/features/inspections/field-api';
import { type SyncStatus, useSyncStatus } from '@/features/sync/ui';

/** The sync panel's figures kept in the snapshot (not what describes this moment: running, online, loaded). */
type SyncPart = Pick<
  SyncStatus,
  | 'waiting'
  | 'accepted'
  | 'needsAttention'
  | 'photosWaiting'
  | 'photoBytesWaiting'
  | 'photosRefused'
  | 'lastSuccessAt'
  | 'lastAttemptAt'
  | 'lastError'
>;

function syncPart(s: SyncStatus): SyncPart {
  return {
    waiting: s.waiting,
    accepted: s.accepted,
    needsAttention: s.needsAttention,
    photosWaiting: s.photosWaiting,
    photoBytesWaiting: s.photoBytesWaiting,
    photosRefused: s.photosRefused,
    lastSuccessAt: s.lastSuccessAt,
    lastAttemptAt: s.lastAttemptAt,
    lastError: s.lastError,
  };
}

/** Today's data: the database's, or until it answers the snapshot's. */
export function useTodayData() {
  const userId = useSession().data?.user.id ?? null;
  const rides = useFieldRidesQuery();
  const sent = useSentInspectionsQuery();
  const live = useSyncStatus();
  const [snapSync] = useState(() =>
    userId ? (readTodaySnapshot(userId)?.sync as SyncPart | undefined) : undefined,
  );
  // Until the phone's record is read, the panel shows the snapshot's figures rather than "never synced".
  const sync = !live.loaded && snapSync ? { ...live, ...snapSync } : live;

  const part = live.loaded ? JSON.stringify(syncPart(live)) : null;
  const fresh =
    rides.dataUpdatedAt > SEEDED_AT &&
    sent.dataUpdatedAt > SEEDED_AT &&
    !rides.isFetching &&
    !sent.isFetching;
  useEffect(() => {
    if (!userId || !fresh || part === null || rides.data === undefined || sent.data === undefined) return;
    writeTodaySnapshot(userId, { rides: rides.data, sent: sent.data, sync: JSON.parse(part) as SyncPart });
  }, [userId, fresh, part, rides.data, sent.data]);

  return { rides, sent, sync };
}
