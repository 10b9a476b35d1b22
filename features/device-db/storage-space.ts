/**
 * An installed app's storage: the phone's free and total space (expo-file-system). Its files are never
 * cleared by the phone on its own, so there is no persistence to ask for.
 */
import { Paths } from 'expo-file-system';

import type { StoragePersistence, StorageSpace } from '@/features/device-db/storage-space-types';

export async function readStorageSpace(): Promise<StorageSpace | null> {
  try {
    const total = Paths.totalDiskSpace;
    const available = Paths.availableDiskSpace;
    if (!Number.isFinite(total) || total <= 0 || !Number.isFinite(available)) return null;
    return {
      usedBytes: null,
      availableBytes: Math.max(0, available),
      totalBytes: total,
      persistence: 'device',
    };
  } catch {
    return null;
  }
}

export async function requestPersistentStorage(): Promise<StoragePersistence> {
  return 'device';
}

export function forgetPersistenceRequest(): void {}
