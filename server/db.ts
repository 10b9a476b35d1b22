import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';

import * as schema from '@/db/server/schema';
import { serverMigrationsDir } from '@/server/paths';
import { registerSqlFunctions } from '@/server/sql-functions';

export type Db = BetterSQLite3Database<typeof schema>;

export type OpenedDb = {
  db: Db;
  /** The raw connection, for pragmas and closing; queries go through `db`. */
  sqlite: Database.Database;
  close: () => void;
};

export const databaseFileName = 'pivotwatch.db';

export type OpenDbOptions = {
  /** Where the copy taken before pending migrations goes (BACKUP_DIR); default DATA_DIR/backups. */
  backupDir?: string;
};

type Journal = { entries: { when: number; tag: string }[] };

/**
 * What the database has applied and what this code would still apply, by drizzle's own rule: a migration
 * is pending when its journal time is later than the last one recorded in `__drizzle_migrations`.
 */
export function migrationState(sqlite: Database.Database): {
  last: string | null;
  count: number;
  pending: string[];
} {
  const journalFile = path.join(serverMigrationsDir, 'meta', '_journal.json');
  const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8')) as Journal;
  const hasTable = sqlite
    .prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = '__drizzle_migrations'")
    .get();
  const rows = hasTable
    ? (sqlite.prepare('SELECT created_at AS at FROM __drizzle_migrations ORDER BY created_at').all() as {
        at: number;
      }[])
    : [];
  const lastAt = rows.length > 0 ? Number(rows[rows.length - 1].at) : null;
  const lastTag =
    lastAt === null ? null : (journal.entries.find((e) => e.when === lastAt)?.tag ?? `newer (${lastAt})`);
  return {
    last: lastTag,
    count: rows.length,
    pending: journal.entries.filter((e) => lastAt === null || e.when > lastAt).map((e) => e.tag),
  };
}

/** The database and its WAL files hold every record: readable by the server's own user only. */
function restrictDatabaseFiles(file: string) {
  for (const f of [file, `${file}-wal`, `${file}-shm`]) {
    if (fs.existsSync(f)) fs.chmodSync(f, 0o600);
  }
}

/**
 * A migration that goes wrong half way (or code that turns out bad) must not cost the data: before
 * applying any, the database is copied whole (`VACUUM INTO`, a consistent snapshot) into a backup directory
 * in the format of server/backup/manifest.ts, which `npm run restore` lists and restores like any backup.
 */
function copyBeforeMigrating(
  sqlite: Database.Database,
  backupDir: string,
  state: { last: string | null; count: number },
) {
  const at = new Date();
  const name = `pre-migration-${at.toISOString().replace(/[:.]/g, '-')}`;
  const temp = path.join(backupDir, `.${name}.partial`);
  fs.mkdirSync(temp, { recursive: true, mode: 0o700 });
  const copy = path.join(temp, databaseFileName);
  sqlite.prepare('VACUUM INTO ?').run(copy);
  fs.chmodSync(copy, 0o600);
  const bytes = fs.readFileSync(copy);
  const manifest = {
    format: 'pivotwatch-backup',
    version: 1,
    kind: 'pre-migration',
    createdAt: at.toISOString(),
    migration: { last: state.last, count: state.count },
    files: [
      {
        path: databaseFileName,
        bytes: bytes.length,
        sha256: createHash('sha256').update(bytes).digest('hex'),
      },
    ],
  };
  fs.writeFileSync(path.join(temp, 'manifest.json'), JSON.stringify(manifest, null, 2), { mode: 0o600 });
  fs.renameSync(temp, path.join(backupDir, name));
}

/**
 * Runs the migrations with foreign keys off, as SQLite's own procedure for changing a table's schema asks
 * (https://sqlite.org/lang_altertable.html, "Making Other Kinds Of Table Schema Changes"): drizzle-kit
 * rebuilds a table to change a CHECK, and dropping the old copy of a table other rows refer to (e.g.
 * `inspections`, which findings and photos name) would otherwise fail, or delete through the keys. The
 * PRAGMA is a no-op inside a transaction, so it is set around the migrator's; every key is then checked,
 * and a migration that left one dangling stops the server with the rows named.
 */
function migrateWithoutForeignKeys(sqlite: Database.Database, run: () => void): void {
  sqlite.pragma('foreign_keys = OFF');
  try {
    run();
    const broken = sqlite.pragma('foreign_key_check') as unknown[];
    if (broken.length > 0)
      throw new Error(
        `A migration left rows whose foreign keys name nothing: ${JSON.stringify(broken.slice(0, 5))}`,
      );
  } finally {
    sqlite.pragma('foreign_keys = ON');
  }
}

/**
 * Opens (creating if needed) DATA_DIR/pivotwatch.db and applies any pending migrations, copying an
 * existing database aside first. DATA_DIR is created 0700 and the database files are kept 0600.
 */
export function openDb(dataDir: string, opts: OpenDbOptions = {}): OpenedDb {
  fs.mkdirSync(dataDir, { recursive: true, mode: 0o700 });
  const file = path.join(dataDir, databaseFileName);
  const sqlite = new Database(file);
  // Before the first write: SQLite gives the -wal and -shm files the database file's permissions.
  restrictDatabaseFiles(file);
  // WAL lets readers carry on while a write commits; the timeout rides out a brief lock from another process.
  sqlite.pragma('journal_mode = WAL');
  // Every commit reaches the disk before it returns: a phone deletes its copy of a record once the server
  // has accepted it, so an accepted push must survive a power cut, not only a crash of this process.
  // (better-sqlite3 builds SQLite with NORMAL as WAL's default, where only checkpoints are synced.)
  sqlite.pragma('synchronous = FULL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  registerSqlFunctions(sqlite);
  const db = drizzle(sqlite, { schema });
  const state = migrationState(sqlite);
  if (state.count > 0 && state.pending.length > 0) {
    copyBeforeMigrating(sqlite, opts.backupDir ?? path.join(dataDir, 'backups'), state);
  }
  migrateWithoutForeignKeys(sqlite, () => migrate(db, { migrationsFolder: serverMigrationsDir }));
  return {
    db,
    sqlite,
    close: () => {
      if (sqlite.open) sqlite.close();
    },
  };
}
