/**
 * `npm run restore`: lists the backups in BACKUP_DIR; `npm run restore -- <name>` (or `-- latest`) checks
 * one whole and puts it back into DATA_DIR; `npm run restore -- --check <name>` only checks it. The server
 * must be stopped (the restore refuses otherwise); the replaced database is kept in DATA_DIR/replaced/.
 * The README's "Backups and restore" gives the whole procedure.
 */
import {
  listBackups,
  restoreBackup,
  verifyBackup,
  findBackup,
  DataDirBusyError,
  RestoreError,
} from '@/server/backup';
import { ConfigError, parseEnv } from '@/server/config';
import { restrictNewFiles } from '@/server/files';
import { StorageError, storageOf } from '@/server/storage';

function list(backupDir: string) {
  const all = listBackups(backupDir);
  if (all.length === 0) {
    console.log(`No backups in ${backupDir}.`);
    return;
  }
  console.log(`Backups in ${backupDir} (oldest first):`);
  for (const b of all) {
    if (!b.manifest) {
      console.log(`  ${b.name}  UNREADABLE: ${b.problem}`);
      continue;
    }
    const m = b.manifest;
    const bytes = m.files.reduce((sum, f) => sum + f.bytes, 0);
    console.log(
      `  ${b.name}  ${m.kind}, ${m.createdAt}, schema ${m.migration.last ?? 'empty'}, ` +
        `${m.files.length - 1} stored files, ${(bytes / 1e6).toFixed(1)} MB`,
    );
  }
  console.log('\nRestore one with: npm run restore -- <name>   (or: npm run restore -- latest)');
}

async function main() {
  restrictNewFiles();
  const config = parseEnv(process.env);
  const args = process.argv.slice(2);
  if (args.length === 0 || args[0] === '--list') return list(config.backupDir);
  if (args[0] === '--check') {
    const backup = findBackup(config.backupDir, args[1] ?? 'latest');
    const { problems } = await verifyBackup(backup.dir);
    if (problems.length > 0)
      throw new RestoreError(`Backup ${backup.name} failed its checks:\n  ${problems.join('\n  ')}`);
    console.log(
      `Backup ${backup.name} is whole: every file matches its manifest and the database passes integrity_check.`,
    );
    return;
  }
  const result = await restoreBackup({
    dataDir: config.dataDir,
    storage: storageOf(config),
    backupDir: config.backupDir,
    which: args[0],
  });
  console.log(
    `Restored ${result.name} into ${config.dataDir} (${result.filesRestored} stored files written to ` +
      `${storageOf(config).description}).`,
  );
  if (result.setAside) console.log(`The database it replaced is kept in ${result.setAside}.`);
  console.log(
    'Start the server again (npm start); it applies any newer migrations after copying the database aside.',
  );
}

main().catch((error: unknown) => {
  const known =
    error instanceof ConfigError ||
    error instanceof RestoreError ||
    error instanceof DataDirBusyError ||
    error instanceof StorageError;
  console.error(known ? error.message : error);
  process.exit(1);
});
