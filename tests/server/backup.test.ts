/**
 * Backups: backup → wipe → restore gives the same database rows and stored files byte for byte; retention;
 * the copy taken before pending migrations; the one-server lock; file modes. The checks lean on outside
 * references: SQLite's own `PRAGMA integrity_check`, SHA-256 as published in FIPS 180-2 (appendix B.1,
 * "abc"), and POSIX permission bits (0700 = owner rwx, 0600 = owner rw).
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';

import {
  contentDirs,
  createBackup,
  listBackups,
  lockDataDir,
  restoreBackup,
  startBackupJob,
  verifyBackup,
} from '@/server/backup';
import { sha256OfFile } from '@/server/backup/manifest';
import { parseEnv } from '@/server/config';
import { databaseFileName, migrationState, openDb } from '@/server/db';
import { makePrivateDir, restrictNewFiles, writeWhole } from '@/server/files';
import { serverMigrationsDir } from '@/server/paths';
import { ndtReportsDirOf, storeNdtReport } from '@/server/pivot-life/ndt-report-store';
import { documentsDirOf } from '@/server/documents/store';
import { photosDirOf, storePhoto } from '@/server/sync/photo-store';
import { seedDemoData } from '@/server/seed/demo';
import { diskStorage } from '@/server/storage';

import { makeTempDir } from './helpers';
import { imageBytes } from './sync-fixtures';

const dirs: string[] = [];
const tempDir = () => {
  const dir = makeTempDir('pivotwatch-backup-');
  dirs.push(dir);
  return dir;
};
let oldUmask: number;
beforeAll(() => {
  oldUmask = process.umask();
  restrictNewFiles();
});
afterAll(() => {
  process.umask(oldUmask);
  for (const dir of dirs) fs.rmSync(dir, { recursive: true, force: true });
});

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');
const mode = (p: string) => fs.statSync(p).mode & 0o777;

/** Every table's rows in a fixed order, as JSON: equal dumps mean equal data. */
function dump(file: string): Record<string, string> {
  const sqlite = new Database(file, { readonly: true });
  try {
    const tables = sqlite
      .prepare(
        "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name",
      )
      .all() as { name: string }[];
    return Object.fromEntries(
      tables.map(({ name }) => [
        name,
        JSON.stringify(sqlite.prepare(`SELECT * FROM "${name}" ORDER BY rowid`).raw().all()),
      ]),
    );
  } finally {
    sqlite.close();
  }
}

/** Stored files by relative path → bytes. */
function storedFiles(dataDir: string): Map<string, Buffer> {
  const out = new Map<string, Buffer>();
  for (const dir of contentDirs) {
    const full = path.join(dataDir, dir);
    if (!fs.existsSync(full)) continue;
    for (const name of fs.readdirSync(full))
      out.set(`${dir}/${name}`, fs.readFileSync(path.join(full, name)));
  }
  return out;
}

/** A seeded DATA_DIR with a few photos and an NDT report stored the way the server stores them. */
let seededTemplate: string | null = null;
async function seededDataDir() {
  // Seeding hashes the demo passwords (slow on purpose); it is done once and the files copied per test.
  if (!seededTemplate) {
    seededTemplate = tempDir();
    const config = {
      ...parseEnv({ NODE_ENV: 'test', DATA_DIR: seededTemplate }),
      jwtSecret: new Uint8Array(32),
    };
    const seeding = openDb(seededTemplate);
    await seedDemoData(seeding.db, config);
    seeding.close();
  }
  const dataDir = tempDir();
  fs.cpSync(seededTemplate, dataDir, { recursive: true });
  const database = openDb(dataDir);
  const userId = (database.sqlite.prepare('SELECT id FROM users LIMIT 1').get() as { id: string }).id;
  for (let i = 0; i < 4; i++) {
    const bytes = imageBytes(i, 'jpeg', 3_000 + i);
    await storePhoto(database.db, diskStorage(dataDir), {
      sha256: sha256(bytes),
      mime: 'image/jpeg',
      bytes,
      userId,
    });
  }
  const pdf = Buffer.from('%PDF-1.4\n% an invented NDT report\n%%EOF\n');
  await storeNdtReport(
    database.db,
    diskStorage(dataDir),
    { sha256: sha256(pdf), bytes: pdf, userId },
    new Date(),
  );
  return { dataDir, database, userId };
}

test('the stored-file folders are the ones the stores write', () => {
  expect(contentDirs.map((d) => path.join('/d', d))).toEqual([
    photosDirOf('/d'),
    ndtReportsDirOf('/d'),
    documentsDirOf('/d'),
  ]);
});

test('file hashes match the published SHA-256 of "abc" (FIPS 180-2, B.1)', async () => {
  const file = path.join(tempDir(), 'abc');
  fs.writeFileSync(file, 'abc');
  expect(await sha256OfFile(file)).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
});

test('backup → wipe → restore gives the same rows and the same stored files, byte for byte', async () => {
  const { dataDir, database } = await seededDataDir();
  const backupDir = path.join(tempDir(), 'backups');
  const made = await createBackup({
    sqlite: database.sqlite,
    storage: diskStorage(dataDir),
    backupDir,
    kind: 'manual',
    keep: 14,
  });
  expect(made.manifest.files).toHaveLength(1 + 4 + 1);
  expect(made.manifest.migration).toEqual({
    last: migrationState(database.sqlite).last,
    count: migrationState(database.sqlite).count,
  });
  // Written after the backup: the restore brings back the state of the backup, not this.
  database.sqlite.prepare("UPDATE users SET name = 'Changed after the backup'").run();
  database.sqlite.pragma('wal_checkpoint(TRUNCATE)');
  database.close();
  const before = dump(path.join(made.dir, databaseFileName));
  const filesBefore = storedFiles(dataDir);
  expect(filesBefore.size).toBe(5);

  fs.rmSync(dataDir, { recursive: true, force: true });
  const result = await restoreBackup({ dataDir, storage: diskStorage(dataDir), backupDir, which: 'latest' });
  expect(result).toMatchObject({ name: made.name, setAside: null, filesRestored: 5 });

  const after = dump(path.join(dataDir, databaseFileName));
  expect(Object.keys(after).length).toBeGreaterThan(10);
  expect(after).toEqual(before);
  expect(after.users).not.toContain('Changed after the backup');
  const filesAfter = storedFiles(dataDir);
  expect([...filesAfter.keys()].sort()).toEqual([...filesBefore.keys()].sort());
  for (const [rel, bytes] of filesBefore) expect(filesAfter.get(rel)!.equals(bytes)).toBe(true);
  expect(mode(path.join(dataDir, databaseFileName))).toBe(0o600);

  // The server opens the restored database as it is: nothing pending, so no copy and no change.
  const reopened = openDb(dataDir);
  expect(
    (reopened.sqlite.pragma('integrity_check') as { integrity_check: string }[])[0].integrity_check,
  ).toBe('ok');
  reopened.close();
  expect(listBackups(backupDir).map((b) => b.name)).toEqual([made.name]);
});

test('a restore over a live database keeps the replaced one aside with its WAL', async () => {
  const { dataDir, database } = await seededDataDir();
  const backupDir = path.join(tempDir(), 'backups');
  await createBackup({
    sqlite: database.sqlite,
    storage: diskStorage(dataDir),
    backupDir,
    kind: 'manual',
    keep: 14,
  });
  database.sqlite.prepare("UPDATE users SET name = 'Only in the replaced database'").run();
  database.close();
  const result = await restoreBackup({ dataDir, storage: diskStorage(dataDir), backupDir, which: 'latest' });
  expect(result.setAside).not.toBeNull();
  expect(JSON.stringify(dump(path.join(result.setAside!, databaseFileName)).users)).toContain(
    'Only in the replaced database',
  );
  expect(dump(path.join(dataDir, databaseFileName)).users).not.toContain('Only in the replaced database');
});

test('a restore is refused while a server holds DATA_DIR, and for a damaged backup; nothing changes', async () => {
  const { dataDir, database } = await seededDataDir();
  const backupDir = path.join(tempDir(), 'backups');
  const made = await createBackup({
    sqlite: database.sqlite,
    storage: diskStorage(dataDir),
    backupDir,
    kind: 'manual',
    keep: 14,
  });
  database.close();
  const dbBefore = fs.readFileSync(path.join(dataDir, databaseFileName));

  const lock = lockDataDir(dataDir);
  await expect(
    restoreBackup({ dataDir, storage: diskStorage(dataDir), backupDir, which: made.name }),
  ).rejects.toThrow(/Another Pivotwatch process/);
  lock.release();

  // One flipped byte in a stored photo: the manifest's SHA-256 no longer matches.
  const photo = made.manifest.files.find((f) => f.path.startsWith('photos/'))!;
  const copy = path.join(made.dir, photo.path);
  const bytes = fs.readFileSync(copy);
  bytes[100] ^= 0xff;
  fs.unlinkSync(copy); // a hard link: write a new file rather than through the link
  fs.writeFileSync(copy, bytes);
  expect((await verifyBackup(made.dir)).problems).toEqual([
    `${photo.path}: content differs from the manifest`,
  ]);
  await expect(
    restoreBackup({ dataDir, storage: diskStorage(dataDir), backupDir, which: made.name }),
  ).rejects.toThrow(/failed its checks/);
  expect(fs.readFileSync(path.join(dataDir, databaseFileName)).equals(dbBefore)).toBe(true);
  expect(fs.existsSync(path.join(dataDir, 'replaced'))).toBe(false);
});

test('a database copy that fails integrity_check is refused', async () => {
  const { dataDir, database } = await seededDataDir();
  const backupDir = path.join(tempDir(), 'backups');
  const made = await createBackup({
    sqlite: database.sqlite,
    storage: diskStorage(dataDir),
    backupDir,
    kind: 'manual',
    keep: 14,
  });
  database.close();
  // Overwrite a page in the middle of the copy and make the manifest agree, so only SQLite can tell.
  const file = path.join(made.dir, databaseFileName);
  const bytes = fs.readFileSync(file);
  bytes.fill(0x5a, 8 * 4096 + 16, 8 * 4096 + 600);
  fs.writeFileSync(file, bytes);
  const manifestFile = path.join(made.dir, 'manifest.json');
  const manifest = JSON.parse(fs.readFileSync(manifestFile, 'utf8'));
  manifest.files[0].sha256 = sha256(bytes);
  fs.writeFileSync(manifestFile, JSON.stringify(manifest));
  const { problems } = await verifyBackup(made.dir);
  expect(problems.length).toBeGreaterThan(0);
  expect(problems.every((p) => p.startsWith(databaseFileName))).toBe(true);
});

test('retention keeps the newest BACKUP_KEEP; stored files are linked from the previous backup, not copied', async () => {
  const { dataDir, database } = await seededDataDir();
  const backupDir = path.join(tempDir(), 'backups');
  const at = (h: number) => new Date(Date.UTC(2026, 11, 1, h));
  const made = [];
  for (let h = 0; h < 5; h++) {
    made.push(
      await createBackup({
        sqlite: database.sqlite,
        storage: diskStorage(dataDir),
        backupDir,
        kind: 'scheduled',
        keep: 3,
        now: at(h),
      }),
    );
  }
  database.close();
  expect(made[0]).toMatchObject({ copied: 5, linked: 0 });
  expect(made[1]).toMatchObject({ copied: 0, linked: 5 });
  expect(listBackups(backupDir).map((b) => b.name)).toEqual(made.slice(2).map((b) => b.name));
  const photo = made[4].manifest.files.find((f) => f.path.startsWith('photos/'))!.path;
  expect(fs.statSync(path.join(made[4].dir, photo)).ino).toBe(fs.statSync(path.join(made[2].dir, photo)).ino);
  expect(fs.readdirSync(backupDir).filter((n) => n.startsWith('.'))).toEqual([]);
});

test('before pending migrations the database is copied aside; a fresh or current database is not', async () => {
  // A database as the previous release left it: every migration but the newest applied.
  const olderMigrations = path.join(tempDir(), 'migrations');
  fs.cpSync(serverMigrationsDir, olderMigrations, { recursive: true });
  const journalFile = path.join(olderMigrations, 'meta', '_journal.json');
  const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8'));
  const newest = journal.entries.pop();
  fs.writeFileSync(journalFile, JSON.stringify(journal));
  const dataDir = tempDir();
  const old = new Database(path.join(dataDir, databaseFileName));
  migrate(drizzle(old), { migrationsFolder: olderMigrations });
  old
    .prepare(
      "INSERT INTO companies (id, kind, name, created_at) VALUES ('c-old', 'operator', 'Old Pier Co', '2026-01-01')",
    )
    .run();
  old.close();

  const backupDir = path.join(tempDir(), 'backups');
  const database = openDb(dataDir, { backupDir });
  expect(migrationState(database.sqlite).pending).toEqual([]);
  database.close();
  const copies = listBackups(backupDir);
  expect(copies).toHaveLength(1);
  const copy = copies[0];
  expect(copy.manifest).toMatchObject({
    kind: 'pre-migration',
    migration: { last: journal.entries.at(-1).tag, count: journal.entries.length },
  });
  expect(newest.tag).not.toBe(copy.manifest!.migration.last);
  expect((await verifyBackup(copy.dir)).problems).toEqual([]);
  expect(dump(path.join(copy.dir, databaseFileName)).companies).toContain('Old Pier Co');

  // Opening again (nothing pending) and opening a brand-new database make no copy.
  openDb(dataDir, { backupDir }).close();
  openDb(tempDir(), { backupDir }).close();
  expect(listBackups(backupDir)).toHaveLength(1);
});

test('DATA_DIR is created 0700, its database and stored files 0600, backups likewise', async () => {
  const dataDir = path.join(tempDir(), 'fresh');
  const database = openDb(dataDir);
  database.sqlite.prepare('CREATE TABLE probe (x)').run(); // a write, so the WAL exists
  await writeWhole(path.join(dataDir, 'photos', 'f'.repeat(64)), new Uint8Array([1, 2, 3]));
  expect(mode(dataDir)).toBe(0o700);
  for (const f of [databaseFileName, `${databaseFileName}-wal`, `${databaseFileName}-shm`]) {
    expect([f, mode(path.join(dataDir, f))]).toEqual([f, 0o600]);
  }
  expect(mode(path.join(dataDir, 'photos', 'f'.repeat(64)))).toBe(0o600);
  const backupDir = path.join(tempDir(), 'backups');
  const made = await createBackup({
    sqlite: database.sqlite,
    storage: diskStorage(dataDir),
    backupDir,
    kind: 'manual',
    keep: 2,
  });
  database.close();
  expect(mode(backupDir)).toBe(0o700);
  expect(mode(made.dir)).toBe(0o700);
  for (const f of made.manifest.files) expect(mode(path.join(made.dir, f.path))).toBe(0o600);
  expect(mode(path.join(made.dir, 'manifest.json'))).toBe(0o600);
});

test('the job backs up when overdue, then times the next from the newest backup', async () => {
  const { dataDir, database } = await seededDataDir();
  const backupDir = path.join(tempDir(), 'backups');
  const hour = 3_600_000;
  const job = startBackupJob({
    sqlite: database.sqlite,
    storage: diskStorage(dataDir),
    backupDir,
    intervalMs: hour,
    keep: 3,
    overdueDelayMs: 20,
  });
  for (let i = 0; i < 100 && listBackups(backupDir).length === 0; i++)
    await new Promise((r) => setTimeout(r, 50));
  await job.stop();
  const [first] = listBackups(backupDir);
  expect(first.manifest?.kind).toBe('scheduled');

  // A restart soon after: the next one is due an interval after the newest, not at once.
  const again = startBackupJob({
    sqlite: database.sqlite,
    storage: diskStorage(dataDir),
    backupDir,
    intervalMs: hour,
    keep: 3,
    overdueDelayMs: 20,
  });
  expect(again.nextAt().getTime()).toBe(Date.parse(first.manifest!.createdAt) + hour);
  await again.stop();
  database.close();
  expect(listBackups(backupDir)).toHaveLength(1);
});

test('BACKUP_* settings: defaults, off, and clear errors', () => {
  const config = parseEnv({ DATA_DIR: '/srv/pw/data' }, '/srv/pw');
  expect(config).toMatchObject({
    backupDir: '/srv/pw/data/backups',
    backupIntervalSeconds: 86_400,
    backupKeep: 14,
  });
  expect(parseEnv({ BACKUP_INTERVAL: 'off', BACKUP_DIR: '/mnt/b', BACKUP_KEEP: '3' })).toMatchObject({
    backupDir: '/mnt/b',
    backupIntervalSeconds: 0,
    backupKeep: 3,
  });
  expect(() => parseEnv({ BACKUP_INTERVAL: 'daily' })).toThrow(/BACKUP_INTERVAL/);
  expect(() => parseEnv({ BACKUP_KEEP: '0' })).toThrow(/BACKUP_KEEP/);
});

test('a DATA_DIR an earlier release left open to others is made 0700 at start', () => {
  const dir = path.join(tempDir(), 'old-data');
  fs.mkdirSync(dir);
  fs.chmodSync(dir, 0o755);
  expect(makePrivateDir(dir)).toBe('tightened');
  expect(mode(dir)).toBe(0o700);
  expect(makePrivateDir(dir)).toBe('kept');
  expect(makePrivateDir(path.join(dir, 'new'))).toBe('created');
  expect(mode(path.join(dir, 'new'))).toBe(0o700);
});
