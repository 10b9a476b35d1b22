/**
 * `npm run backup`: takes a backup of DATA_DIR now (the database, and the photos and NDT reports from the
 * storage STORAGE_URL names) into BACKUP_DIR,
 * the same way the server's scheduled job does. Safe while the server runs: the database is copied with
 * SQLite's online backup API. Older backups beyond BACKUP_KEEP are removed afterwards.
 */
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';

import { createBackup } from '@/server/backup';
import { ConfigError, parseEnv } from '@/server/config';
import { databaseFileName } from '@/server/db';
import { restrictNewFiles } from '@/server/files';
import { storageOf } from '@/server/storage';

async function main() {
  restrictNewFiles();
  const config = parseEnv(process.env);
  const file = path.join(config.dataDir, databaseFileName);
  if (!fs.existsSync(file)) throw new Error(`There is no database at ${file} (is DATA_DIR right?).`);
  // Opened as is: a backup copies what is there and never migrates.
  const sqlite = new Database(file, { fileMustExist: true, timeout: 5000 });
  try {
    const result = await createBackup({
      sqlite,
      storage: storageOf(config),
      backupDir: config.backupDir,
      kind: 'manual',
      keep: config.backupKeep,
    });
    const stored = result.manifest.files.length - 1;
    console.log(`Backup ${result.name} written to ${result.dir}`);
    console.log(
      `  database + ${stored} stored files (${result.copied} copied, ${result.linked} linked from the last backup)`,
    );
  } finally {
    sqlite.close();
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof ConfigError || error instanceof Error ? error.message : error);
  process.exit(1);
});
