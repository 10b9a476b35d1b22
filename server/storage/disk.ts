/**
 * The disk driver: each object is a file under a root folder (DATA_DIR unless STORAGE_URL names another),
 * at the same place earlier releases wrote it (`photos/<sha256>` is DATA_DIR/photos/<sha256>), so existing
 * data works unchanged. Files are written whole (server/files.ts: temporary name, flush, rename, flush
 * the folder), readable by the server's own user only.
 */
import fs from 'node:fs';
import path from 'node:path';

import { TEMP_SUFFIX, writeWhole } from '@/server/files';
import { assertKey, StorageError, type ObjectStorage } from '@/server/storage/types';

const isMissing = (error: unknown) =>
  typeof error === 'object' && error !== null && 'code' in error && error.code === 'ENOENT';

export function diskStorage(root: string): ObjectStorage {
  const fileOf = (key: string) => {
    assertKey(key);
    return path.join(root, ...key.split('/'));
  };
  const folderOf = (folder: string) => fileOf(folder);
  return {
    description: `disk ${root}`,
    async put(key, bytes) {
      await writeWhole(fileOf(key), bytes);
    },
    async get(key) {
      try {
        return await fs.promises.readFile(fileOf(key));
      } catch (error) {
        if (isMissing(error)) return null;
        throw error;
      }
    },
    async has(key) {
      const stat = await fs.promises.stat(fileOf(key)).catch(() => null);
      return stat?.isFile() ?? false;
    },
    async remove(key) {
      await fs.promises.rm(fileOf(key), { force: true });
    },
    async list(folder) {
      let entries: fs.Dirent[];
      try {
        entries = await fs.promises.readdir(folderOf(folder), { withFileTypes: true });
      } catch (error) {
        if (isMissing(error)) return [];
        throw error;
      }
      // Dot-names are writes in progress or left by a crash; their row was never written.
      return entries
        .filter((d) => d.isFile() && !d.name.startsWith('.') && !d.name.endsWith(TEMP_SUFFIX))
        .map((d) => d.name)
        .sort();
    },
    async sweepPartial(folder, now = Date.now()) {
      const dir = folderOf(folder);
      let names: string[];
      try {
        names = await fs.promises.readdir(dir);
      } catch {
        return 0;
      }
      let removed = 0;
      for (const name of names) {
        if (!name.endsWith(TEMP_SUFFIX)) continue;
        const file = path.join(dir, name);
        try {
          if (now - (await fs.promises.stat(file)).mtimeMs > 3_600_000) {
            await fs.promises.rm(file, { force: true });
            removed++;
          }
        } catch {
          // Gone already (another sweep); nothing to do.
        }
      }
      return removed;
    },
    async check() {
      try {
        await fs.promises.mkdir(root, { recursive: true, mode: 0o700 });
        await fs.promises.access(root, fs.constants.R_OK | fs.constants.W_OK);
      } catch (error) {
        throw new StorageError(`The storage folder ${root} cannot be written: ${String(error)}`, {
          cause: error,
        });
      }
    },
  };
}
