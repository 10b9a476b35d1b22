/** The storage the configuration names (STORAGE_URL), one per configuration so every part shares it. */
import type { Config } from '@/server/config';
import { diskStorage } from '@/server/storage/disk';
import { s3Storage } from '@/server/storage/s3';
import type { StorageSettings } from '@/server/storage-url';
import type { ObjectStorage } from '@/server/storage/types';

export {
  describeStorage,
  parseStorageUrl,
  StorageUrlError,
  type StorageSettings,
} from '@/server/storage-url';
export { assertKey, StorageError, storedFolders, type ObjectStorage } from '@/server/storage/types';
export { diskStorage } from '@/server/storage/disk';
export { storeContent } from '@/server/storage/content';

/** A driver for `settings`; a disk without its own folder keeps the files under `dataDir`. */
export function openStorage(settings: StorageSettings, dataDir: string): ObjectStorage {
  return settings.driver === 'disk' ? diskStorage(settings.root ?? dataDir) : s3Storage(settings);
}

const opened = new WeakMap<object, ObjectStorage>();

/** The configuration's storage, opened once (the S3 client keeps its connections between requests). */
export function storageOf(config: Pick<Config, 'storage' | 'dataDir'>): ObjectStorage {
  let storage = opened.get(config);
  if (!storage) {
    storage = openStorage(config.storage, config.dataDir);
    opened.set(config, storage);
  }
  return storage;
}
