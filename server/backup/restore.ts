/**
 * Putting a backup back into DATA_DIR, with the server stopped. Nothing is trusted before it is checked:
 * every file against the manifest (size and SHA-256), the database copy with `PRAGMA integrity_check`, and
 * its schema against this code's migrations (a backup from newer code would not run here). Stored files go
 * back first, through the storage (server/storage: the disk or S3), and the database only after them, so
 * no restored row names bytes the storage lacks. The database being replaced is moved aside, never
 * deleted; stored files are only ever added, since a file name is its content.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';

import { databaseFileName, migrationState } from '@/server/db';
import {
  contentDirs,
  listBackups,
  readManifest,
  sha256OfFile,
  type BackupManifest,
} from '@/server/backup/manifest';
import { lockDataDir } from '@/server/backup/server-lock';
import type { ObjectStorage } from '@/server/storage';

export class RestoreError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'RestoreError';
  }
}

export type Verified = { manifest: BackupManifest; problems: string[] };

const isInside = (root: string, p: string) => {
  const rel = path.relative(root, p);
  return rel !== '' && !rel.startsWith('..') && !path.isAbsolute(rel);
};

function checkDatabase(file: string): string[] {
  let copy: Database.Database;
  try {
    copy = new Database(file, { readonly: true, fileMustExist: true });
  } catch (error) {
    return [`${databaseFileName}: cannot be opened (${error instanceof Error ? error.message : error})`];
  }
  try {
    const rows = copy.pragma('integrity_check') as { integrity_check: string }[];
    const messages = rows.map((r) => r.integrity_check).filter((m) => m !== 'ok');
    if (messages.length > 0) return messages.slice(0, 5).map((m) => `${databaseFileName}: ${m}`);
    const state = migrationState(copy);
    if (state.last?.startsWith('newer')) {
      return [
        `${databaseFileName}: written by a newer Pivotwatch (migration ${state.last}); update the code first`,
      ];
    }
    return [];
  } catch (error) {
    return [`${databaseFileName}: ${error instanceof Error ? error.message : error}`];
  } finally {
    copy.close();
  }
}

/** Checks a backup directory whole; `problems` is empty when it can be restored. */
export async function verifyBackup(dir: string): Promise<Verified> {
  const manifest = readManifest(dir);
  const problems: string[] = [];
  if (!manifest.files.some((f) => f.path === databaseFileName))
    problems.push(`no ${databaseFileName} listed`);
  for (const f of manifest.files) {
    const file = path.join(dir, f.path);
    const allowed =
      f.path === databaseFileName ||
      contentDirs.some((d) => f.path.startsWith(`${d}/`) && !f.path.slice(d.length + 1).includes('/'));
    if (!allowed || !isInside(dir, file)) {
      problems.push(`${f.path}: not a file a backup holds`);
      continue;
    }
    const stat = fs.statSync(file, { throwIfNoEntry: false });
    if (!stat?.isFile()) problems.push(`${f.path}: missing`);
    else if (stat.size !== f.bytes)
      problems.push(`${f.path}: ${stat.size} bytes, the manifest says ${f.bytes}`);
    else if ((await sha256OfFile(file)) !== f.sha256)
      problems.push(`${f.path}: content differs from the manifest`);
  }
  if (problems.length === 0) problems.push(...checkDatabase(path.join(dir, databaseFileName)));
  return { manifest, problems };
}

async function copyWhole(from: string, to: string) {
  const temp = `${to}.restoring`;
  await fs.promises.copyFile(from, temp);
  await fs.promises.chmod(temp, 0o600);
  const handle = await fs.promises.open(temp, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
  await fs.promises.rename(temp, to);
}

export type RestoreResult = {
  name: string;
  /** Where the replaced database (and its WAL files) now are; null when DATA_DIR had none. */
  setAside: string | null;
  /** Stored files written (missing or different in the storage). */
  filesRestored: number;
};

/** Finds a backup by name, or the newest finished one for `latest`. */
export function findBackup(backupDir: string, which: string) {
  const all = listBackups(backupDir);
  const found = which === 'latest' ? all.filter((b) => b.manifest).at(-1) : all.find((b) => b.name === which);
  if (!found)
    throw new RestoreError(`No backup ${which === 'latest' ? 'at all' : `named ${which}`} in ${backupDir}.`);
  return found;
}

/**
 * Restores the backup `which` (a name, or `latest`) from BACKUP_DIR into DATA_DIR. Refuses while a server
 * uses DATA_DIR (and holds DATA_DIR itself meanwhile, so none starts), and refuses a backup that fails a check.
 */
export async function restoreBackup(opts: {
  dataDir: string;
  /** Where the stored files go back (the server's storage, as STORAGE_URL names it). */
  storage: ObjectStorage;
  backupDir: string;
  which: string;
  now?: Date;
}): Promise<RestoreResult> {
  const now = opts.now ?? new Date();
  const backup = findBackup(opts.backupDir, opts.which);
  await fs.promises.mkdir(opts.dataDir, { recursive: true, mode: 0o700 });
  const lock = lockDataDir(opts.dataDir);
  try {
    const { manifest, problems } = await verifyBackup(backup.dir);
    if (problems.length > 0) {
      throw new RestoreError(
        `Backup ${backup.name} failed its checks; nothing was changed:\n  ${problems.join('\n  ')}`,
      );
    }

    // Stored files first: when the database arrives, every row it has names bytes already stored.
    let filesRestored = 0;
    for (const f of manifest.files) {
      if (f.path === databaseFileName) continue;
      const held = await opts.storage.get(f.path);
      if (held?.length === f.bytes && createHash('sha256').update(held).digest('hex') === f.sha256) continue;
      await opts.storage.put(f.path, await fs.promises.readFile(path.join(backup.dir, f.path)));
      filesRestored++;
    }

    // The replaced database goes aside whole, with its WAL (which may hold its latest commits).
    const live = path.join(opts.dataDir, databaseFileName);
    const present = [live, `${live}-wal`, `${live}-shm`].filter((f) => fs.existsSync(f));
    let setAside: string | null = null;
    if (present.length > 0) {
      setAside = path.join(
        opts.dataDir,
        'replaced',
        `before-restore-${now.toISOString().replace(/[:.]/g, '-')}`,
      );
      await fs.promises.mkdir(setAside, { recursive: true, mode: 0o700 });
      for (const f of present) await fs.promises.rename(f, path.join(setAside, path.basename(f)));
    }
    await copyWhole(path.join(backup.dir, databaseFileName), live);
    return { name: backup.name, setAside, filesRestored };
  } finally {
    lock.release();
  }
}
