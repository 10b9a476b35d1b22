/**
 * The storage card's and the low-space banner's reads, and "free space now". Reads are react-query
 * queries under `fieldKeys`, so a finished sync (which invalidates `fieldKeys.all`) refreshes them too.
 */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { DeviceDb } from '@/features/device-db/connection';
import { fieldKeys } from '@/features/device-db/field-keys';
import { compactDeviceDb, readDeviceHoldings } from '@/features/device-db/holdings';
import { type PruneReport, freeSpacePolicy, pruneDevice } from '@/features/device-db/prune';
import { readStorageSpace } from '@/features/device-db/storage-space';

/** How often the banner looks again: photos are a few hundred kB each, so minutes are soon enough. */
const SPACE_REFRESH_MS = 5 * 60_000;

export function useStorageSpaceQuery(enabled = true) {
  return useQuery({
    queryKey: fieldKeys.space(),
    queryFn: readStorageSpace,
    enabled,
    refetchInterval: SPACE_REFRESH_MS,
    staleTime: 30_000,
  });
}

export function useDeviceHoldingsQuery(dev: DeviceDb) {
  return useQuery({
    queryKey: fieldKeys.holdings(),
    queryFn: () => readDeviceHoldings(dev),
    staleTime: 10_000,
    // Syncs re-read the field's queries only where the sync panel is on screen (Today); Account has none, so
    // the card looks again on its own: a few counts, cheap.
    refetchInterval: 15_000,
  });
}

export type FreeSpaceResult = PruneReport & {
  /** The compaction failed (the deleted space is still reused inside the file, just not given back). */
  compactError: string | null;
};

/** Removes what the policy lets go without waiting out the keeping time, then gives the space back. */
export function useFreeSpaceMutation(dev: DeviceDb) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (): Promise<FreeSpaceResult> => {
      const report = await pruneDevice(dev, { policy: freeSpacePolicy });
      let compactError: string | null = null;
      try {
        await compactDeviceDb(dev);
      } catch (err) {
        compactError = err instanceof Error ? err.message : String(err);
      }
      return { ...report, compactError };
    },
    // Sent lists, photos and both storage reads change: re-read everything the phone shows from its database.
    onSettled: () => client.invalidateQueries({ queryKey: fieldKeys.all }),
  });
}
