/**
 * What a backup is on disk: one directory per backup under BACKUP_DIR, holding the database copy, the
 * stored files (photos and NDT reports, from whichever storage STORAGE_URL names) and `manifest.json` listing every file with its size and SHA-256.
 * A directory appears under its final name only whole (built under a dot-name, then renamed), so a
 * directory with a name and a manifest is a finished backup; the restore still checks every byte.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import { z } from 'zod';

import { databaseFileName } from '@/server/db';
import { storedFolders } from '@/server/storage';

export const manifestName = 'manifest.json';

/**
 * The storage folders kept by content (the file name is the SHA-256 of its bytes), so a file never changes
 * once written and a backup links or copies each one once: the folders of the photo and NDT report stores
 * (server/storage) and of the documents store (server/documents). Cached notice PDFs are not backed up; they are drawn again when asked for.
 */
export const contentDirs = [storedFolders.photos, storedFolders.ndtReports, storedFolders.documents] as const;

export const backupKinds = ['scheduled', 'manual', 'pre-migration'] as const;
export type BackupKind = (typeof backupKinds)[number];

const sha256Pattern = /^[0-9a-f]{64}$/;

export const manifestSchema = z.object({
  format: z.literal('pivotwatch-backup'),
  version: z.literal(1),
  kind: z.enum(backupKinds),
  createdAt: z.string().datetime(),
  /** The last schema migration the copied database had applied (a drizzle/server tag) and how many. */
  migration: z.object({ last: z.string().nullable(), count: z.number().int().min(0) }),
  files: z.array(
    z.object({
      /** Relative to the backup directory, always with forward slashes. */
      path: z.string().min(1),
      bytes: z.number().int().min(0),
      sha256: z.string().regex(sha256Pattern),
    }),
  ),
});
export type BackupManifest = z.infer<typeof manifestSchema>;
export type ManifestFile = BackupManifest['files'][number];

export type BackupEntry = {
  name: string;
  dir: string;
  manifest: BackupManifest | null;
  /** Why the manifest could not be read, when it could not. */
  problem: string | null;
};

export const isPartialName = (name: string) => name.startsWith('.');

export async function sha256OfFile(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of fs.createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** A name that sorts by time: `backup-2026-12-03T18-05-12-123Z`. */
export function backupName(kind: BackupKind, at: Date): string {
  const stamp = at.toISOString().replace(/[:.]/g, '-');
  return `${kind === 'pre-migration' ? 'pre-migration' : 'backup'}-${stamp}`;
}

export function readManifest(dir: string): BackupManifest {
  const parsed = manifestSchema.safeParse(JSON.parse(fs.readFileSync(path.join(dir, manifestName), 'utf8')));
  if (!parsed.success) throw new Error(`${manifestName} is not a backup manifest this version reads`);
  return parsed.data;
}

/** Finished backups in BACKUP_DIR, oldest first; a directory whose manifest is unreadable is listed too. */
export function listBackups(backupDir: string): BackupEntry[] {
  let names: string[];
  try {
    names = fs.readdirSync(backupDir);
  } catch {
    return [];
  }
  const entries: BackupEntry[] = [];
  for (const name of names) {
    const dir = path.join(backupDir, name);
    if (isPartialName(name) || !fs.statSync(dir, { throwIfNoEntry: false })?.isDirectory()) continue;
    try {
      entries.push({ name, dir, manifest: readManifest(dir), problem: null });
    } catch (error) {
      entries.push({
        name,
        dir,
        manifest: null,
        problem: error instanceof Error ? error.message : String(error),
      });
    }
  }
  const time = (e: BackupEntry) => e.manifest?.createdAt ?? '';
  return entries.sort((a, b) => time(a).localeCompare(time(b)) || a.name.localeCompare(b.name));
}

/** The database file's entry; every backup has one. */
export const databaseEntryPath = databaseFileName;
