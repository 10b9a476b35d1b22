import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';

import * as schema from '@/db/server/schema';
import { serverMigrationsDir } from '@/server/paths';

export type Db = BetterSQLite3Database<typeof schema>;

export type OpenedDb = {
  db: Db;
  /** The raw connection, for pragmas and closing; queries go through `db`. */
  sqlite: Database.Database;
  close: () => void;
};

export const databaseFileName = 'pivotwatch.db';

/** Opens (creating if needed) DATA_DIR/pivotwatch.db and applies any pending migrations. */
export function openDb(dataDir: string): OpenedDb {
  fs.mkdirSync(dataDir, { recursive: true });
  const sqlite = new Database(path.join(dataDir, databaseFileName));
  // WAL lets readers carry on while a write commits; the timeout rides out a brief lock from another process.
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  const db = drizzle(sqlite, { schema });
  migrate(db, { migrationsFolder: serverMigrationsDir });
  return {
    db,
    sqlite,
    close: () => {
      if (sqlite.open) sqlite.close();
    },
  };
}
