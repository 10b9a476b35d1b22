/**
 * One server per DATA_DIR, and no restore while it runs. The lock is an exclusive SQLite lock on
 * DATA_DIR/server.lock held for the life of the process: the operating system drops it when the process
 * ends in any way (even SIGKILL or a power cut), so there is never a stale pid file to clean by hand.
 */
import path from 'node:path';

import Database from 'better-sqlite3';

export const serverLockName = 'server.lock';

export class DataDirBusyError extends Error {
  constructor(dataDir: string) {
    super(
      `Another Pivotwatch process is using ${dataDir} (a running server or a restore). ` +
        'Stop it first; only one may use a data directory at a time.',
    );
    this.name = 'DataDirBusyError';
  }
}

export type DataDirLock = { release: () => void };

const isBusy = (error: unknown) =>
  typeof error === 'object' &&
  error !== null &&
  'code' in error &&
  typeof error.code === 'string' &&
  error.code.startsWith('SQLITE_BUSY');

/** Takes the lock or throws DataDirBusyError at once (no waiting). */
export function lockDataDir(dataDir: string): DataDirLock {
  const lock = new Database(path.join(dataDir, serverLockName), { timeout: 0 });
  try {
    // In exclusive locking mode the lock a write transaction takes is kept after it commits.
    lock.pragma('locking_mode = EXCLUSIVE');
    // The file holds no data; a journal beside it would only be litter.
    lock.pragma('journal_mode = OFF');
    lock.exec('BEGIN EXCLUSIVE');
    lock.exec('COMMIT');
  } catch (error) {
    lock.close();
    if (isBusy(error)) throw new DataDirBusyError(dataDir);
    throw error;
  }
  return {
    release: () => {
      if (lock.open) lock.close();
    },
  };
}

/** Whether a server (or a restore) holds DATA_DIR now. */
export function dataDirInUse(dataDir: string): boolean {
  try {
    lockDataDir(dataDir).release();
    return false;
  } catch (error) {
    if (error instanceof DataDirBusyError) return true;
    throw error;
  }
}
