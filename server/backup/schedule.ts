/**
 * The backup job inside the server: one backup every BACKUP_INTERVAL, timed from the newest one on disk so
 * restarts neither skip nor pile up backups. A server that was down past its time backs up shortly after
 * start (not at once: start-up and the first phones' syncs come first).
 */
import type Database from 'better-sqlite3';

import type { Logger } from '@/server/logger';
import type { ObjectStorage } from '@/server/storage';
import { createBackup, type BackupResult } from '@/server/backup/create';
import { listBackups } from '@/server/backup/manifest';

export type BackupJobOptions = {
  sqlite: Database.Database;
  storage: ObjectStorage;
  backupDir: string;
  intervalMs: number;
  keep: number;
  logger?: Logger;
  /** The wait before an overdue (or first ever) backup; default five minutes. */
  overdueDelayMs?: number;
  now?: () => Date;
};

export type BackupJob = {
  /** When the next backup is due. */
  nextAt: () => Date;
  /** Takes a backup now (waits for one in progress first). */
  runNow: () => Promise<BackupResult>;
  /** Stops the timer and waits for a backup in progress, so the database can then be closed. */
  stop: () => Promise<void>;
};

/** setTimeout's limit (about 24.8 days); a longer wait is taken in several steps. */
const maxTimerMs = 2 ** 31 - 1;
const retryAfterFailureMs = 60 * 60_000;

export function startBackupJob(opts: BackupJobOptions): BackupJob {
  const now = opts.now ?? (() => new Date());
  const overdueDelayMs = opts.overdueDelayMs ?? 5 * 60_000;
  let running: Promise<BackupResult> | null = null;
  let timer: NodeJS.Timeout | null = null;
  let dueAt = new Date(0);
  let stopped = false;

  const schedule = (at: Date) => {
    if (stopped) return;
    dueAt = at;
    if (timer) clearTimeout(timer);
    const wait = Math.min(Math.max(0, at.getTime() - now().getTime()), maxTimerMs);
    timer = setTimeout(tick, wait);
    timer.unref();
  };

  const runNow = async (): Promise<BackupResult> => {
    while (running) await running.catch(() => undefined);
    running = createBackup({
      sqlite: opts.sqlite,
      storage: opts.storage,
      backupDir: opts.backupDir,
      kind: 'scheduled',
      keep: opts.keep,
      now: now(),
      logger: opts.logger,
    });
    try {
      return await running;
    } finally {
      running = null;
    }
  };

  function tick() {
    timer = null;
    if (now() < dueAt) return schedule(dueAt);
    runNow().then(
      () => schedule(new Date(now().getTime() + opts.intervalMs)),
      (error: unknown) => {
        opts.logger?.error(
          { err: error, backupDir: opts.backupDir },
          'backup failed; trying again in an hour',
        );
        schedule(new Date(now().getTime() + Math.min(opts.intervalMs, retryAfterFailureMs)));
      },
    );
  }

  const newest = listBackups(opts.backupDir)
    .filter((b) => b.manifest && b.manifest.kind !== 'pre-migration')
    .at(-1);
  const earliest = now().getTime() + overdueDelayMs;
  const due = newest?.manifest ? Date.parse(newest.manifest.createdAt) + opts.intervalMs : earliest;
  schedule(new Date(Math.max(due, earliest)));
  opts.logger?.info(
    { backupDir: opts.backupDir, everyHours: opts.intervalMs / 3_600_000, keep: opts.keep, next: dueAt },
    'backups scheduled',
  );

  return {
    nextAt: () => dueAt,
    runNow,
    stop: async () => {
      stopped = true;
      if (timer) clearTimeout(timer);
      while (running) await running.catch(() => undefined);
    },
  };
}
