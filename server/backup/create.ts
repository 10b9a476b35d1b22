/**
 * Taking a backup while the server runs: the database through SQLite's online backup API (a consistent
 * copy, taken in steps so requests carry on), then the stored files, read through the storage
 * (server/storage: the disk or S3, whichever STORAGE_URL names) into the backup folder. Photos and NDT
 * reports never change once written (their name is their SHA-256), so a file the previous backup holds is
 * hard-linked from it and only new ones are copied: fourteen daily backups cost little more than one.
 */
import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';

import { databaseFileName, migrationState } from '@/server/db';
import type { Logger } from '@/server/logger';
import type { ObjectStorage } from '@/server/storage';
import {
  backupName,
  contentDirs,
  isPartialName,
  listBackups,
  manifestName,
  sha256OfFile,
  type BackupEntry,
  type BackupKind,
  type BackupManifest,
  type ManifestFile,
} from '@/server/backup/manifest';

export type BackupOptions = {
  /** The server's open connection (or any connection to DATA_DIR's database). */
  sqlite: Database.Database;
  /** Where the stored files are (the server's storage). */
  storage: ObjectStorage;
  backupDir: string;
  kind: Exclude<BackupKind, 'pre-migration'>;
  /** How many scheduled or manual backups to keep after this one. */
  keep: number;
  now?: Date;
  logger?: Logger;
};

export type BackupResult = {
  name: string;
  dir: string;
  manifest: BackupManifest;
  linked: number;
  copied: number;
};

async function fsyncPath(p: string) {
  const handle = await fs.promises.open(p, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

/** The newest finished backup holding stored files, whose copies this one may link to. */
function previousFiles(backupDir: string): { dir: string; byPath: Map<string, ManifestFile> } | null {
  const last = listBackups(backupDir)
    .filter((b) => b.manifest && b.manifest.kind !== 'pre-migration')
    .at(-1);
  if (!last?.manifest) return null;
  return { dir: last.dir, byPath: new Map(last.manifest.files.map((f) => [f.path, f])) };
}

/** Reads (or links) every stored file into `temp`; returns their manifest entries. */
async function backUpStoredFiles(storage: ObjectStorage, backupDir: string, temp: string) {
  const previous = previousFiles(backupDir);
  const files: ManifestFile[] = [];
  let linked = 0;
  let copied = 0;
  for (const dir of contentDirs) {
    const names = await storage.list(dir);
    if (names.length > 0) await fs.promises.mkdir(path.join(temp, dir), { mode: 0o700 });
    for (const name of names) {
      const rel = `${dir}/${name}`;
      const target = path.join(temp, dir, name);
      const before = previous?.byPath.get(rel);
      if (previous && before) {
        try {
          await fs.promises.link(path.join(previous.dir, dir, name), target);
          files.push(before);
          linked++;
          continue;
        } catch {
          // Gone from the previous backup, or links not possible there: copy instead.
        }
      }
      const bytes = await storage.get(rel);
      // Removed since the listing (the cleanup of unreferenced photos): it is not part of this backup.
      if (!bytes) continue;
      await fs.promises.writeFile(target, bytes, { mode: 0o600, flag: 'wx' });
      files.push({
        path: rel,
        bytes: bytes.length,
        sha256: createHash('sha256').update(bytes).digest('hex'),
      });
      copied++;
    }
  }
  return { files, linked, copied };
}

/** Removes temporary directories an interrupted backup left (older than an hour, so never a live one). */
function sweepPartial(backupDir: string, now: Date) {
  for (const name of fs.readdirSync(backupDir)) {
    if (!isPartialName(name) || !name.endsWith('.partial')) continue;
    const dir = path.join(backupDir, name);
    if (now.getTime() - fs.statSync(dir).mtimeMs > 3_600_000)
      fs.rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * Keeps the newest `keep` scheduled or manual backups and the newest `keep` pre-migration copies; removes
 * the rest. Returns the names removed. A directory with an unreadable manifest is left for a person to look at.
 */
export function pruneBackups(backupDir: string, keep: number): string[] {
  const all = listBackups(backupDir).filter(
    (b): b is BackupEntry & { manifest: BackupManifest } => !!b.manifest,
  );
  const regular = all.filter((b) => b.manifest.kind !== 'pre-migration');
  const preMigration = all.filter((b) => b.manifest.kind === 'pre-migration');
  const doomed = [
    ...regular.slice(0, Math.max(0, regular.length - keep)),
    ...preMigration.slice(0, Math.max(0, preMigration.length - keep)),
  ];
  for (const b of doomed) fs.rmSync(b.dir, { recursive: true, force: true });
  return doomed.map((b) => b.name);
}

/** Takes one backup now: built under a dot-name, renamed into place when whole, then old ones pruned. */
export async function createBackup(opts: BackupOptions): Promise<BackupResult> {
  const now = opts.now ?? new Date();
  await fs.promises.mkdir(opts.backupDir, { recursive: true, mode: 0o700 });
  sweepPartial(opts.backupDir, now);
  let name = backupName(opts.kind, now);
  if (fs.existsSync(path.join(opts.backupDir, name))) name = `${name}-${randomUUID().slice(0, 8)}`;
  const temp = path.join(opts.backupDir, `.${name}.${randomUUID().slice(0, 8)}.partial`);
  await fs.promises.mkdir(temp, { mode: 0o700 });
  try {
    const dbCopy = path.join(temp, databaseFileName);
    await opts.sqlite.backup(dbCopy);
    await fs.promises.chmod(dbCopy, 0o600);
    // The copy's own migration state: it is what a restore would bring back.
    const copy = new Database(dbCopy, { readonly: true });
    const migration = (() => {
      try {
        const s = migrationState(copy);
        return { last: s.last, count: s.count };
      } finally {
        copy.close();
      }
    })();
    const dbEntry: ManifestFile = {
      path: databaseFileName,
      bytes: (await fs.promises.stat(dbCopy)).size,
      sha256: await sha256OfFile(dbCopy),
    };
    // Listed after the database copy: a store writes the bytes before its row, so every file a row in the
    // copy names is in the storage by now.
    const stored = await backUpStoredFiles(opts.storage, opts.backupDir, temp);
    const manifest: BackupManifest = {
      format: 'pivotwatch-backup',
      version: 1,
      kind: opts.kind,
      createdAt: now.toISOString(),
      migration,
      files: [dbEntry, ...stored.files],
    };
    const manifestFile = path.join(temp, manifestName);
    await fs.promises.writeFile(manifestFile, JSON.stringify(manifest, null, 2), { mode: 0o600 });
    await fsyncPath(dbCopy);
    await fsyncPath(manifestFile);
    const dir = path.join(opts.backupDir, name);
    await fs.promises.rename(temp, dir);
    await fsyncPath(opts.backupDir);
    const removed = pruneBackups(opts.backupDir, opts.keep);
    opts.logger?.info(
      { backup: name, files: manifest.files.length, linked: stored.linked, copied: stored.copied, removed },
      'backup written',
    );
    return { name, dir, manifest, linked: stored.linked, copied: stored.copied };
  } catch (error) {
    await fs.promises.rm(temp, { recursive: true, force: true });
    throw error;
  }
}
