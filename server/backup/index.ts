export { createBackup, pruneBackups, type BackupResult } from '@/server/backup/create';
export {
  contentDirs,
  listBackups,
  manifestName,
  type BackupEntry,
  type BackupManifest,
} from '@/server/backup/manifest';
export { findBackup, restoreBackup, RestoreError, verifyBackup } from '@/server/backup/restore';
export { startBackupJob, type BackupJob } from '@/server/backup/schedule';
export { dataDirInUse, DataDirBusyError, lockDataDir, type DataDirLock } from '@/server/backup/server-lock';
