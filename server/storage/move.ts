/**
 * Copying every stored object from one storage to another (`npm run storage:move`, scripts/move-storage.ts),
 * e.g. from the disk to S3 before switching STORAGE_URL. Nothing at the source is changed or removed. Each
 * object is read back from the destination and compared by SHA-256; photos and NDT reports are named by
 * their SHA-256, so their source bytes are checked against their name first (a damaged file is reported,
 * not copied). Running it again copies only what is missing or different, so it can be run once while the
 * server runs and once more after stopping it.
 */
import { createHash } from 'node:crypto';

import { storedFolders, type ObjectStorage } from '@/server/storage/types';

export type MoveCounts = {
  /** Written to the destination and read back whole. */
  copied: number;
  /** Already at the destination with the same bytes. */
  already: number;
  /** Listed at the source but gone before it was read (the clean-up of unused photos). */
  vanished: number;
};

export type MoveResult = {
  folders: Record<string, MoveCounts>;
  /** One line per object that could not be copied faithfully; empty when everything is there. */
  problems: string[];
};

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/** The folders whose file names are the SHA-256 of their bytes. */
const contentAddressed = new Set<string>([
  storedFolders.photos,
  storedFolders.ndtReports,
  storedFolders.documents,
]);

export async function moveStorage(
  from: ObjectStorage,
  to: ObjectStorage,
  opts: { onProgress?: (folder: string, done: number, total: number) => void } = {},
): Promise<MoveResult> {
  const folders: Record<string, MoveCounts> = {};
  const problems: string[] = [];
  for (const folder of Object.values(storedFolders)) {
    const counts: MoveCounts = { copied: 0, already: 0, vanished: 0 };
    folders[folder] = counts;
    const names = await from.list(folder);
    let done = 0;
    for (const name of names) {
      const key = `${folder}/${name}`;
      done++;
      const bytes = await from.get(key);
      if (!bytes) {
        counts.vanished++;
        continue;
      }
      const hash = sha256(bytes);
      if (contentAddressed.has(folder) && hash !== name) {
        problems.push(`${key}: the source bytes do not hash to the name (SHA-256 ${hash}); not copied`);
        continue;
      }
      const there = await to.get(key);
      if (there && sha256(there) === hash) {
        counts.already++;
      } else {
        await to.put(key, bytes);
        const back = await to.get(key);
        if (!back || sha256(back) !== hash) {
          problems.push(`${key}: read back from the destination with different bytes`);
          continue;
        }
        counts.copied++;
      }
      if (done % 100 === 0 || done === names.length) opts.onProgress?.(folder, done, names.length);
    }
  }
  return { folders, problems };
}
